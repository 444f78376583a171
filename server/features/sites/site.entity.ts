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

  /** How the site's dates are written: a BCP 47 locale (en-GB, de-DE…); null: the international ISO form. */
  @Column({ type: 'varchar', length: 35, nullable: true })
  locale!: string | null;

  /** Where decisions on the site's units are mailed (optional). */
  @Column({ type: 'varchar', length: 254, nullable: true })
  controlRoomEmail!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
