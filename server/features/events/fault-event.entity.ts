import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { FaultType, Protection } from '../../../shared/schemas/case.js';
import type { EventStatus } from '../../../shared/schemas/enums.js';
import { Unit } from '../units/unit.entity.js';

export type { EventStatus };

// A through-fault logged by protection: shots measured on one side, which protections operated, whether it tripped.
@Entity({ name: 'fault_event' })
@Index(['unitId', 'occurredAt'])
@Index(['status', 'occurredAt'])
@Index(['occurredAt'])
export class FaultEvent {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  unitId!: number;

  @ManyToOne(() => Unit, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'unitId' })
  unit!: Relation<Unit>;

  @Column({ type: 'datetime', precision: 3 })
  occurredAt!: Date;

  @Column({ type: 'varchar', length: 30 })
  type!: FaultType;

  @Column({ type: 'varchar', length: 10, nullable: true })
  faultedPhases!: string | null;

  /** Where the fault current was measured. */
  @Column({ type: 'varchar', length: 2 })
  side!: 'hv' | 'lv';

  /** The side the fault was on (rules revision 2; null = the same as `side`). */
  @Column({ type: 'varchar', length: 2, nullable: true })
  location!: 'hv' | 'lv' | null;

  /** What the shots' currents are (rules revision 2): `line` (null means line) or `winding`. */
  @Column({ type: 'varchar', length: 8, nullable: true })
  currentIs!: 'line' | 'winding' | null;

  @Column({ type: 'json' })
  shots!: { currentKA: number; durationS: number }[];

  @Column({ type: 'boolean', default: true })
  transformerTripped!: boolean;

  @Column({ type: 'json' })
  protectionOperated!: Protection[];

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ type: 'varchar', length: 12, default: 'logged' })
  status!: EventStatus;

  /** When a released unit was actually re-energised (null: not recorded); follow-ups count from it. */
  @Column({ type: 'datetime', precision: 3, nullable: true })
  energisedAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdById!: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt!: Date;
}
