import type { MigrationInterface, QueryRunner } from 'typeorm';
import { criteriaV2 } from '../../../shared/screening/criteria.js';

// Criteria set version 2 = the engine's defaults for rules revision 2 (published; published versions never change).
// Version 1 stays: screenings made with it can still be re-run with it. New screenings take the newest published set.
export class CriteriaV21796221430120 implements MigrationInterface {
  name = 'CriteriaV21796221430120';

  public async up(q: QueryRunner): Promise<void> {
    const existing: { status: string }[] = await q.query('SELECT `status` FROM `criteria_set` WHERE `version` = 2');
    if (existing.length) {
      throw new Error(`A criteria set version 2 already exists (${existing[0].status}): renumber it before this migration publishes the revision-2 defaults as version 2.`);
    }
    await q.query(
      "INSERT INTO `criteria_set` (`version`, `status`, `thresholds`, `notes`, `publishedAt`) VALUES (2, 'published', ?, ?, CURRENT_TIMESTAMP(3))",
      [
        JSON.stringify(criteriaV2),
        'Gapsight defaults for rules revision 2 (version 1 plus auto-transformer defaults, power-factor floor and temperature doubt, resistance cooling time, fixed sweep grid, bushings, plausibility, remanence); published guidance and common practice, review before use.',
      ],
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query('DELETE FROM `criteria_set` WHERE `version` = 2');
  }
}
