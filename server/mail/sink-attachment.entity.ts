import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

// The bytes of one attachment of a message the local mail sink received (the outbox serves them back).
@Entity({ name: 'sink_attachment' })
@Index(['messageId', 'position'], { unique: true })
export class SinkAttachment {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  messageId!: number;

  /** The attachment's index in the message (as listed by the outbox). */
  @Column({ type: 'int', unsigned: true })
  position!: number;

  @Column({ type: 'mediumblob' })
  content!: Buffer;
}
