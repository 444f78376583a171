import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { NotificationKind, NotificationStatus } from '../../../shared/schemas/enums.js';

// One e-mail to send: queued in the screening's or decision's transaction, sent after it commits, retried on failure.
@Entity({ name: 'notification' })
@Index(['status', 'nextAttemptAt'])
@Index(['eventId'])
export class Notification {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true, nullable: true })
  eventId!: number | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  screeningId!: number | null;

  @Column({ type: 'varchar', length: 12, default: 'screening' })
  kind!: NotificationKind;

  @Column({ type: 'varchar', length: 254 })
  to!: string;

  @Column({ type: 'varchar', length: 500 })
  subject!: string;

  @Column({ type: 'varchar', length: 10, default: 'queued' })
  status!: NotificationStatus;

  @Column({ type: 'int', unsigned: true, default: 0 })
  attempts!: number;

  @Column({ type: 'text', nullable: true })
  lastError!: string | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  sentAt!: Date | null;

  /** When a worker may try (again); also a short lease while one is sending. Null once sent or given up. */
  @Column({ type: 'datetime', precision: 3, nullable: true })
  nextAttemptAt!: Date | null;

  @Column({ type: 'varchar', length: 255, nullable: true })
  messageId!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
