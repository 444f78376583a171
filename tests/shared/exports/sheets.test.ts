// Export rows: readings one a row with words for kinds and quantities, indicators labelled, audit rows with site time,
// UTC, the person and before/after as JSON.
import { describe, expect, it } from 'vitest';
import { auditExportSheet, auditValuesJson, indicatorsExportSheet, quantityWord, readingsExportSheet } from '../../../shared/exports/sheets.js';
import { auditSentence } from '../../../shared/audit-words.js';
import type { Indicator } from '../../../shared/schemas/result.js';
import { fieldLabel, indicatorLabel } from '../../../shared/vocabulary.js';

describe('readingsExportSheet', () => {
  it('writes one row per reading with the set kind, both times and configuration / phase together', () => {
    const sheet = readingsExportSheet(
      [
        {
          id: 3,
          kind: 'routine',
          takenAt: '2026-06-01T08:30:00.000Z',
          isReference: true,
          eventId: null,
          readings: [
            { quantity: 'capacitance', configuration: 'CHL', phase: null, mode: null, frequencyHz: null, value: 5210, unit: 'pF' },
            { quantity: 'bushing-c1', configuration: 'H1', phase: 'A', mode: 'UST', frequencyHz: 60, value: 410, unit: 'pF' },
          ],
        },
      ],
      'Europe/London',
    );
    expect(sheet.rows).toEqual([
      [3, 'Routine', 'yes', null, '2026-06-01 09:30 +01:00 Europe/London', '2026-06-01T08:30:00.000Z', 'Capacitance', 'CHL', null, null, 5210, 'pF'],
      [3, 'Routine', 'yes', null, '2026-06-01 09:30 +01:00 Europe/London', '2026-06-01T08:30:00.000Z', 'Bushing c1', 'H1 / A', 'UST', 60, 410, 'pF'],
    ]);
  });

  it('keeps a case label when the quantity has one', () => {
    expect(quantityWord('reactance')).toBe('Leakage reactance');
  });
});

describe('indicatorsExportSheet and auditExportSheet', () => {
  it('labels an indicator in words and keeps its rule and source', () => {
    const i = { key: 'capacitance.CHL.shiftPercent', value: 3.5, level: 'investigate', rule: 'shift 3–5 %', source: 'brief', method: 'capacitance' } as unknown as Indicator;
    const [row] = indicatorsExportSheet([i]).rows;
    expect([row[0], row[1], row[2], row[5], row[6], row[7]]).toEqual([indicatorLabel(i.key), i.key, 3.5, 'Investigate', 'shift 3–5 %', 'brief']);
  });

  it('writes an audit row with site time, UTC, the name, the audit sentence and JSON before/after with the fields in words', () => {
    const entry = { at: '2026-12-01T10:00:00.000Z', userId: 4, action: 'update', entity: 'fault_event', entityId: '7', before: { notes: 'a' }, after: { notes: 'b' }, highlighted: false, note: null };
    const summary = auditSentence(entry, { timeZone: 'Australia/Sydney', person: (id) => (id === 4 ? 'Pat Protection' : null) });
    const sheet = auditExportSheet([{ ...entry, summary }], 'Australia/Sydney', (id) => (id === 4 ? 'Pat Protection' : '?'));
    expect(sheet.rows).toEqual([
      ['2026-12-01 21:00 +11:00 Australia/Sydney', '2026-12-01T10:00:00.000Z', 'Pat Protection', summary, 'fault event 7', null, 'no', '{"Notes":"a"}', '{"Notes":"b"}'],
    ]);
    // The Action column is the audit trail's sentence, naming the person: not "Changed fault event".
    expect(summary).toMatch(/^Pat Protection /);
    expect(sheet.rows[0][3]).not.toBe('Changed fault event');
  });

  it('names before/after fields with the vocabulary (fieldLabel) and keeps the values exactly as stored', () => {
    expect(auditValuesJson('fault_event', { protectionOperated: ['differential', 'buchholz-trip'], transformerTripped: true })).toBe(
      JSON.stringify({ [fieldLabel('fault_event', 'protectionOperated')]: ['differential', 'buchholz-trip'], [fieldLabel('fault_event', 'transformerTripped')]: true }),
    );
    expect(fieldLabel('fault_event', 'protectionOperated')).not.toBe('protectionOperated');
    expect(auditValuesJson('finding', null)).toBeNull();
    expect(auditValuesJson('finding', [1, 2])).toBe('[1,2]');
  });
});
