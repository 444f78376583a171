import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { ReadingSet } from './reading-set.entity.js';

// A frequency-response trace: points stored as one JSON value [[frequencyHz, magnitudeDb, phaseDeg?], …].
@Entity({ name: 'sweep_trace' })
@Index(['readingSetId', 'label'])
export class SweepTrace {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  readingSetId!: number;

  @ManyToOne(() => ReadingSet, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'readingSetId' })
  readingSet!: Relation<ReadingSet>;

  @Column({ type: 'varchar', length: 60 })
  label!: string;

  @Column({ type: 'varchar', length: 30 })
  testType!: 'open-circuit' | 'short-circuit' | 'capacitive-interwinding' | 'inductive-interwinding';

  @Column({ type: 'varchar', length: 60, nullable: true })
  terminals!: string | null;

  /** Winding the trace was taken on (rules revision 2): hv, lv or tv; null counts as HV. */
  @Column({ type: 'varchar', length: 2, nullable: true })
  winding!: 'hv' | 'lv' | 'tv' | null;

  /** Phase of the trace: A, B or C. */
  @Column({ type: 'varchar', length: 1, nullable: true })
  phase!: 'A' | 'B' | 'C' | null;

  @Column({ type: 'varchar', length: 20, nullable: true })
  tapPosition!: string | null;

  /** Tap position of the baseline trace this one is compared with (default: the baseline trace's own tap). */
  @Column({ type: 'varchar', length: 20, nullable: true })
  baselineTapPosition!: string | null;

  @Column({ type: 'boolean', nullable: true })
  demagnetised!: boolean | null;

  @Column({ type: 'json' })
  points!: number[][];

  @Column({ type: 'int', unsigned: true })
  pointCount!: number;

  @Column({ type: 'double' })
  minHz!: number;

  @Column({ type: 'double' })
  maxHz!: number;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  @Column({ type: 'varchar', length: 255, nullable: true })
  fileName!: string | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdById!: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
