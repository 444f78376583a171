import { MigrationInterface, QueryRunner } from 'typeorm';

// Per-user token version: carried in every session token (`ver`) and raised on a password change or reset, a
// deactivation or reactivation and a sign-out, which ends every older token of that person.
export class TokenVersion1796410000000 implements MigrationInterface {
  name = 'TokenVersion1796410000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `user` ADD `tokenVersion` int UNSIGNED NOT NULL DEFAULT 0');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE `user` DROP COLUMN `tokenVersion`');
  }
}
