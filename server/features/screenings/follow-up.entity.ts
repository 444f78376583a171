import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { FaultEvent } from '../events/fault-event.entity.js';

// A task after re-energising (gas samples, a sweep at the next outage); closed with its result.
@Entity({ name: 'follow_up' })
@Index(['closedAt', 'dueAt'])
@Index(['eventId'])
export class FollowUp {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  eventId!: number;

  @ManyToOne(() => FaultEvent, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'eventId' })
  event!: Relation<FaultEvent>;

  @Column({ type: 'varchar', length: 300 })
  task!: string;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  dueAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  closedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  closedById!: number | null;

  @Column({ type: 'text', nullable: true })
  result!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
