import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

// One audited write: who, when, what, before and after. Written in the same transaction as the change, by audit()
// only (the app's database account may only INSERT and SELECT here). Each entry carries the hash of the one before
// it (prevHash) and its own hash over its content and prevHash (shared/audit-chain.ts): `npm run audit:verify`.
@Entity({ name: 'audit_entry' })
@Index(['entity', 'entityId'])
@Index(['at'])
// No two entries may follow the same entry: the database refuses a fork of the chain.
@Index('UQ_audit_entry_prevHash', ['prevHash'], { unique: true })
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

  /** Hash of the entry before this one (64 zeros for the first entry). */
  @Column({ type: 'char', length: 64 })
  prevHash!: string;

  /** SHA-256 (hex) of this entry's canonical text, prevHash included. */
  @Column({ type: 'char', length: 64 })
  hash!: string;
}
