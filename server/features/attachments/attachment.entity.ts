import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

// A stored file (a relay record on an event, a photo or document on a finding) with its checksum; the bytes live in
// attachment_content.
@Entity({ name: 'attachment' })
@Index(['ownerType', 'ownerId'])
export class Attachment {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 20 })
  ownerType!: 'event' | 'reading-set' | 'finding';

  @Column({ type: 'int', unsigned: true })
  ownerId!: number;

  @Column({ type: 'varchar', length: 255 })
  name!: string;

  @Column({ type: 'varchar', length: 100 })
  contentType!: string;

  /** What the content check found, e.g. 'comtrade-cfg', 'csv', 'pdf', 'jpeg'. */
  @Column({ type: 'varchar', length: 30 })
  kind!: string;

  @Column({ type: 'int', unsigned: true })
  size!: number;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdById!: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
