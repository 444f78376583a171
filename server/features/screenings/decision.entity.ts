import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { DecisionOutcome } from '../../../shared/schemas/enums.js';
import { Screening } from './screening.entity.js';

// The manager's sign-off on a screening: release, release with restrictions, or hold, with a reason.
@Entity({ name: 'decision' })
export class Decision {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index({ unique: true })
  @Column({ type: 'int', unsigned: true })
  screeningId!: number;

  @ManyToOne(() => Screening, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'screeningId' })
  screening!: Relation<Screening>;

  @Column({ type: 'int', unsigned: true })
  managerId!: number;

  @Column({ type: 'varchar', length: 30 })
  outcome!: DecisionOutcome;

  @Column({ type: 'text', nullable: true })
  restrictions!: string | null;

  @Column({ type: 'text' })
  reason!: string;

  /** The outcome goes against the recommendation (highlighted in the audit trail). */
  @Column({ type: 'boolean', default: false })
  againstRecommendation!: boolean;

  @Column({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  signedAt!: Date;

  /** When the restrictions were lifted (null: active while the outcome is release-with-restrictions), by whom, why. */
  @Column({ type: 'datetime', precision: 3, nullable: true })
  restrictionsLiftedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  restrictionsLiftedById!: number | null;

  @Column({ type: 'text', nullable: true })
  restrictionsLiftReason!: string | null;
}
