import { In, type EntityManager } from 'typeorm';
import { auditExportSheet, indicatorsExportSheet, readingsExportSheet, type ExportSheet } from '../../../shared/exports/sheets.js';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import { notFound } from '../../common/app-error.js';
import type { Clock } from '../../common/clock.js';
import { getEvent } from '../events/events.query.js';
import { Reading } from '../readings/reading.entity.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { Screening } from '../screenings/screening.entity.js';
import { Unit } from '../units/unit.entity.js';
import { sheetFile, type SheetFormat } from './sheet-file.js';

async function fileOf(format: SheetFormat, sheetName: string, baseName: string, sheet: ExportSheet, clock: Clock) {
  return { ...(await sheetFile(format, sheetName, sheet.header, sheet.rows, clock)), fileName: `${baseName}.${format}`, written: sheet.rows.length };
}

/** GET /api/units/:unitId/readings/export — every reading of the unit, one a row, oldest set first. */
export async function exportUnitReadings(m: EntityManager, clock: Clock, unitId: number, format: SheetFormat) {
  const unit = await m.getRepository(Unit).findOne({ where: { id: unitId }, relations: { site: true } });
  if (!unit) throw notFound('Unit');
  const sets = await m.getRepository(ReadingSet).find({ where: { unitId }, order: { takenAt: 'ASC', id: 'ASC' } });
  const readings = sets.length ? await m.getRepository(Reading).find({ where: { readingSetId: In(sets.map((s) => s.id)) }, order: { id: 'ASC' } }) : [];
  // Readings grouped by set in one pass (not a scan of every reading per set).
  const bySet = new Map<number, Reading[]>();
  for (const r of readings) (bySet.get(r.readingSetId) ?? bySet.set(r.readingSetId, []).get(r.readingSetId)!).push(r);
  const sheet = readingsExportSheet(
    sets.map((s) => ({ id: s.id, kind: s.kind, takenAt: s.takenAt.toISOString(), isReference: s.isReference, eventId: s.eventId, readings: bySet.get(s.id) ?? [] })),
    unit.site.timeZone,
  );
  const safeSerial = unit.serial.replace(/[^A-Za-z0-9._-]/g, '_');
  return fileOf(format, 'Readings', `gapsight-unit-${safeSerial}-readings`, sheet, clock);
}

/** GET /api/screenings/:screeningId/indicators/export — the screening's indicators, one a row. */
export async function exportScreeningIndicators(m: EntityManager, clock: Clock, screeningId: number, format: SheetFormat) {
  const s = await m.getRepository(Screening).findOne({ where: { id: screeningId } });
  if (!s) throw notFound('Screening');
  const result = s.result as unknown as GapsightResult;
  return fileOf(format, 'Indicators', `gapsight-event-${s.eventId}-screening-${s.id}-indicators`, indicatorsExportSheet(result.indicators ?? []), clock);
}

/** GET /api/events/:eventId/audit/export — the event's audit trail as the event file shows it. */
export async function exportEventAudit(m: EntityManager, clock: Clock, eventId: number, format: SheetFormat) {
  const e = await getEvent(m, eventId);
  const personName = (id: number | null) => (id === null ? 'System' : (e.people[id]?.name ?? `User ${id}`));
  const sheet = auditExportSheet(e.audit, e.unit.site.timeZone, personName);
  return fileOf(format, 'Audit trail', `gapsight-event-${eventId}-audit`, sheet, clock);
}
