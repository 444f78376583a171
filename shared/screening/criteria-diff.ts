// Criteria sets compared leaf by leaf, and every leaf of a set named in words (the draft editor and the diff table both
// read these). Pure: plain JSON in, plain rows out.

/** A JSON leaf of a criteria set. */
export type CriteriaLeafValue = number | string | boolean | null;

/** One changed leaf between two sets: where (`capacitance.shiftBands[1].from`), in words, and its two values. */
export interface CriteriaChange {
  path: string;
  label: string;
  /** The value in the first set; null when the element was added. */
  from: unknown;
  /** The value in the second set; null when the element was removed. */
  to: unknown;
  kind: 'changed' | 'added' | 'removed';
}

/** One leaf of a set: its path, words, value and the section (first key) it belongs to. */
export interface CriteriaLeaf {
  path: string;
  segments: (string | number)[];
  section: string;
  label: string;
  value: CriteriaLeafValue;
}

export const CRITERIA_SECTION_LABELS: Record<string, string> = {
  version: 'Version',
  name: 'Name',
  rounding: 'Rounding',
  capacitance: 'Winding capacitance',
  powerFactor: 'Power factor',
  reactance: 'Leakage reactance',
  sweep: 'Frequency response (SFRA)',
  sisters: 'Sister units',
  throughFault: 'Through-fault duty',
  gas: 'Dissolved gas',
  excitation: 'Excitation current',
  resistance: 'Winding resistance',
  ratio: 'Turns ratio',
  bushing: 'Bushings',
  plausibility: 'Plausibility',
  remanence: 'Remanence',
  stateCap: 'Cap on state-based findings',
  lowConfidenceCap: 'Cap on low-confidence findings',
  dfFrequency: 'Dissipation factor against frequency',
  verdict: 'Verdict',
};

/** Keys whose spelt-out form would read badly. */
const KEY_WORDS: Record<string, string> = {
  from: 'starts at',
  dlt911: 'DL/T 911 classes',
  iecCategories: 'IEC categories',
  iecSource: 'IEC source',
  bandsHz: 'frequency bands (Hz)',
  dixonQ95: 'Dixon Q at 95 %',
  hvShareOfCH: 'HV share of CH',
  hvShareSource: 'HV share source',
  c1ShiftBands: 'C1 shift bands',
  c1ShiftSource: 'C1 shift source',
  categoryIMaxPerUnit: 'category I maximum current (per unit)',
  categoryIMechanicalI2t: 'category I mechanical I²t (per-unit² · s)',
  categoryISource: 'category I source',
  thermalLimitI2t: 'thermal limit I²t (per-unit² · s)',
  severeBelowLF: 'severe below (low-frequency band)',
  obviousBelowLF: 'obvious below (low-frequency band)',
  obviousBelowMF: 'obvious below (mid-frequency band)',
  slightBelowLF: 'slight below (low-frequency band)',
  slightBelowMF: 'slight below (mid-frequency band)',
  normalFromHF: 'normal from (high-frequency band)',
  Cu: 'copper (Cu)',
  Al: 'aluminium (Al)',
  pdMinCH4: 'PD: minimum CH4 (%)',
  d1MaxC2H4: 'D1: maximum C2H4 (%)',
  d1MinC2H2: 'D1: minimum C2H2 (%)',
  d2MinC2H2: 'D2: minimum C2H2 (%)',
  d2MinC2H4: 'D2: minimum C2H4 (%)',
  d2MaxC2H4: 'D2: maximum C2H4 (%)',
  d2HighMinC2H2: 'D2 (high): minimum C2H2 (%)',
  d2HighMinC2H4: 'D2 (high): minimum C2H4 (%)',
  t1MaxC2H2: 'T1: maximum C2H2 (%)',
  t1MaxC2H4: 'T1: maximum C2H4 (%)',
  t2MaxC2H2: 'T2: maximum C2H2 (%)',
  t2MaxC2H4: 'T2: maximum C2H4 (%)',
  t3MaxC2H2: 'T3: maximum C2H2 (%)',
  t3MinC2H4: 'T3: minimum C2H4 (%)',
};

/** Units spelt at the end of a key. */
const UNIT_SUFFIXES: [RegExp, string][] = [
  [/Percent$/, ' (%)'],
  [/PPM$/, ' (ppm)'],
  [/Hz$/, ' (Hz)'],
  [/MA$/, ' (mA)'],
  [/KVA$/, ' (kVA)'],
  [/C$/, ' (°C)'],
];

/** A key of a criteria set in words ("consistencyLimitPercent" → "consistency limit (%)"), lower case. */
export function criteriaKeyWords(key: string): string {
  if (KEY_WORDS[key]) return KEY_WORDS[key];
  let unit = '';
  let k = key;
  for (const [re, u] of UNIT_SUFFIXES) {
    if (re.test(k) && k.replace(re, '').length > 0) {
      unit = u;
      k = k.replace(re, '');
      break;
    }
  }
  const words = k
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .split(/\s+/)
    .map((w) => (/^[A-Z0-9]{2,}$/.test(w) ? w : w.toLowerCase()))
    .join(' ');
  return `${words.replace(/\bmax\b/, 'maximum').replace(/\bmin\b/, 'minimum')}${unit}`;
}

/** `capacitance.shiftBands[1].from` from its segments. */
export function criteriaPath(segments: readonly (string | number)[]): string {
  return segments.map((s, i) => (typeof s === 'number' ? `[${s}]` : i === 0 ? s : `.${s}`)).join('');
}

/** The words of a path: "Winding capacitance › shift bands › band 2 › starts at". */
export function criteriaPathLabel(segments: readonly (string | number)[]): string {
  const parts: string[] = [];
  segments.forEach((s, i) => {
    if (i === 0 && typeof s === 'string') parts.push(CRITERIA_SECTION_LABELS[s] ?? criteriaKeyWords(s));
    else if (typeof s === 'number') {
      const parent = segments[i - 1];
      const inBands = typeof parent === 'string' && /Bands$/.test(parent);
      const inPair = typeof parent === 'number';
      if (inPair) {
        // A pair inside a table: [temperature, factor] or [multiple, time].
        const grand = segments[i - 2];
        const names = grand === 'temperatureFactors' ? ['temperature (°C)', 'factor'] : grand === 'thermalCurve' ? ['current (per unit)', 'time (s)'] : ['first', 'second'];
        parts.push(names[s] ?? `value ${s + 1}`);
      } else parts.push(`${inBands ? 'band' : parent === 'low' || parent === 'mid' || parent === 'high' ? (s === 0 ? 'from' : 'to') : 'row'} ${s + 1}`.replace(/^(from|to) \d+$/, '$1'));
    } else parts.push(criteriaKeyWords(s));
  });
  return parts.join(' › ');
}

const isObject = (v: unknown): v is Record<string, unknown> => !!v && typeof v === 'object' && !Array.isArray(v);

/** Every leaf (number, text, yes/no, null) of a set, in the set's own order. */
export function criteriaLeaves(c: unknown, segments: (string | number)[] = []): CriteriaLeaf[] {
  if (Array.isArray(c)) return c.flatMap((x, i) => criteriaLeaves(x, [...segments, i]));
  if (isObject(c)) return Object.entries(c).flatMap(([k, x]) => criteriaLeaves(x, [...segments, k]));
  if (!segments.length) return [];
  return [
    {
      path: criteriaPath(segments),
      segments,
      section: String(segments[0]),
      label: criteriaPathLabel(segments),
      value: (c === undefined ? null : c) as CriteriaLeafValue,
    },
  ];
}

/**
 * Every difference between two sets, `a` → `b`: changed leaves, and elements or keys present on one side only (arrays
 * compared element by element, so a band moved is a changed `from`, a band added is an added element).
 */
export function diffCriteria(a: unknown, b: unknown, segments: (string | number)[] = []): CriteriaChange[] {
  const at = (kind: CriteriaChange['kind'], from: unknown, to: unknown): CriteriaChange => {
    const label = criteriaPathLabel(segments);
    return { path: criteriaPath(segments), label: kind === 'changed' ? label : `${label} (${kind})`, from, to, kind };
  };
  if (a === undefined && b !== undefined) return [at('added', null, b)];
  if (b === undefined && a !== undefined) return [at('removed', a, null)];
  if (Array.isArray(a) && Array.isArray(b)) {
    const out: CriteriaChange[] = [];
    for (let i = 0; i < Math.max(a.length, b.length); i++) out.push(...diffCriteria(a[i], b[i], [...segments, i]));
    return out;
  }
  if (isObject(a) && isObject(b)) {
    const keys = [...Object.keys(a), ...Object.keys(b).filter((k) => !(k in a))];
    return keys.flatMap((k) => diffCriteria(a[k], b[k], [...segments, k]));
  }
  if (Array.isArray(a) || Array.isArray(b) || isObject(a) || isObject(b)) return JSON.stringify(a) === JSON.stringify(b) ? [] : [at('changed', a, b)];
  return Object.is(a, b) ? [] : [at('changed', a, b)];
}

/** A value of the diff in words: numbers as they are, text as it is, an element added or removed as its leaves. */
export function criteriaValueWords(v: unknown): string {
  if (v === null || v === undefined) return '—';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'number' || typeof v === 'string') return String(v);
  if (Array.isArray(v) && v.every((x) => typeof x !== 'object' || x === null)) return v.join(', ');
  return criteriaLeaves(v)
    .map((l) => `${l.label}: ${criteriaValueWords(l.value)}`)
    .join('; ');
}
