import { Column, Entity, PrimaryColumn } from 'typeorm';

// Small key/value facts about this database, e.g. the demo seed marker.
@Entity({ name: 'app_setting' })
export class AppSetting {
  @PrimaryColumn({ type: 'varchar', length: 64 })
  key!: string;

  @Column({ type: 'text' })
  value!: string;
}
