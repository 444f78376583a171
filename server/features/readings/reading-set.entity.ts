import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ReadingSetKind } from '../../../shared/schemas/enums.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { Unit } from '../units/unit.entity.js';

export type { ReadingSetKind };

// One test session on a unit: its conditions (temperatures, tap, instrument) and, through Reading rows, its values.
// A post-fault set belongs to an event (a "session").
@Entity({ name: 'reading_set' })
@Index(['unitId', 'kind', 'takenAt'])
@Index(['eventId', 'takenAt'])
export class ReadingSet {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  unitId!: number;

  @ManyToOne(() => Unit, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'unitId' })
  unit!: Relation<Unit>;

  @Column({ type: 'varchar', length: 14 })
  kind!: ReadingSetKind;

  @Column({ type: 'int', unsigned: true, nullable: true })
  eventId!: number | null;

  @ManyToOne(() => FaultEvent, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'eventId' })
  event!: Relation<FaultEvent> | null;

  /** Marked by an engineer as the unit's reference fingerprint (counts as a baseline). */
  @Column({ type: 'boolean', default: false })
  isReference!: boolean;

  @Column({ type: 'datetime', precision: 3 })
  takenAt!: Date;

  /** Insulation temperature: the mean of top and bottom oil where both are known. */
  @Column({ type: 'double', nullable: true })
  temperatureC!: number | null;

  @Column({ type: 'double', nullable: true })
  topOilC!: number | null;

  @Column({ type: 'double', nullable: true })
  bottomOilC!: number | null;

  @Column({ type: 'double', nullable: true })
  ambientC!: number | null;

  @Column({ type: 'double', nullable: true })
  humidityPercent!: number | null;

  @Column({ type: 'varchar', length: 20, nullable: true })
  tapPosition!: string | null;

  @Column({ type: 'varchar', length: 120, nullable: true })
  instrument!: string | null;

  @Column({ type: 'varchar', length: 60, nullable: true })
  instrumentSerial!: string | null;

  @Column({ type: 'double', nullable: true })
  testKV!: number | null;

  @Column({ type: 'double', nullable: true })
  testFrequencyHz!: number | null;

  /** Hours between de-energising and the tests (the case format's `hoursDeEnergised`). */
  @Column({ type: 'double', nullable: true })
  hoursDeenergised!: number | null;

  /** The core was demagnetised before the excitation and sweep tests (or they came before any DC test). */
  @Column({ type: 'boolean', nullable: true })
  demagnetised!: boolean | null;

  /** Measured winding temperature for the resistance correction, °C. */
  @Column({ type: 'double', nullable: true })
  windingTemperatureC!: number | null;

  /** Optional fields of the case format that have no column (kept as given). */
  @Column({ type: 'json', nullable: true })
  extra!: Record<string, unknown> | null;

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdById!: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
