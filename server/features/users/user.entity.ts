import { Column, CreateDateColumn, Entity, JoinTable, ManyToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { Role } from '../../../shared/schemas/enums.js';
import { Site } from '../sites/site.entity.js';

// A person who signs in. Sign-in counters live here (not in memory) so several app servers agree.
@Entity({ name: 'user' })
export class User {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 254, unique: true })
  email!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'varchar', length: 100 })
  passwordHash!: string;

  @Column({ type: 'json' })
  roles!: Role[];

  @Column({ type: 'boolean', default: false })
  allSites!: boolean;

  @ManyToMany(() => Site)
  @JoinTable({ name: 'user_site', joinColumn: { name: 'userId' }, inverseJoinColumn: { name: 'siteId' } })
  sites!: Relation<Site[]>;

  @Column({ type: 'boolean', default: true })
  active!: boolean;

  @Column({ type: 'boolean', default: false })
  demo!: boolean;

  /** Signed in with a one-time password: only choosing a new password is allowed until then. */
  @Column({ type: 'boolean', default: false })
  mustChangePassword!: boolean;

  @Column({ type: 'int', unsigned: true, default: 0 })
  failedSignIns!: number;

  /** Carried in every session token (`ver`); raised by a password change or reset, a (re)activation and a sign-out. */
  @Column({ type: 'int', unsigned: true, default: 0 })
  tokenVersion!: number;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lockedUntil!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lastSignInAt!: Date | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt!: Date;
}
