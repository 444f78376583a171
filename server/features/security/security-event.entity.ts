import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { SecurityEventKind } from '../../../shared/schemas/responses/security.js';

// One event of the security log: a failed, throttled or refused sign-in, a lock or an unlock, an authorization
// refusal. Written outside the request's transaction (a refusal rolls the request back), read by administrators.
@Entity({ name: 'security_event' })
@Index('IDX_security_event_at', ['at'])
@Index('IDX_security_event_user_kind_at', ['userId', 'kind', 'at'])
export class SecurityEvent {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  /** When, from the app's clock. */
  @Column({ type: 'datetime', precision: 3 })
  at!: Date;

  @Column({ type: 'varchar', length: 30 })
  kind!: SecurityEventKind;

  /** Who: the signed-in person, or the account a sign-in named; null for an unknown e-mail or nobody. */
  @Column({ type: 'int', unsigned: true, nullable: true })
  userId!: number | null;

  /** The e-mail as typed on a sign-in (cut to 254 characters); null otherwise. */
  @Column({ type: 'varchar', length: 254, nullable: true })
  email!: string | null;

  /** The client's address as Express sees it (TRUST_PROXY decides whether X-Forwarded-For counts). */
  @Column({ type: 'varchar', length: 64, nullable: true })
  address!: string | null;

  /** Method and route ("POST /api/auth/login"). */
  @Column({ type: 'varchar', length: 200 })
  route!: string;

  /** A short detail in words (the roles a route needed, the length of a lock). */
  @Column({ type: 'varchar', length: 300, nullable: true })
  detail!: string | null;
}
