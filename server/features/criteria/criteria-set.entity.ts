import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

// A versioned set of every threshold and table the engine uses; published versions never change.
@Entity({ name: 'criteria_set' })
export class CriteriaSet {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true, unique: true })
  version!: number;

  @Column({ type: 'varchar', length: 10 })
  status!: 'draft' | 'published';

  @Column({ type: 'json' })
  thresholds!: Record<string, unknown>;

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ type: 'int', unsigned: true, nullable: true })
  createdById!: number | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  publishedAt!: Date | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
