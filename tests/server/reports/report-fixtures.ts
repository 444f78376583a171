// Test data for the e-mail and PDF report: ScreeningReportData built from the demo case/result pair on disk.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { GapsightCase } from '../../../shared/schemas/case.js';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import type { ScreeningReportData } from '../../../server/reports/report-data.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const readJson = <T>(rel: string): T => JSON.parse(readFileSync(path.join(root, rel), 'utf8')) as T;

/** The demo's recent through-fault on KVP-HX-T2 at Harrow Cross (conditional), as the server would assemble it. */
export function recentEventReport(): ScreeningReportData {
  const c = readJson<GapsightCase>('examples/demo/recent-event.case.json');
  const result = readJson<GapsightResult>('examples/demo/recent-event.result.json');
  return {
    screening: {
      id: 4711,
      computedAt: '2026-11-29T14:05:00.000Z',
      criteriaVersion: 1,
      comparison: false,
      computedBy: { name: 'Priya Natarajan', email: 'priya.natarajan@kestrel-valley.example' },
    },
    event: {
      id: 318,
      occurredAt: c.fault!.occurredAt,
      type: c.fault!.type,
      side: c.fault!.side,
      faultedPhases: 'ABC',
      transformerTripped: true,
      protectionOperated: ['overcurrent'],
      notes: null,
      status: 'screened',
      priorHighDutyCount: 1,
      priorHighDutySince: '2024-12-12T18:40:00.000Z',
    },
    unit: {
      id: 12,
      serial: c.unit.serial,
      position: 'T2',
      ratedKVA: c.unit.ratedKVA,
      hvKV: c.unit.hvKV,
      lvKV: c.unit.lvKV,
      impedancePercent: c.unit.impedancePercent,
      designReference: 'KV-40M-132/33',
    },
    site: { name: 'Harrow Cross', timeZone: 'Europe/London' },
    testers: [
      { name: 'Priya Natarajan', email: 'priya.natarajan@kestrel-valley.example' },
      { name: 'Tom Okafor', email: 'tom.okafor@kestrel-valley.example' },
    ],
    case: c,
    result,
    eventUrl: 'http://localhost:5173/events/318',
  };
}

/** A no-go after a differential and Buchholz trip (examples/cases/no-go-internal), at Quarry Lane. */
export function internalFaultReport(): ScreeningReportData {
  const base = recentEventReport();
  const c = readJson<GapsightCase>('examples/cases/no-go-internal.json');
  const result = readJson<GapsightResult>('examples/cases/no-go-internal.result.json');
  return {
    ...base,
    screening: { ...base.screening, id: 4712 },
    event: {
      ...base.event,
      id: 401,
      occurredAt: c.fault!.occurredAt,
      type: c.fault!.type,
      side: c.fault!.side,
      protectionOperated: c.fault!.protectionOperated ?? [],
      priorHighDutyCount: 0,
      priorHighDutySince: null,
    },
    unit: { ...base.unit, id: 15, serial: c.unit.serial, position: 'T1' },
    site: { name: 'Quarry Lane', timeZone: 'Europe/London' },
    case: c,
    result,
    eventUrl: 'http://localhost:5173/events/401',
  };
}

/** Any examples/cases/<name>.json with its stored result, dressed as a stored screening at Millbrook. */
export function exampleCaseReport(name: string): ScreeningReportData {
  const base = recentEventReport();
  const c = readJson<GapsightCase>(`examples/cases/${name}.json`);
  const result = readJson<GapsightResult>(`examples/cases/${name}.result.json`);
  return {
    ...base,
    event: {
      ...base.event,
      occurredAt: c.fault?.occurredAt ?? base.event.occurredAt,
      type: c.fault?.type ?? base.event.type,
      side: c.fault?.side ?? base.event.side,
      transformerTripped: c.fault?.transformerTripped ?? true,
      protectionOperated: c.fault?.protectionOperated ?? [],
      priorHighDutyCount: 0,
      priorHighDutySince: null,
    },
    unit: { ...base.unit, serial: c.unit.serial },
    site: { name: 'Millbrook', timeZone: 'Europe/London' },
    case: c,
    result,
  };
}
