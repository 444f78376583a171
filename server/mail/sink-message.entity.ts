import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

// A message received by the local mail sink; kept in the database so the outbox survives restarts.
@Entity({ name: 'sink_message' })
export class SinkMessage {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  receivedAt!: Date;

  @Column({ type: 'varchar', length: 1000 })
  to!: string;

  @Column({ type: 'varchar', length: 500 })
  subject!: string;

  @Column({ type: 'mediumtext' })
  text!: string;

  @Column({ type: 'json' })
  attachments!: { filename: string; contentType: string; size: number }[];
}
