import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

// One audited write: who, when, what, before and after. Written in the same transaction as the change.
@Entity({ name: 'audit_entry' })
@Index(['entity', 'entityId'])
@Index(['at'])
export class AuditEntry {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  at!: Date;

  @Column({ type: 'int', unsigned: true, nullable: true })
  userId!: number | null;

  @Column({ type: 'varchar', length: 40 })
  action!: string;

  @Column({ type: 'varchar', length: 60 })
  entity!: string;

  @Column({ type: 'varchar', length: 60 })
  entityId!: string;

  @Column({ type: 'json', nullable: true })
  before!: Record<string, unknown> | unknown[] | null;

  @Column({ type: 'json', nullable: true })
  after!: Record<string, unknown> | unknown[] | null;

  @Column({ type: 'boolean', default: false })
  highlighted!: boolean;

  @Column({ type: 'varchar', length: 500, nullable: true })
  note!: string | null;
}
