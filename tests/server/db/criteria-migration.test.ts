import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadCriteria } from '../../../server/features/criteria/criteria.service.js';
import { CriteriaSet } from '../../../server/features/criteria/criteria-set.entity.js';
import { criteriaSchema, criteriaV1, criteriaV2 } from '../../../shared/screening/criteria.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
});
afterAll(async () => {
  await env.db.destroy();
});

describe('criteria sets after the migrations', () => {
  it('hold version 1 and version 2, both published, with the engine defaults of their revision', async () => {
    const rows = await env.db.getRepository(CriteriaSet).find({ where: [{ version: 1 }, { version: 2 }], order: { version: 'ASC' } });
    expect(rows.map((r) => [r.version, r.status, r.publishedAt !== null])).toEqual([
      [1, 'published', true],
      [2, 'published', true],
    ]);
    expect(rows[0].thresholds).toEqual(JSON.parse(JSON.stringify(criteriaV1)));
    expect(rows[1].thresholds).toEqual(JSON.parse(JSON.stringify(criteriaV2)));
    for (const r of rows) expect(criteriaSchema.safeParse(r.thresholds).success, `version ${r.version}`).toBe(true);
  });

  it('give new screenings version 2 (the newest published), and version 1 on request', async () => {
    expect((await loadCriteria(env.db.manager)).version).toBe(2);
    expect((await loadCriteria(env.db.manager, 1)).version).toBe(1);
  });
});
