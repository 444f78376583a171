// Case and criteria schemas: field paths in errors, unknown fields refused, criteria JSON round trip.
import { describe, expect, it } from 'vitest';
import { parseCase, readingSetSchema, shotSchema } from '../../shared/schemas/case.js';
import { criteriaSchema, criteriaV1 } from '../../shared/screening/index.js';
import { cleanCase } from './case-builder.js';

describe('parseCase', () => {
  it('accepts a valid case and refuses a field the format does not name, at any level, naming it', () => {
    expect(parseCase(cleanCase()).ok).toBe(true);
    const parsed = parseCase({ ...cleanCase(), note: 'extra', unit: { ...cleanCase().unit, siteName: 'Harrow Cross' } });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors).toEqual(expect.arrayContaining([{ path: 'note', message: 'unknown field' }, { path: 'unit.siteName', message: 'unknown field' }]));
  });

  it('names every bad field by its dotted path', () => {
    const bad = cleanCase() as unknown as Record<string, any>;
    bad.fault.shots = [{ currentKA: -1, durationS: 0.1 }, { currentKA: 5, durationS: 0 }];
    bad.unit.phases = 2;
    bad.postFault.capacitancePF.CHL = 'big';
    const parsed = parseCase(bad);
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) {
      const paths = parsed.errors.map((e) => e.path);
      expect(paths).toEqual(expect.arrayContaining(['fault.shots.0.currentKA', 'fault.shots.1.durationS', 'unit.phases', 'postFault.capacitancePF.CHL']));
      for (const e of parsed.errors) expect(e.message.length).toBeGreaterThan(0);
    }
  });

  it('rejects a wrong format tag and a missing unit', () => {
    const parsed = parseCase({ format: 'gapsight-case/2' });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors.map((e) => e.path)).toEqual(expect.arrayContaining(['format', 'unit']));
  });

  it('exports the reading-set and shot schemas for API bodies', () => {
    expect(readingSetSchema.safeParse({ takenAt: '2026-11-29', capacitancePF: { CH: 3000 } }).success).toBe(true);
    expect(readingSetSchema.safeParse({ takenAt: 'yesterday' }).success).toBe(false);
    expect(shotSchema.safeParse({ currentKA: 6, durationS: 0 }).success).toBe(false);
  });
});

describe('criteria', () => {
  it('validates criteria set 1 with criteriaSchema and survives a JSON round trip', () => {
    expect(criteriaSchema.safeParse(criteriaV1).success).toBe(true);
    expect(JSON.parse(JSON.stringify(criteriaV1))).toEqual(criteriaV1);
    expect(criteriaV1.version).toBe(1);
  });

  it('rejects a criteria set with a missing threshold', () => {
    const broken = JSON.parse(JSON.stringify(criteriaV1));
    delete broken.capacitance.shiftBands;
    expect(criteriaSchema.safeParse(broken).success).toBe(false);
  });
});

describe('proposed follow-up due dates', () => {
  it('counts the samples of a unit that stayed in service from the event, the others from the decision', async () => {
    const { proposedFollowUpDueAt } = await import('../../shared/schemas/screening.js');
    const { FOLLOW_UPS } = await import('../../shared/screening/verdict.js');
    const event = new Date('2026-11-28T03:00:00Z');
    const decided = new Date('2026-11-29T10:00:00Z');
    expect(proposedFollowUpDueAt(FOLLOW_UPS.gas24hEvent, decided, event)).toBe('2026-11-29T03:00:00.000Z'); // 24 h after the event
    expect(proposedFollowUpDueAt(FOLLOW_UPS.gasNow, decided, event)).toBe('2026-11-29T10:00:00.000Z');
    expect(proposedFollowUpDueAt(FOLLOW_UPS.gas24h, decided, event)).toBe('2026-11-30T10:00:00.000Z'); // after re-energising
    expect(proposedFollowUpDueAt(FOLLOW_UPS.sweepNextOutage, decided, event)).toBeNull();
  });
});
