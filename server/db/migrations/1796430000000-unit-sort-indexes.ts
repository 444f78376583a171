import type { MigrationInterface, QueryRunner } from 'typeorm';

// The fleet list sorted by last event or by recommendation, ties by serial, read in index order in both directions (no
// sort of the whole unit table): (lastEventAt, serial) replaces (lastEventAt); the DESC twins serve the descending
// sorts, whose serial tie-break stays ascending.
export class UnitSortIndexes1796430000000 implements MigrationInterface {
  name = 'UnitSortIndexes1796430000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP INDEX `IDX_41013d4e5cf8862a8b5d276b55` ON `unit`');
    await queryRunner.query('CREATE INDEX `IDX_3483b8ac43e9de59b35f2d1ec9` ON `unit` (`lastEventAt`, `serial`)');
    await queryRunner.query('CREATE INDEX `IDX_unit_lastEventAt_desc_serial` ON `unit` (`lastEventAt` DESC, `serial`)');
    await queryRunner.query('CREATE INDEX `IDX_unit_lastRecommendation_desc_serial` ON `unit` (`lastRecommendation` DESC, `serial`)');
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP INDEX `IDX_unit_lastRecommendation_desc_serial` ON `unit`');
    await queryRunner.query('DROP INDEX `IDX_unit_lastEventAt_desc_serial` ON `unit`');
    await queryRunner.query('DROP INDEX `IDX_3483b8ac43e9de59b35f2d1ec9` ON `unit`');
    await queryRunner.query('CREATE INDEX `IDX_41013d4e5cf8862a8b5d276b55` ON `unit` (`lastEventAt`)');
  }
}
