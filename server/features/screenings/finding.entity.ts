import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { FindingClassification } from '../../../shared/schemas/enums.js';
import { FaultEvent } from '../events/fault-event.entity.js';

// What an inspection of a held unit found: the outcome history criteria can be back-tested against.
@Entity({ name: 'finding' })
@Index(['eventId'])
export class Finding {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  eventId!: number;

  @ManyToOne(() => FaultEvent, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'eventId' })
  event!: Relation<FaultEvent>;

  @Column({ type: 'varchar', length: 30 })
  classification!: FindingClassification;

  @Column({ type: 'text' })
  text!: string;

  @Column({ type: 'int', unsigned: true, nullable: true })
  recordedById!: number | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  recordedAt!: Date;
}
