import { MigrationInterface, QueryRunner } from 'typeorm';

// A site's date format: a BCP 47 locale (en-GB, de-DE…) or NULL for the international ISO form.
export class SiteLocale1796300000000 implements MigrationInterface {
  name = 'SiteLocale1796300000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `site` ADD `locale` varchar(35) NULL');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `site` DROP COLUMN `locale`');
  }
}
