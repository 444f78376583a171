import { MigrationInterface, QueryRunner } from 'typeorm';

// The security log: failed, throttled and refused sign-ins, locks, unlocks and authorization refusals.
export class SecurityEvent1796410000001 implements MigrationInterface {
  name = 'SecurityEvent1796410000001';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE `security_event` (`id` int UNSIGNED NOT NULL AUTO_INCREMENT, `at` datetime(3) NOT NULL, `kind` varchar(30) NOT NULL, ' +
        '`userId` int UNSIGNED NULL, `email` varchar(254) NULL, `address` varchar(64) NULL, `route` varchar(200) NOT NULL, `detail` varchar(300) NULL, ' +
        'INDEX `IDX_security_event_at` (`at`), INDEX `IDX_security_event_user_kind_at` (`userId`, `kind`, `at`), PRIMARY KEY (`id`)) ENGINE=InnoDB',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE `security_event`');
  }
}
