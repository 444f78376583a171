// Rows of the unit-readings, screening-indicators and audit-trail exports (.xlsx and CSV), built from plain data.
import { formatInstant } from '../format.js';
import type { SheetCell } from '../imports/units-sheet.js';
import type { Indicator } from '../schemas/result.js';
import type { ReadingSetKind } from '../schemas/enums.js';
import { basisLabel, ENTITY_WORDS, fieldLabel, indicatorLabel, indicatorUnit, KIND_LABELS, LEVEL_LABELS, QUANTITY_LABELS, methodWord } from '../vocabulary.js';

export interface ExportSheet {
  header: readonly string[];
  rows: SheetCell[][];
}

export interface ExportReadingSet {
  id: number;
  kind: ReadingSetKind;
  takenAt: string;
  isReference: boolean;
  eventId: number | null;
  readings: ReadonlyArray<{ quantity: string; configuration: string | null; phase: string | null; mode: string | null; frequencyHz: number | null; value: number; unit: string }>;
}

export const READINGS_EXPORT_COLUMNS = [
  'Set',
  'Set kind',
  'Reference',
  'Event',
  'Taken at (site time)',
  'Taken at (UTC)',
  'Quantity',
  'Configuration / phase',
  'Mode',
  'Frequency (Hz)',
  'Value',
  'Unit',
] as const;

/** A stored row's quantity in words: the case label when there is one, else the code with spaces ('bushing-c1' → 'Bushing c1'). */
export function quantityWord(quantity: string): string {
  const label = QUANTITY_LABELS[quantity];
  if (label) return label;
  const words = quantity.replace(/[-_]/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** One row per reading, sets in the order given; times on the site's clock and in UTC. */
export function readingsExportSheet(sets: readonly ExportReadingSet[], timeZone: string): ExportSheet {
  const rows = sets.flatMap((s) =>
    s.readings.map((r): SheetCell[] => [
      s.id,
      KIND_LABELS[s.kind] ?? s.kind,
      s.isReference ? 'yes' : 'no',
      s.eventId,
      formatInstant(s.takenAt, timeZone),
      s.takenAt,
      quantityWord(r.quantity),
      [r.configuration, r.phase].filter((x) => x).join(' / ') || null,
      r.mode,
      r.frequencyHz,
      r.value,
      r.unit,
    ]),
  );
  return { header: READINGS_EXPORT_COLUMNS, rows };
}

export const INDICATORS_EXPORT_COLUMNS = ['Indicator', 'Key', 'Value (shift)', 'Unit', 'Compared with', 'Level', 'Rule', 'Source', 'Method', 'Where', 'Note'] as const;

/** One row per indicator of a screening result, in the engine's order. */
export function indicatorsExportSheet(indicators: readonly Indicator[]): ExportSheet {
  const rows = indicators.map((i): SheetCell[] => [
    indicatorLabel(i.key),
    i.key,
    typeof i.value === 'boolean' ? (i.value ? 'yes' : 'no') : i.value,
    indicatorUnit(i.key) || null,
    basisLabel(i),
    LEVEL_LABELS[i.level] ?? i.level,
    i.rule,
    i.source,
    methodWord(i.method),
    i.location ?? null,
    i.note ?? null,
  ]);
  return { header: INDICATORS_EXPORT_COLUMNS, rows };
}

export interface ExportAuditRow {
  at: string;
  userId: number | null;
  action: string;
  entity: string;
  entityId: string;
  before: unknown;
  after: unknown;
  highlighted: boolean;
  note: string | null;
  /** The entry as the event file's audit trail says it (shared/audit-words.ts `auditSentence`). */
  summary: string;
}

export const AUDIT_EXPORT_COLUMNS = ['Time (site)', 'Time (UTC)', 'Who', 'Action', 'Record', 'Note', 'Against the recommendation', 'Before', 'After'] as const;

/**
 * Before or after values as JSON with the fields named in words ({"Notes":"b"} rather than {"notes":"b"}): the values
 * exactly as stored. A field whose label another field already has keeps its own name beside it.
 */
export function auditValuesJson(entity: string, v: unknown): string | null {
  if (v == null) return null;
  if (typeof v !== 'object' || Array.isArray(v)) return JSON.stringify(v);
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(v as Record<string, unknown>)) {
    const label = fieldLabel(entity, key);
    out[label in out ? `${label} (${key})` : label] = value;
  }
  return JSON.stringify(out);
}

/**
 * One row per audit entry: time on the site's clock and in UTC, the person's name, the entry as the audit trail's
 * sentence ("Pat Protection changed the notes …"), before/after as JSON with the fields in words.
 */
export function auditExportSheet(rows: readonly ExportAuditRow[], timeZone: string, personName: (id: number | null) => string): ExportSheet {
  return {
    header: AUDIT_EXPORT_COLUMNS,
    rows: rows.map((a): SheetCell[] => [
      formatInstant(a.at, timeZone),
      a.at,
      personName(a.userId),
      a.summary,
      `${ENTITY_WORDS[a.entity] ?? a.entity.replace(/_/g, ' ')} ${a.entityId}`,
      a.note,
      a.highlighted ? 'yes' : 'no',
      auditValuesJson(a.entity, a.before),
      auditValuesJson(a.entity, a.after),
    ]),
  };
}
