// The invented fleet of "Kestrel Valley Power": sites, two design families, thirteen units and their factory and
// routine fingerprints. Pure data and arithmetic (no database): the seed writes it, the tests and examples read it.
// All names, serials and numbers are invented; the values are plausible for the trade, not taken from any real unit.
import type { ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import type { SessionConditions } from '../../features/readings/readings.service.js';
import { DemoRandom, roundTo } from './demo-random.js';

export type ReadingBody = CaseReadingSet & SessionConditions;
export type FamilyKey = 'large' | 'small';
export type Phase = 'A' | 'B' | 'C';
export const PHASES: readonly Phase[] = ['A', 'B', 'C'];

export interface DemoSite {
  name: string;
  timeZone: string;
  /** Source impedance in % on each unit's own base (used for IEEE categories III and IV). */
  systemImpedancePercent: number;
  code: string;
}

export const DEMO_SITES: readonly DemoSite[] = [
  { name: 'Harrow Cross', timeZone: 'Europe/London', systemImpedancePercent: 0, code: 'HX' },
  { name: 'Millbrook', timeZone: 'Europe/London', systemImpedancePercent: 0.4, code: 'MB' },
  { name: 'Quarry Lane', timeZone: 'Europe/Dublin', systemImpedancePercent: 0.8, code: 'QL' },
];

interface FamilyNominal {
  capacitancePF: Record<'CH' | 'CL' | 'CHL', number>;
  dissipationPercent: Record<'CH' | 'CL' | 'CHL', number>;
  reactancePercent: Record<Phase, number>;
  excitationMA: Record<Phase, number>;
  excitationKV: number;
  /** HV winding resistance per phase at 20 °C, Ω (YN: phase to neutral; D: across the phase winding). */
  resistance20Ohm: number;
  /** Per-phase winding (turns) ratio as a three-phase ratio set measures it: from the vector group (case format). */
  turnsRatio: number;
}

export interface DemoDesign {
  key: FamilyKey;
  reference: string;
  maker: string;
  windings: 'two-winding';
  vectorGroup: string;
  phases: 3;
  hvKV: number;
  lvKV: number;
  coolingStages: { stage: string; kVA: number }[];
  impedancePercent: number;
  impedanceBaseKVA: number;
  conductor: 'Cu';
  requiredCapacitance: string[];
  notes: string;
  /** Tap position at which every test of the family is made (nominal tap). */
  tap: string;
  nominal: FamilyNominal;
}

export const DEMO_DESIGNS: Record<FamilyKey, DemoDesign> = {
  large: {
    key: 'large',
    reference: 'NTW-40-132/33-YNd1',
    maker: 'Northgate Transformer Works (invented)',
    windings: 'two-winding',
    vectorGroup: 'YNd1',
    phases: 3,
    hvKV: 132,
    lvKV: 33,
    coolingStages: [
      { stage: 'ONAN', kVA: 40000 },
      { stage: 'ONAF', kVA: 60000 },
    ],
    impedancePercent: 10.5,
    impedanceBaseKVA: 40000,
    conductor: 'Cu',
    requiredCapacitance: ['CH', 'CL', 'CHL'],
    notes: 'Grid supply transformers, 132/33 kV, on-load tap changer 1–17 (nominal 9b), LV winding inner (disc), HV outer (interleaved disc). Eight sister units, 1998–2019.',
    tap: '9b',
    nominal: {
      capacitancePF: { CH: 3110, CL: 9860, CHL: 5195 },
      dissipationPercent: { CH: 0.25, CL: 0.28, CHL: 0.23 },
      reactancePercent: { A: 10.57, B: 10.48, C: 10.6 },
      excitationMA: { A: 28, B: 19.2, C: 27.6 },
      excitationKV: 10,
      resistance20Ohm: 0.889,
      turnsRatio: 2.3094, // YNd1: hvKV / (√3 · lvKV) = 132 / (√3 · 33)
    },
  },
  small: {
    key: 'small',
    reference: 'BME-12-66/11-Dyn11',
    maker: 'Bellmoor Electric (invented)',
    windings: 'two-winding',
    vectorGroup: 'Dyn11',
    phases: 3,
    hvKV: 66,
    lvKV: 11,
    coolingStages: [
      { stage: 'ONAN', kVA: 12000 },
      { stage: 'ONAF', kVA: 15000 },
    ],
    impedancePercent: 8,
    impedanceBaseKVA: 12000,
    conductor: 'Cu',
    requiredCapacitance: ['CH', 'CL', 'CHL'],
    notes: 'Primary transformers, 66/11 kV, off-circuit tap changer 1–5 (nominal 3). Five sister units, 2003–2017.',
    tap: '3',
    nominal: {
      capacitancePF: { CH: 2240, CL: 6120, CHL: 3580 },
      dissipationPercent: { CH: 0.27, CL: 0.3, CHL: 0.25 },
      reactancePercent: { A: 8.06, B: 7.98, C: 8.09 },
      excitationMA: { A: 41.5, B: 30.2, C: 40.8 },
      excitationKV: 10,
      resistance20Ohm: 2.214,
      turnsRatio: 10.3923, // Dyn11: √3 · hvKV / lvKV = √3 · 66 / 11
    },
  },
};

export type DemoRole = 'recent-event' | 'history-event' | 'chl-outlier';

export interface DemoUnit {
  serial: string;
  position: string;
  site: string;
  family: FamilyKey;
  year: number;
  /** Factory acceptance test date (UTC, ISO). */
  factoryTest: string;
  /** Routine test sessions, in months before "now" (oldest first). */
  routineMonthsAgo: number[];
  role?: DemoRole;
  notes?: string;
}

/** Serials of the units the demo story is about. */
export const RECENT_EVENT_SERIAL = 'KVP-HX-T2';
export const HISTORY_EVENT_SERIAL = 'KVP-MB-T1';
export const CHL_OUTLIER_SERIAL = 'KVP-QL-T1';
/** How far the outlier's CHL sits above its family's nominal value (a maker's barrier variant). */
export const CHL_OUTLIER_FACTOR = 1.05;

export const DEMO_UNITS: readonly DemoUnit[] = [
  { serial: 'KVP-HX-T1', position: 'T1', site: 'Harrow Cross', family: 'large', year: 2004, factoryTest: '2004-05-12', routineMonthsAgo: [70, 16] },
  {
    serial: 'KVP-HX-T2',
    position: 'T2',
    site: 'Harrow Cross',
    family: 'large',
    year: 2009,
    factoryTest: '2009-03-18',
    routineMonthsAgo: [30, 8],
    role: 'recent-event',
    notes: 'Recent LV through-fault (demo: post-fault tests entered, screening to run).',
  },
  { serial: 'KVP-HX-T3', position: 'T3', site: 'Harrow Cross', family: 'large', year: 2014, factoryTest: '2014-09-02', routineMonthsAgo: [44, 11] },
  {
    serial: 'KVP-MB-T1',
    position: 'T1',
    site: 'Millbrook',
    family: 'large',
    year: 1998,
    factoryTest: '1998-10-06',
    routineMonthsAgo: [72, 20],
    role: 'history-event',
    notes: 'Held after a high-duty fault, LV phase B winding replaced, released with restrictions.',
  },
  { serial: 'KVP-MB-T2', position: 'T2', site: 'Millbrook', family: 'large', year: 2001, factoryTest: '2001-02-21', routineMonthsAgo: [66, 18] },
  {
    serial: 'KVP-QL-T1',
    position: 'T1',
    site: 'Quarry Lane',
    family: 'large',
    year: 2006,
    factoryTest: '2006-07-04',
    routineMonthsAgo: [58, 13],
    role: 'chl-outlier',
    notes: 'CHL about 5 % above the family median since the factory test (maker\'s barrier variant): a sister-unit outlier.',
  },
  { serial: 'KVP-QL-T2', position: 'T2', site: 'Quarry Lane', family: 'large', year: 2011, factoryTest: '2011-11-15', routineMonthsAgo: [40, 9] },
  { serial: 'KVP-QL-T3', position: 'T3', site: 'Quarry Lane', family: 'large', year: 2019, factoryTest: '2019-06-25', routineMonthsAgo: [21] },
  { serial: 'KVP-HX-T4', position: 'T4', site: 'Harrow Cross', family: 'small', year: 2016, factoryTest: '2016-04-19', routineMonthsAgo: [26] },
  { serial: 'KVP-MB-T3', position: 'T3', site: 'Millbrook', family: 'small', year: 2003, factoryTest: '2003-08-27', routineMonthsAgo: [64, 15] },
  { serial: 'KVP-MB-T4', position: 'T4', site: 'Millbrook', family: 'small', year: 2012, factoryTest: '2012-03-08', routineMonthsAgo: [35, 10] },
  { serial: 'KVP-QL-T4', position: 'T4', site: 'Quarry Lane', family: 'small', year: 2008, factoryTest: '2008-10-30', routineMonthsAgo: [52, 12] },
  { serial: 'KVP-QL-T5', position: 'T5', site: 'Quarry Lane', family: 'small', year: 2017, factoryTest: '2017-05-16', routineMonthsAgo: [19] },
];

export const demoUnit = (serial: string): DemoUnit => {
  const u = DEMO_UNITS.find((x) => x.serial === serial);
  if (!u) throw new Error(`no demo unit ${serial}`);
  return u;
};
export const demoSite = (name: string): DemoSite => DEMO_SITES.find((s) => s.name === name)!;

/** Resistance of a copper winding at `t` °C from its value at 20 °C. */
export const resistanceAt = (r20: number, t: number): number => (r20 * (234.5 + t)) / (234.5 + 20);

/** The unit's own values: the family nominal with this unit's manufacturing spread (seeded by its serial). */
export interface UnitFingerprint {
  capacitancePF: Record<string, number>;
  dissipationPercent: Record<string, number>;
  reactance: Record<Phase, number>;
  excitationMA: Record<Phase, number>;
  excitationKV: number;
  resistance20Ohm: Record<Phase, number>;
  turnsRatio: Record<Phase, number>;
}

export function unitFingerprint(u: DemoUnit): UnitFingerprint {
  const n = DEMO_DESIGNS[u.family].nominal;
  const rnd = new DemoRandom(`fingerprint/${u.serial}`);
  const cap: Record<string, number> = {};
  for (const [cfg, v] of Object.entries(n.capacitancePF)) cap[cfg] = roundTo(v * (1 + rnd.normal(0.004)), 1);
  if (u.role === 'chl-outlier') cap.CHL = roundTo(n.capacitancePF.CHL * CHL_OUTLIER_FACTOR * (1 + rnd.normal(0.001)), 1);
  const df: Record<string, number> = {};
  for (const [cfg, v] of Object.entries(n.dissipationPercent)) df[cfg] = roundTo(v * (1 + rnd.normal(0.05)), 3);
  const xUnit = rnd.normal(0.002);
  const eUnit = rnd.normal(0.04);
  const rUnit = rnd.normal(0.005);
  const ratioUnit = rnd.normal(0.00012);
  const per = <T>(f: (p: Phase) => T) => Object.fromEntries(PHASES.map((p) => [p, f(p)])) as Record<Phase, T>;
  return {
    capacitancePF: cap,
    dissipationPercent: df,
    reactance: per((p) => roundTo(n.reactancePercent[p] * (1 + xUnit + rnd.normal(0.0006)), 3)),
    excitationMA: per((p) => roundTo(n.excitationMA[p] * (1 + eUnit + rnd.normal(0.006)), 1)),
    excitationKV: n.excitationKV,
    resistance20Ohm: per(() => n.resistance20Ohm * (1 + rUnit + rnd.normal(0.0012))),
    turnsRatio: per(() => roundTo(n.turnsRatio * (1 + ratioUnit + rnd.normal(0.00005)), 4)),
  };
}

export type Gas = { H2: number; CH4: number; C2H6: number; C2H4: number; C2H2: number; CO: number; CO2: number };

/** A dissolved-gas sample of a unit in service for `ageYears` (new oil at 0), seeded noise. */
export function agedGas(ageYears: number, seed: string): Gas {
  const rnd = new DemoRandom(`gas/${seed}`);
  const j = () => 1 + rnd.normal(0.08);
  if (ageYears <= 0) return { H2: roundTo(4 * j(), 1), CH4: roundTo(1.2 * j(), 1), C2H6: roundTo(0.6 * j(), 1), C2H4: roundTo(0.3 * j(), 1), C2H2: 0, CO: Math.round(22 * j()), CO2: Math.round(160 * j()) };
  return {
    H2: roundTo((8 + 1.1 * ageYears) * j(), 1),
    CH4: roundTo((2 + 0.65 * ageYears) * j(), 1),
    C2H6: roundTo((1 + 0.45 * ageYears) * j(), 1),
    C2H4: roundTo((0.5 + 0.3 * ageYears) * j(), 1),
    C2H2: 0,
    CO: Math.round((60 + 17 * ageYears) * j()),
    CO2: Math.round((450 + 140 * ageYears) * j()),
  };
}

const isoAt = (date: string, time: string) => `${date}T${time}Z`;

/** Instruments of the invented test crews (names and serials invented). */
export const INSTRUMENTS = {
  works: { instrument: 'Works test bay: C & DF bridge WB-3', instrumentSerial: 'WB3-0412' },
  field: { instrument: 'KVP test van 2: C & DF set TX-40, impedance set ZR-3', instrumentSerial: 'TX40-1187' },
  fra: { instrument: 'KVP test van 2: FRA analyser FR-1', instrumentSerial: 'FR1-0093' },
} as const;

export type BushingReadings = { c1PF: number; c1DissipationPercent: number; c2PF: number; c2DissipationPercent: number; winding: 'hv' };

/**
 * The HV bushings of a 40 MVA unit as the factory tested them (rules revision 2): 145 kV condenser bushings with a test
 * tap, C1 about 410 pF at DF about 0.3 %, C2 about 3.9 nF. The 12 MVA units' bushings carry no test tap (none here).
 */
export function factoryBushings(u: DemoUnit): Record<'H1' | 'H2' | 'H3', BushingReadings> | undefined {
  if (u.family !== 'large') return undefined;
  const rnd = new DemoRandom(`bushings/${u.serial}`);
  const one = (): BushingReadings => ({
    c1PF: roundTo(410 * (1 + rnd.normal(0.01)), 1),
    c1DissipationPercent: roundTo(0.3 * (1 + rnd.normal(0.05)), 3),
    c2PF: roundTo(3900 * (1 + rnd.normal(0.02)), 0),
    c2DissipationPercent: roundTo(0.4 * (1 + rnd.normal(0.06)), 3),
    winding: 'hv',
  });
  return { H1: one(), H2: one(), H3: one() };
}

/** The factory acceptance reading set of a unit (case-format values plus session conditions). */
export function factoryBody(u: DemoUnit): ReadingBody {
  const d = DEMO_DESIGNS[u.family];
  const fp = unitFingerprint(u);
  const rnd = new DemoRandom(`factory/${u.serial}`);
  const top = roundTo(25 + rnd.normal(1.5), 1);
  const resT = roundTo(19 + rnd.normal(1.2), 1);
  return {
    takenAt: isoAt(u.factoryTest, '00:00:00'),
    topOilC: top,
    bottomOilC: roundTo(top - 2.5, 1),
    ambientC: roundTo(top - 4, 1),
    humidityPercent: 45,
    tapPosition: d.tap,
    ...INSTRUMENTS.works,
    testKV: 10,
    testFrequencyHz: 50,
    notes: `Factory acceptance test at ${d.maker.replace(' (invented)', '')}: capacitance and DF${u.family === 'large' ? ' (with the HV bushings\' C1 and C2)' : ''}, per-phase leakage reactance, excitation current, winding resistance, ratio, oil sample.`,
    capacitancePF: { ...fp.capacitancePF },
    dissipationPercent: { ...fp.dissipationPercent },
    reactance: Object.fromEntries(PHASES.map((p) => [p, { percent: fp.reactance[p] }])),
    excitationCurrentMA: { ...fp.excitationMA },
    excitationKV: fp.excitationKV,
    windingResistanceOhm: Object.fromEntries(PHASES.map((p) => [p, roundTo(resistanceAt(fp.resistance20Ohm[p], resT), 4)])),
    resistanceTemperatureC: resT,
    turnsRatio: { ...fp.turnsRatio },
    dissolvedGasPPM: agedGas(0, `${u.serial}/factory`),
    ...(factoryBushings(u) ? { bushings: factoryBushings(u) } : {}),
  };
}

/** Whole years between two instants. */
export const yearsBetween = (from: Date, to: Date): number => (to.getTime() - from.getTime()) / (365.25 * 86400e3);

/** A date `months` before `now` (the 12th of that month), at a fixed time of day (UTC). */
export function monthsBefore(now: Date, months: number, time = '00:00:00'): Date {
  const d = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - months, 12));
  return new Date(`${d.toISOString().slice(0, 10)}T${time}Z`);
}

/**
 * A routine (maintenance) reading set: capacitance and DF with natural drift (< 1 %), DF a little higher with age,
 * a dissolved-gas sample; the newer routine sets also have excitation current at the same test voltage.
 */
export function routineBody(u: DemoUnit, takenAt: Date, index: number): ReadingBody {
  const d = DEMO_DESIGNS[u.family];
  const fp = unitFingerprint(u);
  const rnd = new DemoRandom(`routine/${u.serial}/${index}`);
  const age = yearsBetween(new Date(u.factoryTest), takenAt);
  const top = roundTo(22 + rnd.normal(4), 1);
  const capacitancePF: Record<string, number> = {};
  for (const [cfg, v] of Object.entries(fp.capacitancePF)) {
    const drift = Math.max(-0.006, Math.min(0.006, 0.0004 * index + 0.0006 + rnd.normal(0.0012)));
    capacitancePF[cfg] = roundTo(v * (1 + drift), 1);
  }
  const dissipationPercent: Record<string, number> = {};
  for (const [cfg, v] of Object.entries(fp.dissipationPercent)) dissipationPercent[cfg] = roundTo(v * (1 + 0.012 * age + rnd.between(0, 0.04)), 3);
  const body: ReadingBody = {
    takenAt: takenAt.toISOString(),
    topOilC: top,
    bottomOilC: roundTo(top - 4, 1),
    ambientC: roundTo(top - 8, 1),
    humidityPercent: roundTo(60 + rnd.normal(10), 0),
    tapPosition: d.tap,
    ...INSTRUMENTS.field,
    testKV: 10,
    testFrequencyHz: 50,
    hoursDeenergised: roundTo(6 + rnd.between(0, 10), 1),
    notes: 'Routine maintenance outage: capacitance and DF, oil sample.',
    capacitancePF,
    dissipationPercent,
    dissolvedGasPPM: agedGas(age, `${u.serial}/routine/${index}`),
  };
  if (index === u.routineMonthsAgo.length - 1) {
    body.excitationCurrentMA = Object.fromEntries(PHASES.map((p) => [p, roundTo(fp.excitationMA[p] * (1 + rnd.normal(0.01)), 1)]));
    body.excitationKV = fp.excitationKV;
    body.notes = 'Routine maintenance outage: capacitance and DF, excitation current, oil sample.';
  }
  return body;
}

/** The routine test dates of a unit relative to `now` (recorded by date: midnight UTC, shown as a date). */
export function routineDates(u: DemoUnit, now: Date): Date[] {
  return u.routineMonthsAgo.map((m) => monthsBefore(now, m, '00:00:00'));
}

/** The unit list as CSV (examples/demo/units.csv). */
export function unitsCsv(): string {
  const head = 'serial,position,site,timeZone,design,maker,vectorGroup,hvKV,lvKV,ratedKVA,impedancePercent,systemImpedancePercent,conductor,year,role';
  const lines = DEMO_UNITS.map((u) => {
    const d = DEMO_DESIGNS[u.family];
    const s = demoSite(u.site);
    return [u.serial, u.position, s.name, s.timeZone, d.reference, `"${d.maker}"`, d.vectorGroup, d.hvKV, d.lvKV, d.impedanceBaseKVA, d.impedancePercent, s.systemImpedancePercent, d.conductor, u.year, u.role ?? ''].join(',');
  });
  return `${[head, ...lines].join('\n')}\n`;
}
