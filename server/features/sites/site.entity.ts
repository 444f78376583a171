import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

// A substation: its time zone is how dates of its units' events are shown.
@Entity({ name: 'site' })
export class Site {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 120, unique: true })
  name!: string;

  @Column({ type: 'varchar', length: 64 })
  timeZone!: string;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
