import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

// A family of sister units built to one design: nameplate data they share and the capacitance configurations to test.
@Entity({ name: 'design' })
export class Design {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 80, unique: true })
  reference!: string;

  @Column({ type: 'varchar', length: 120 })
  maker!: string;

  @Column({ type: 'varchar', length: 20, default: 'two-winding' })
  windings!: 'two-winding' | 'three-winding' | 'auto' | 'auto-tertiary';

  @Column({ type: 'varchar', length: 20 })
  vectorGroup!: string;

  @Column({ type: 'tinyint', unsigned: true, default: 3 })
  phases!: 1 | 3;

  @Column({ type: 'double' })
  hvKV!: number;

  @Column({ type: 'double' })
  lvKV!: number;

  @Column({ type: 'double', nullable: true })
  tvKV!: number | null;

  /** Cooling stages with their ratings, e.g. [{ stage: 'ONAN', kVA: 40000 }]. */
  @Column({ type: 'json' })
  coolingStages!: { stage: string; kVA: number }[];

  @Column({ type: 'double' })
  impedancePercent!: number;

  /** The kVA the nameplate %Z is based on (usually the lowest cooling stage). */
  @Column({ type: 'double' })
  impedanceBaseKVA!: number;

  @Column({ type: 'varchar', length: 2, default: 'Cu' })
  conductor!: 'Cu' | 'Al';

  @Column({ type: 'json' })
  requiredCapacitance!: string[];

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt!: Date;
}
