import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { EventStatus, Recommendation } from '../../../shared/schemas/enums.js';
import { Design } from '../designs/design.entity.js';
import { Site } from '../sites/site.entity.js';

// One transformer. lastEvent* / lastRecommendation are kept up to date by events and screenings for the fleet list.
@Entity({ name: 'unit' })
@Index(['siteId', 'serial'])
@Index(['designId', 'serial'])
// The fleet's sorts by last event and by recommendation, ties by serial, in both directions from an index: the
// descending twins are created with the first column DESC by their migration (TypeORM's decorator cannot say so).
@Index(['lastEventAt', 'serial'])
@Index('IDX_unit_lastEventAt_desc_serial', ['lastEventAt', 'serial'])
@Index(['lastRecommendation', 'serial'])
@Index('IDX_unit_lastRecommendation_desc_serial', ['lastRecommendation', 'serial'])
export class Unit {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 60, unique: true })
  serial!: string;

  /** Position or local name at the site, e.g. "T2". */
  @Column({ type: 'varchar', length: 60, default: '' })
  position!: string;

  @Column({ type: 'int', unsigned: true })
  siteId!: number;

  @ManyToOne(() => Site, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'siteId' })
  site!: Relation<Site>;

  @Column({ type: 'int', unsigned: true })
  designId!: number;

  @ManyToOne(() => Design, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'designId' })
  design!: Relation<Design>;

  @Column({ type: 'smallint', unsigned: true, nullable: true })
  year!: number | null;

  @Column({ type: 'tinyint', unsigned: true })
  phases!: 1 | 3;

  @Column({ type: 'double' })
  hvKV!: number;

  @Column({ type: 'double' })
  lvKV!: number;

  /** kVA base of the nameplate impedance; the IEEE category uses it too. */
  @Column({ type: 'double' })
  ratedKVA!: number;

  @Column({ type: 'double' })
  impedancePercent!: number;

  @Column({ type: 'double', default: 0 })
  systemImpedancePercent!: number;

  @Column({ type: 'varchar', length: 2, default: 'Cu' })
  conductor!: 'Cu' | 'Al';

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lastEventAt!: Date | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  lastEventId!: number | null;

  @Column({ type: 'varchar', length: 12, nullable: true })
  lastEventStatus!: EventStatus | null;

  @Column({ type: 'varchar', length: 12, nullable: true })
  lastRecommendation!: Recommendation | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt!: Date;
}
