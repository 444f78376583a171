import type { EntityManager } from 'typeorm';
import { readingSetToRows, rowsToReadingSet } from '../../../shared/readings/rows.js';
import type { ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import { SESSION_READING_SECTIONS, type SessionPatch } from '../../../shared/schemas/fleet.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { readingSetConditions } from '../units/units.service.js';
import { Reading } from './reading.entity.js';
import { ReadingSet } from './reading-set.entity.js';
import { insulationTemperatureC, loadCaseReadingSets } from './readings.service.js';

/** Reading-set columns a correction sets as given (null clears). */
const PLAIN_CONDITIONS = ['ambientC', 'humidityPercent', 'instrument', 'instrumentSerial', 'testKV', 'testFrequencyHz', 'demagnetised', 'windingTemperatureC', 'notes'] as const;

/**
 * Applies a correction to a stored reading set (a session or a unit's set): only the fields named change; a reading
 * section named replaces the set's rows of that section (null or {} removes it). Audited as `update` with the changed
 * fields before and after (no entry when nothing changed). The caller checks whether the set may still change.
 */
export async function applyReadingSetPatch(m: EntityManager, clock: Clock, userId: number, set: ReadingSet, patch: SessionPatch, note: string) {
  const repo = m.getRepository(ReadingSet);
  const conditionsBefore: Record<string, unknown> = readingSetConditions(set);
  const valuesBefore = (await loadCaseReadingSets(m, [set])).get(set.id) as Record<string, unknown>;

  const columns: Omit<Partial<ReadingSet>, 'extra'> = {};
  if (patch.takenAt !== undefined) columns.takenAt = new Date(patch.takenAt);
  for (const key of PLAIN_CONDITIONS) if (patch[key] !== undefined) (columns as Record<string, unknown>)[key] = patch[key];
  if (patch.tapPosition !== undefined) columns.tapPosition = patch.tapPosition === null ? null : String(patch.tapPosition);
  const hours = patch.hoursDeEnergised !== undefined ? patch.hoursDeEnergised : patch.hoursDeenergised;
  if (hours !== undefined) columns.hoursDeenergised = hours;
  if (patch.topOilC !== undefined) columns.topOilC = patch.topOilC;
  if (patch.bottomOilC !== undefined) columns.bottomOilC = patch.bottomOilC;
  if (patch.temperatureC !== undefined) columns.temperatureC = patch.temperatureC;
  else if (patch.topOilC !== undefined || patch.bottomOilC !== undefined) {
    // An insulation temperature taken from the oil follows the corrected oil temperatures.
    const derived = insulationTemperatureC({ topOilC: set.topOilC ?? undefined, bottomOilC: set.bottomOilC ?? undefined });
    if (set.temperatureC === derived) {
      columns.temperatureC = insulationTemperatureC({ topOilC: (columns.topOilC ?? set.topOilC) ?? undefined, bottomOilC: (columns.bottomOilC ?? set.bottomOilC) ?? undefined });
    }
  }
  if (Object.keys(columns).length) await repo.update(set.id, columns);

  const sections = SESSION_READING_SECTIONS.filter((k) => patch[k] !== undefined);
  if (sections.length) {
    const rows = await m.getRepository(Reading).find({ where: { readingSetId: set.id }, order: { id: 'ASC' } });
    const values = rowsToReadingSet(rows) as Record<string, unknown>;
    for (const k of sections) {
      const v = patch[k];
      if (v === null || (typeof v === 'object' && !Array.isArray(v) && Object.keys(v).length === 0)) delete values[k];
      else values[k] = v;
    }
    await m.delete(Reading, { readingSetId: set.id });
    const fresh = readingSetToRows(values as CaseReadingSet);
    if (fresh.length) await m.insert(Reading, fresh.map((r) => ({ ...r, readingSetId: set.id })));
  }

  const after = await repo.findOneByOrFail({ id: set.id });
  const valuesAfter = (await loadCaseReadingSets(m, [after])).get(after.id);
  const newValues = valuesAfter as Record<string, unknown> | undefined;
  const conditionsAfter: Record<string, unknown> = readingSetConditions(after);
  const changedBefore: Record<string, unknown> = {};
  const changedAfter: Record<string, unknown> = {};
  for (const key of Object.keys(conditionsAfter)) {
    if (JSON.stringify(conditionsBefore[key]) !== JSON.stringify(conditionsAfter[key])) {
      changedBefore[key] = conditionsBefore[key];
      changedAfter[key] = conditionsAfter[key];
    }
  }
  for (const key of sections) {
    if (JSON.stringify(valuesBefore?.[key]) !== JSON.stringify(newValues?.[key])) {
      changedBefore[key] = valuesBefore?.[key] ?? null;
      changedAfter[key] = newValues?.[key] ?? null;
    }
  }
  const changed = Object.keys(changedAfter).length > 0;
  if (changed) await audit(m, clock, { userId, action: 'update', entity: 'reading_set', entityId: set.id, before: changedBefore, after: changedAfter, note });
  return { after, values: valuesAfter, changed };
}
