// The audit trail in words. The entries below have the shapes the server's services write (server/**/*.ts `audit(`
// calls, read by the test itself so a new kind of entry without a sentence fails here); each must read as a sentence
// with the person, the action and the outcome, without a code name.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { auditEntriesCount, auditSentence, changesInWords, fieldValueWords, type AuditEntryFacts, type AuditWordsContext } from '../../shared/audit-words.js';
import {
  ATTACHMENT_KIND_LABELS,
  CONDUCTOR_LABELS,
  FAULT_TYPE_LABELS,
  FIELD_LABELS,
  FINDING_LABELS,
  KIND_LABELS,
  OUTCOME_LABELS,
  PROTECTION_LABELS,
  RECOMMENDATION_LABELS,
  STATUS_LABELS,
  SWEEP_TEST_LABELS,
  WINDINGS_LABELS,
  fieldLabel,
  inSentence,
} from '../../shared/vocabulary.js';
import {
  designViewSchema,
  eventViewSchema,
  personViewSchema,
  readingSetConditionsSchema,
  siteViewSchema,
  unitViewSchema,
} from '../../shared/schemas/responses/index.js';
import { SESSION_READING_SECTIONS, eventPatchSchema } from '../../shared/schemas/fleet.js';

const PEOPLE: Record<number, string> = { 1: 'Sam Admin', 2: 'Pat Protection', 3: 'Theo Tester', 4: 'Morgan Manager', 5: 'Erin Engineer' };
const ctx: AuditWordsContext = {
  timeZone: 'Europe/London',
  person: (id) => PEOPLE[id],
  readingSet: (id) => (id === '41' ? 'the tests of 29 Nov 2026 12:12 by Theo Tester' : null),
  followUp: (id) => (id === '7' ? 'Repeat the dissolved-gas analysis' : null),
  site: (id) => (id === 1 ? 'Harrow Cross' : null),
  design: (id) => (id === 2 ? 'KV-60-A' : null),
};

const at = '2026-11-29T12:12:00.000Z';
const fault = {
  unitId: 3,
  occurredAt: '2026-11-28T03:12:00.000Z',
  type: 'phase-to-ground',
  side: 'hv',
  location: 'Bay 4',
  currentIs: 'line',
  faultedPhases: 'A',
  shots: [{ currentKA: 12.5, durationS: 0.08 }, { currentKA: 11, durationS: 0.1 }],
  transformerTripped: true,
  protectionOperated: ['differential', 'buchholz-trip'],
  notes: 'Flashover on the HV bushing',
  status: 'logged',
};
const unitView = { id: 3, serial: 'KVP-HX-T2', position: 'T2', siteId: 1, designId: 2, year: 1998, phases: 3, hvKV: 132, lvKV: 33, ratedKVA: 60000, impedancePercent: 10, systemImpedancePercent: null, conductor: 'Cu', lastEventId: null, lastEventAt: null, lastEventStatus: null, lastRecommendation: null };
const designView = { id: 2, reference: 'KV-60-A', maker: 'Kestrel', windings: 'two-winding', vectorGroup: 'YNd11', phases: 3, hvKV: 132, lvKV: 33, tvKV: null, coolingStages: [], impedancePercent: 10, impedanceBaseKVA: 60000, conductor: 'Cu', requiredCapacitance: ['CH', 'CL', 'CHL'], notes: null };
const person = { id: 6, email: 'new@kestrel-valley.example', name: 'Nia New', roles: ['tester'], siteIds: [1], allSites: false, active: true, demo: false, mustChangePassword: true, lastSignInAt: null, lockedUntil: null };

/** Entries as the services write them (action, entity, before, after, note), with the sentence each must give. */
const ENTRIES: { entry: AuditEntryFacts; says: RegExp | string }[] = [
  {
    entry: { userId: 2, action: 'create', entity: 'fault_event', entityId: '4', after: fault },
    says: 'Pat Protection logged the fault of 28 Nov 2026 03:12: phase-to-ground, 2 shots; differential, Buchholz trip operated.',
  },
  {
    entry: { userId: 2, action: 'update', entity: 'fault_event', entityId: '4', before: { faultedPhases: 'A', protectionOperated: ['differential'] }, after: { faultedPhases: 'AB', protectionOperated: ['differential', 'buchholz-trip'] }, note: 'Fault corrected' },
    says: 'Pat Protection corrected the fault: faulted phases A → AB; protections operated differential → differential, Buchholz trip.',
  },
  {
    entry: { userId: 3, action: 'update', entity: 'fault_event', entityId: '4', before: { status: 'testing' }, after: { status: 'screened' }, note: 'A screening' },
    says: 'Theo Tester moved the event from testing to screened (a screening).',
  },
  {
    entry: { userId: 4, action: 'decide', entity: 'fault_event', entityId: '4', highlighted: true, note: 'against the go recommendation', after: { id: 9, screeningId: 5, managerId: 4, outcome: 'hold', restrictions: null, reason: 'Gas rising on the last two samples', againstRecommendation: true, signedAt: at, recommendation: 'go' } },
    says: 'Morgan Manager signed: hold — reason: “Gas rising on the last two samples” — against the go recommendation.',
  },
  {
    entry: { userId: 4, action: 'decide', entity: 'fault_event', entityId: '4', highlighted: false, after: { id: 9, screeningId: 5, managerId: 4, outcome: 'release-with-restrictions', restrictions: 'Load below 80 %', reason: 'As proposed', againstRecommendation: false, signedAt: at, recommendation: 'conditional' } },
    says: 'Morgan Manager signed: release with restrictions, restrictions: “Load below 80 %” — reason: “As proposed” — following the conditional recommendation.',
  },
  {
    entry: { userId: 1, action: 'update', entity: 'fault_event', entityId: '4', before: { restrictions: 'Load below 80 %', restrictionsLiftedAt: null }, after: { restrictionsLiftedAt: at, reason: 'Repeat tests clean' }, note: 'Restrictions lifted' },
    says: 'Sam Admin lifted the restrictions “Load below 80 %” — reason: “Repeat tests clean”.',
  },
  {
    entry: { userId: 4, action: 'update', entity: 'fault_event', entityId: '4', before: { energisedAt: null }, after: { energisedAt: at }, note: 'Re-energised' },
    says: 'Morgan Manager recorded the unit re-energised at 29 Nov 2026 12:12.',
  },
  {
    entry: { userId: 3, action: 'create', entity: 'reading_set', entityId: '41', after: { unitId: 3, kind: 'post-fault', eventId: 4, takenAt: at, readings: 14 } },
    says: 'Theo Tester entered post-fault tests of 29 Nov 2026 12:12 (14 readings).',
  },
  {
    entry: { userId: 3, action: 'create', entity: 'reading_set', entityId: '42', after: { unitId: 3, kind: 'routine', eventId: null, takenAt: '2026-11-20T09:00:00.000Z', readings: 7 }, note: 'pre-fault dissolved-gas sample for event 4' },
    says: 'Theo Tester entered the pre-fault dissolved-gas sample of 20 Nov 2026 09:00 (7 readings).',
  },
  {
    entry: { userId: 3, action: 'import', entity: 'reading_set', entityId: '41', after: { file: 'post-fault.csv', sha256: 'ab12', rows: 24 } },
    says: 'Theo Tester imported 24 rows of readings from “post-fault.csv” into the tests of 29 Nov 2026 12:12 by Theo Tester.',
  },
  {
    entry: { userId: 3, action: 'update', entity: 'reading_set', entityId: '41', before: { topOilC: 41, dissolvedGasPPM: { H2: 12, C2H2: 0 } }, after: { topOilC: 43, dissolvedGasPPM: { H2: 15, C2H2: 1 } }, note: 'Session corrected' },
    says: 'Theo Tester corrected the tests of 29 Nov 2026 12:12 by Theo Tester: top oil (°C) 41 → 43; dissolved gases (ppm) H2 12, C2H2 0 → H2 15, C2H2 1.',
  },
  {
    entry: { userId: 3, action: 'update', entity: 'reading_set', entityId: '50', before: { isReference: false }, after: { isReference: true }, note: 'Marked as the reference' },
    says: 'Theo Tester marked a reading set as the reference.',
  },
  {
    entry: { userId: 3, action: 'update', entity: 'reading_set', entityId: '49', before: { isReference: true }, after: { isReference: false }, note: 'Reference moved to reading set 50' },
    says: 'Theo Tester took the reference mark off a reading set (another set of the same kind became the reference).',
  },
  {
    entry: { userId: 3, action: 'screen', entity: 'screening', entityId: '5', after: { eventId: 4, recommendation: 'conditional', criteriaVersion: 2, comparison: false, missing: [], unreliable: [] } },
    says: 'Theo Tester ran the screening: conditional (criteria set 2).',
  },
  {
    entry: { userId: 3, action: 'screen', entity: 'screening', entityId: '6', after: { eventId: 4, recommendation: 'no-go', criteriaVersion: 1, comparison: true, missing: ['sweep'], unreliable: [] } },
    says: 'Theo Tester ran a comparison screening, not for decision: no-go (criteria set 1); 1 required test missing.',
  },
  {
    entry: { userId: 4, action: 'create', entity: 'follow_up', entityId: '7', after: { eventId: 4, task: 'Repeat the dissolved-gas analysis', dueAt: '2026-12-06T12:12:00.000Z' } },
    says: 'Morgan Manager set the follow-up “Repeat the dissolved-gas analysis”, due 6 Dec 2026 12:12.',
  },
  {
    entry: { userId: 5, action: 'update', entity: 'follow_up', entityId: '7', before: { closedAt: null, result: null }, after: { closedAt: at, result: 'Gases stable' } },
    says: 'Erin Engineer closed the follow-up “Repeat the dissolved-gas analysis”: “Gases stable”.',
  },
  {
    entry: { userId: 4, action: 'update', entity: 'follow_up', entityId: '7', before: { dueAt: '2026-12-06T12:12:00.000Z' }, after: { dueAt: '2026-12-08T12:12:00.000Z' }, note: 'Counted from re-energising' },
    says: 'The follow-up “Repeat the dissolved-gas analysis” is now due 8 Dec 2026 12:12 (was 6 Dec 2026 12:12), counted from re-energising recorded by Morgan Manager.',
  },
  {
    entry: { userId: 5, action: 'create', entity: 'finding', entityId: '8', after: { eventId: 4, classification: 'deformation-confirmed', text: 'Radial buckling on HV phase A' } },
    says: 'Erin Engineer recorded a finding: deformation confirmed — “Radial buckling on HV phase A”.',
  },
  {
    entry: { userId: 2, action: 'create', entity: 'attachment', entityId: '11', after: { eventId: 4, name: 'relay.cfg', kind: 'comtrade-cfg', contentType: 'text/plain', size: 900, sha256: 'cd34' } },
    says: 'Pat Protection attached “relay.cfg” (COMTRADE configuration (.cfg)).',
  },
  {
    entry: { userId: 5, action: 'create', entity: 'attachment', entityId: '12', after: { findingId: 8, eventId: 4, name: 'photo.jpg', kind: 'jpeg', contentType: 'image/jpeg', size: 90000, sha256: 'ef56' } },
    says: 'Erin Engineer attached “photo.jpg” to a finding (JPEG photo).',
  },
  {
    entry: { userId: 3, action: 'create', entity: 'sweep_trace', entityId: '13', after: { readingSetId: 41, label: 'HV-A-open', testType: 'open-circuit', winding: 'hv', phase: 'A', tapPosition: '9', baselineTapPosition: null, demagnetised: true, pointCount: 1000, sha256: 'aa', fileName: 'hv-a.csv' } },
    says: 'Theo Tester uploaded the sweep trace “HV-A-open” (HV, phase A, open circuit, 1000 points).',
  },
  {
    entry: { userId: 3, action: 'delete', entity: 'sweep_trace', entityId: '13', before: { id: 13, label: 'HV-A-open', testType: 'short-circuit', winding: 'lv', phase: null, pointCount: 800 }, note: 'Sweep trace removed' },
    says: 'Theo Tester removed the sweep trace “HV-A-open” (LV, short circuit, 800 points).',
  },
  {
    entry: { userId: 4, action: 'create', entity: 'notification', entityId: '20', after: { kind: 'decision', eventId: 4, screeningId: 5, to: 'control@kestrel-valley.example', resentFrom: 19 }, note: 'resent from mail 19' },
    says: 'Morgan Manager resent the decision mail to control@kestrel-valley.example.',
  },
  { entry: { userId: 1, action: 'create', entity: 'user', entityId: '6', after: person }, says: 'Sam Admin added Nia New (Test engineer).' },
  {
    entry: { userId: 1, action: 'update', entity: 'user', entityId: '6', before: person, after: { ...person, roles: ['tester', 'manager'], active: false } },
    says: 'Sam Admin changed Nia New: roles Test engineer → Test engineer, Operations manager; active yes → no.',
  },
  { entry: { userId: 1, action: 'update', entity: 'user', entityId: '6', before: person, after: person, note: 'password reset: one-time password issued' }, says: 'Sam Admin issued a one-time password to Nia New.' },
  { entry: { userId: 1, action: 'update', entity: 'user', entityId: '6', before: person, after: { ...person, failedSignIns: 0 }, note: 'sign-in unlocked' }, says: 'Sam Admin unlocked the sign-in of Nia New.' },
  { entry: { userId: 3, action: 'update', entity: 'user', entityId: '3', before: person, after: person, note: 'password changed by its owner' }, says: 'Theo Tester changed their own password.' },
  { entry: { userId: null, action: 'sign-in-lock', entity: 'user', entityId: '6', after: { name: 'Nia New' } }, says: 'Sign-in of Nia New locked after too many failed attempts.' },
  { entry: { userId: 1, action: 'create', entity: 'unit', entityId: '3', after: unitView }, says: 'Sam Admin added the unit KVP-HX-T2.' },
  {
    entry: { userId: 1, action: 'update', entity: 'unit', entityId: '3', before: unitView, after: { ...unitView, impedancePercent: 10.5, conductor: 'Al', designId: 2, siteId: 1, position: 'T3' } },
    says: 'Sam Admin changed the unit KVP-HX-T2: position “T3”… ',
  },
  { entry: { userId: 1, action: 'create', entity: 'design', entityId: '2', after: designView }, says: 'Sam Admin added the design family KV-60-A.' },
  {
    entry: { userId: 1, action: 'update', entity: 'design', entityId: '2', before: designView, after: { ...designView, windings: 'auto', requiredCapacitance: ['CH', 'CHL'] } },
    says: 'Sam Admin changed the design family KV-60-A: windings two-winding → autotransformer; required capacitance measurements CH, CL, CHL → CH, CHL.',
  },
  { entry: { userId: 1, action: 'create', entity: 'site', entityId: '1', after: { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London', controlRoomEmail: null } }, says: 'Sam Admin added the site Harrow Cross.' },
  {
    entry: { userId: 1, action: 'update', entity: 'site', entityId: '1', before: { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London', controlRoomEmail: null }, after: { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London', controlRoomEmail: 'control@kestrel-valley.example' } },
    says: 'Sam Admin changed the site Harrow Cross: control room e-mail none → control@kestrel-valley.example.',
  },  {
    entry: { userId: 5, action: 'create', entity: 'criteria_set', entityId: '3', after: { version: 3, fromVersion: 2, name: 'Wider capacitance bands', notes: null } },
    says: 'Erin Engineer drafted criteria set 3 from version 2 (“Wider capacitance bands”).',
  },
  {
    entry: {
      userId: 5,
      action: 'update',
      entity: 'criteria_set',
      entityId: '3',
      before: { version: 3, notes: null },
      after: { version: 3, notes: null, changes: [{ path: 'capacitance.shiftBands[1].from', label: 'Winding capacitance › shift bands › band 2 › starts at', from: 3, to: 4 }] },
    },
    says: 'Erin Engineer changed the draft criteria set 3: winding capacitance › shift bands › band 2 › starts at 3 → 4.',
  },
  {
    entry: { userId: 1, action: 'publish', entity: 'criteria_set', entityId: '3', before: { version: 3, status: 'draft' }, after: { version: 3, status: 'published' } },
    says: 'Sam Admin published criteria set 3: it can no longer change and screenings now use it.',
  },
];
// The unit's sentence is checked by parts (below); its exact text is long.
ENTRIES.find((e) => e.entry.entity === 'unit' && e.entry.action === 'update')!.says =
  /^Sam Admin changed the unit KVP-HX-T2: position T2 → T3; impedance \(%\) 10 → 10\.5; conductor copper \(Cu\) → aluminium \(Al\)\.$/;

/** Codes whose words differ from the code (protections, outcomes, kinds …): none may appear outside quoted text. */
const CODES = [
  ...[PROTECTION_LABELS, FAULT_TYPE_LABELS, KIND_LABELS, CONDUCTOR_LABELS, WINDINGS_LABELS, SWEEP_TEST_LABELS, ATTACHMENT_KIND_LABELS].flatMap((m) =>
    Object.entries(m).filter(([code, label]) => inSentence(label) !== code && !label.includes(code)).map(([code]) => code),
  ),
  ...[OUTCOME_LABELS, STATUS_LABELS, RECOMMENDATION_LABELS, FINDING_LABELS].flatMap((m) =>
    Object.entries(m as Record<string, { word: string }>).filter(([code, l]) => inSentence(l.word) !== code).map(([code]) => code),
  ),
  'fault_event',
  'reading_set',
  'follow_up',
  'sweep_trace',
];

function unquoted(s: string): string {
  return s.replace(/“[^”]*”/g, '“”');
}

function expectNoCode(sentence: string): void {
  const plain = unquoted(sentence).replace(/[\w.+-]+@[\w.-]+/g, 'e-mail');
  expect(plain, sentence).not.toMatch(/\b[a-z]+[A-Z][A-Za-z]*\b/); // camelCase field names
  expect(plain, sentence).not.toMatch(/\b[a-z]+_[a-z_]+\b/); // snake_case record names
  for (const code of CODES) expect(plain, `${code} in: ${sentence}`).not.toMatch(new RegExp(`(^|[^\\w-])${code.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}($|[^\\w-])`));
}

/** The (action, record) pairs the server writes, read from its sources: `audit(m, clock, { … })` calls and audited kinds. */
function serverAuditPairs(): Set<string> {
  const walk = (dir: string): string[] =>
    readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []));
  const pairs = new Set<string>();
  for (const file of walk(join(__dirname, '../../server'))) {
    const src = readFileSync(file, 'utf8');
    for (let i = src.indexOf('audit(m, clock, {'); i >= 0; i = src.indexOf('audit(m, clock, {', i + 1)) {
      const call = src.slice(i, src.indexOf('});', i));
      const action = /action: '([^']+)'/.exec(call)?.[1];
      const entity = /entity: '([^']+)'/.exec(call)?.[1];
      if (action && entity) pairs.add(`${action} ${entity}`);
      else if (action && /entity: kind\.entity/.test(call)) pairs.add(`${action} <audited kind>`);
      else throw new Error(`an audit call in ${file} names its action or record in a way this test does not read: ${call}`);
    }
    for (const m of src.matchAll(/AuditedKind<[^>]+> = \{ target: \w+, entity: '([^']+)'/g)) {
      pairs.add(`create ${m[1]}`);
      pairs.add(`update ${m[1]}`);
    }
  }
  pairs.delete('create <audited kind>');
  pairs.delete('update <audited kind>');
  return pairs;
}

describe('audit entries in words', () => {
  it.each(ENTRIES.map((e) => [`${e.entry.action} ${e.entry.entity}${e.entry.note ? ` (${e.entry.note})` : ''}`, e] as const))('%s', (_name, { entry, says }) => {
    const sentence = auditSentence(entry, ctx);
    if (typeof says === 'string') expect(sentence).toBe(says);
    else expect(sentence).toMatch(says);
    expectNoCode(sentence);
  });

  it('has a sentence for every kind of entry the server writes', () => {
    const written = serverAuditPairs();
    expect(written.size).toBeGreaterThan(15);
    const covered = new Set(ENTRIES.map((e) => `${e.entry.action} ${e.entry.entity}`));
    expect([...written].filter((p) => !covered.has(p))).toEqual([]);
  });

  it('names the person who did it, the system when no one did, and a person it cannot name without a code', () => {
    const base: AuditEntryFacts = { userId: null, action: 'update', entity: 'fault_event', entityId: '4', before: { status: 'screened' }, after: { status: 'testing' }, note: 'A correction of the fault: the screening used the earlier values' };
    expect(auditSentence(base, ctx)).toBe('Gapsight moved the event from screened to testing (a correction of the fault: the screening used the earlier values).');
    expect(auditSentence({ ...base, userId: 99 }, ctx)).toMatch(/^A person no longer listed \(no\. 99\) moved the event/);
  });

  it('puts an unknown action or record in words too', () => {
    const s = auditSentence({ userId: 1, action: 'archive', entity: 'relay_bundle', entityId: '3', before: { storageClass: 'hot' }, after: { storageClass: 'cold' } }, ctx);
    expect(s).toBe('Sam Admin archive a relay bundle: storage class hot → cold.');
    expectNoCode(s);
  });

  it('counts entries as words', () => {
    expect(auditEntriesCount(1)).toBe('1 entry');
    expect(auditEntriesCount(4)).toBe('4 entries');
    expect(auditEntriesCount(0)).toBe('no entries');
  });

  it('writes values in words: protections, shots, times on the site clock, yes and no', () => {
    expect(fieldValueWords('fault_event', 'protectionOperated', ['buchholz-trip', 'pressure-relief'], ctx)).toBe('Buchholz trip, pressure relief');
    expect(fieldValueWords('fault_event', 'shots', fault.shots, ctx)).toBe('12.5 kA for 0.08 s; 11 kA for 0.1 s');
    // 2026-07-01 11:00 UTC is 12:00 on the London clock (summer time, +01:00).
    expect(fieldValueWords('fault_event', 'occurredAt', '2026-07-01T11:00:00.000Z', ctx)).toBe('1 Jul 2026 12:00');
    expect(fieldValueWords('fault_event', 'transformerTripped', false, ctx)).toBe('no');
    expect(fieldValueWords('fault_event', 'type', 'phase-to-phase-to-ground', ctx)).toBe('phase-to-phase-to-ground');
    expect(fieldValueWords('user', 'siteIds', [1, 5], ctx)).toBe('Harrow Cross, site no. 5');
    // A closing quote that ends its own sentence gets no second full stop.
    expect(auditSentence({ userId: 5, action: 'update', entity: 'follow_up', entityId: '7', before: { closedAt: null, result: null }, after: { closedAt: at, result: 'Normal.' } }, ctx)).toBe(
      'Erin Engineer closed the follow-up “Repeat the dissolved-gas analysis”: “Normal.”',
    );
    expect(changesInWords('reading_set', { bushings: { H1: { c1PF: 400 } } }, { bushings: { H1: { c1PF: 410 } } }, ctx)).toBe('bushings changed');
  });
});

describe('field labels', () => {
  // Every field a correction or an audited change can touch, read from the response schemas and the patch schemas.
  const sources: [string, string[]][] = [
    ['fault_event', [...Object.keys(eventViewSchema.shape), ...Object.keys(eventPatchSchema.shape)]],
    ['reading_set', [...Object.keys(readingSetConditionsSchema.shape), ...SESSION_READING_SECTIONS, 'threePhaseEquivalent', 'hoursDeEnergised']],
    ['unit', Object.keys(unitViewSchema.shape)],
    ['design', Object.keys(designViewSchema.shape)],
    ['site', Object.keys(siteViewSchema.shape)],
    ['user', [...Object.keys(personViewSchema.shape), 'failedSignIns']],
  ];
  it.each(sources)('names every %s field in words', (entity, keys) => {
    const missing = keys.filter((k) => !FIELD_LABELS[entity]?.[k]);
    expect(missing).toEqual([]);
  });

  it('reads the issue’s examples', () => {
    expect(fieldLabel('reading_set', 'dissolvedGasPPM')).toBe('Dissolved gases (ppm)');
    expect(fieldLabel('fault_event', 'protectionOperated')).toBe('Protections operated');
    expect(fieldLabel('unit', 'systemImpedancePercent')).toBe('System impedance (%)');
    // A field no label names yet is still spelt out, never printed as code.
    expect(fieldLabel('unit', 'coolingClassCode')).toBe('Cooling class code');
  });
});
