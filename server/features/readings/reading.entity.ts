import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { ReadingSet } from './reading-set.entity.js';

// One measured value: quantity, configuration (CH, CHL, a gas) or phase, mode (GST/UST, volts/amps…), value and unit.
@Entity({ name: 'reading' })
@Index(['readingSetId', 'quantity'])
export class Reading {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  readingSetId!: number;

  @ManyToOne(() => ReadingSet, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'readingSetId' })
  readingSet!: Relation<ReadingSet>;

  @Column({ type: 'varchar', length: 30 })
  quantity!: string;

  @Column({ type: 'varchar', length: 20, nullable: true })
  configuration!: string | null;

  @Column({ type: 'varchar', length: 8, nullable: true })
  phase!: string | null;

  @Column({ type: 'varchar', length: 20, nullable: true })
  mode!: string | null;

  @Column({ type: 'double', nullable: true })
  frequencyHz!: number | null;

  @Column({ type: 'double' })
  value!: number;

  @Column({ type: 'varchar', length: 12 })
  unit!: string;
}
