import type { EntityManager } from 'typeorm';
import { criteriaSchema, type Criteria } from '../../../shared/screening/criteria.js';
import { AppError } from '../../common/app-error.js';
import { CriteriaSet } from './criteria-set.entity.js';

/** A criteria set by version (default: the newest published one), validated before the engine sees it. */
export async function loadCriteria(m: EntityManager, version?: number): Promise<{ version: number; status: 'draft' | 'published'; criteria: Criteria }> {
  const repo = m.getRepository(CriteriaSet);
  const row = version
    ? await repo.findOne({ where: { version } })
    : await repo.findOne({ where: { status: 'published' }, order: { version: 'DESC' } });
  if (!row) throw new AppError('invalid_input', 'Some fields are invalid.', 400, { criteriaVersion: version ? `no criteria set version ${version}` : 'no published criteria set' });
  const parsed = criteriaSchema.safeParse(row.thresholds);
  if (!parsed.success) throw new AppError('invalid_criteria', `Criteria set version ${row.version} does not validate; fix it before screening.`, 409);
  return { version: row.version, status: row.status, criteria: parsed.data };
}
