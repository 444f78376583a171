import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { Recommendation } from '../../../shared/schemas/enums.js';
import { FaultEvent } from '../events/fault-event.entity.js';

// One run of the engine on an event: the case it was given and the result, under a criteria-set version.
@Entity({ name: 'screening' })
@Index(['eventId', 'comparison', 'computedAt'])
export class Screening {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  eventId!: number;

  @ManyToOne(() => FaultEvent, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'eventId' })
  event!: Relation<FaultEvent>;

  @Column({ type: 'json' })
  case!: Record<string, unknown>;

  @Column({ type: 'json' })
  result!: Record<string, unknown>;

  @Column({ type: 'varchar', length: 12 })
  recommendation!: Recommendation;

  @Column({ type: 'int', unsigned: true })
  criteriaVersion!: number;

  @Column({ type: 'boolean', default: false })
  comparison!: boolean;

  @Column({ type: 'int', unsigned: true, nullable: true })
  computedById!: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  computedAt!: Date;
}
