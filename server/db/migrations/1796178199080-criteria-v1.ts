import type { MigrationInterface, QueryRunner } from 'typeorm';
import { criteriaV1 } from '../../../shared/screening/criteria.js';

// Criteria set version 1 = the engine's defaults (published; published versions never change).
export class CriteriaV11796178199080 implements MigrationInterface {
  name = 'CriteriaV11796178199080';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(
      "INSERT INTO `criteria_set` (`version`, `status`, `thresholds`, `notes`, `publishedAt`) VALUES (1, 'published', ?, ?, CURRENT_TIMESTAMP(3))",
      [JSON.stringify(criteriaV1), 'Gapsight defaults from the product brief (published guidance and common practice; review before use).'],
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('DELETE FROM `criteria_set` WHERE `version` = 1');
  }
}
