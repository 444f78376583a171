// Words for the engine's and the API's codes, used by the screens, the manager's e-mail and the PDF report alike.
// A leaf module: only type imports (erased) and plain constants, so a page that needs one label loads no engine, no
// schema library and no CSV parser. Labels start with a capital; `inSentence` gives the form used inside a sentence.
import type { CurrentIs, FaultType } from './schemas/case.js';
import type { Basis, Indicator, Level, Method } from './schemas/result.js';
import type {
  Conductor,
  DecisionOutcome,
  EventStatus,
  FindingClassification,
  NotificationStatus,
  ReadingSetKind,
  Recommendation,
  Windings,
} from './schemas/enums.js';
import type { ProtectionCode } from './screening/protections.js';
import type { CurrentBasis } from './screening/through-fault.js';

/** Words that keep their capital inside a sentence (names of people and methods). */
const PROPER_WORDS = /^(Buchholz|Duval|Dixon's|Grubbs|Gapsight|IEEE|IEC)\b/;

/** A label as written inside a sentence: first letter lower case, unless the first word is a name or an abbreviation. */
export function inSentence(label: string): string {
  if (PROPER_WORDS.test(label) || /^[A-Z0-9]{2}/.test(label)) return label;
  return label.charAt(0).toLowerCase() + label.slice(1);
}

export const FAULT_TYPE_LABELS: Record<FaultType, string> = {
  'three-phase': 'Three-phase',
  'phase-to-phase': 'Phase-to-phase',
  'phase-to-phase-to-ground': 'Phase-to-phase-to-ground',
  'phase-to-ground': 'Phase-to-ground',
};

export const SIDE_LABELS: Record<'hv' | 'lv', string> = { hv: 'HV', lv: 'LV' };

export const PROTECTION_LABELS: Record<ProtectionCode, string> = {
  differential: 'Differential',
  'restricted-earth-fault': 'Restricted earth fault',
  'buchholz-alarm': 'Buchholz alarm',
  'buchholz-trip': 'Buchholz trip',
  'sudden-pressure': 'Sudden pressure',
  'pressure-relief': 'Pressure relief',
  overcurrent: 'Overcurrent',
};

/** A protection inside a sentence ("pressure relief", "Buchholz trip"); an unknown code as it is. */
export function protectionWord(p: string): string {
  const label = PROTECTION_LABELS[p as ProtectionCode];
  return label === undefined ? p : inSentence(label);
}

/** A fault type inside a sentence ("phase-to-ground"); an unknown code as it is. */
export function faultTypeWord(t: string): string {
  const label = FAULT_TYPE_LABELS[t as FaultType];
  return label === undefined ? t : inSentence(label);
}

export const STATUS_LABELS: Record<EventStatus, { word: string; icon: string }> = {
  logged: { word: 'Logged', icon: 'edit_note' },
  testing: { word: 'Testing', icon: 'science' },
  screened: { word: 'Screened', icon: 'fact_check' },
  held: { word: 'Held', icon: 'pan_tool' },
  released: { word: 'Released', icon: 'power' },
};

export const RECOMMENDATION_LABELS: Record<Recommendation, { word: string; icon: string }> = {
  go: { word: 'Go', icon: 'check_circle' },
  conditional: { word: 'Conditional', icon: 'warning' },
  'no-go': { word: 'No-go', icon: 'block' },
};

/** The recommendation as the head word of the mail and the PDF. */
export const RECOMMENDATION_WORD: Record<Recommendation, string> = { go: 'GO', conditional: 'CONDITIONAL', 'no-go': 'NO-GO' };

export const LEVEL_LABELS: Record<Level, string> = { ok: 'OK', watch: 'Watch', investigate: 'Investigate', critical: 'Critical' };
/** The level as printed beside a finding in the mail and the PDF. */
export const LEVEL_WORD: Record<Level, string> = { ok: 'OK', watch: 'WATCH', investigate: 'INVESTIGATE', critical: 'CRITICAL' };

export const KIND_LABELS: Record<ReadingSetKind, string> = {
  factory: 'Factory',
  commissioning: 'Commissioning',
  routine: 'Routine',
  'post-fault': 'Post-fault',
};

/** A manager's decision outcome as icon + word. */
export const OUTCOME_LABELS: Record<DecisionOutcome, { word: string; icon: string }> = {
  release: { word: 'Release', icon: 'power' },
  'release-with-restrictions': { word: 'Release with restrictions', icon: 'tune' },
  hold: { word: 'Hold', icon: 'pan_tool' },
};

/** An inspection finding's classification as icon + word. */
export const FINDING_LABELS: Record<FindingClassification, { word: string; icon: string }> = {
  'no-damage': { word: 'No damage', icon: 'verified' },
  'deformation-confirmed': { word: 'Deformation confirmed', icon: 'report' },
  other: { word: 'Other', icon: 'notes' },
};

/** An e-mail's delivery state as icon + word. */
export const NOTIFICATION_STATUS_LABELS: Record<NotificationStatus, { word: string; icon: string }> = {
  queued: { word: 'Queued', icon: 'schedule_send' },
  sent: { word: 'Sent', icon: 'mark_email_read' },
  failed: { word: 'Failed', icon: 'error' },
};

/** What an audit entry records (`audit.action`). */
export const AUDIT_ACTION_LABELS: Record<string, string> = {
  create: 'Created',
  update: 'Changed',
  import: 'Imported',
  screen: 'Screened',
  decide: 'Decided',
  delete: 'Deleted',
  'sign-in-lock': 'Locked sign-in of',
};

/** The engine's indicator methods. */
export const METHOD_LABELS: Record<Method, string> = {
  capacitance: 'Capacitance',
  'power-factor': 'Power factor',
  reactance: 'Leakage reactance',
  sweep: 'Frequency-response sweep',
  excitation: 'Excitation current',
  resistance: 'Winding resistance',
  ratio: 'Turns ratio',
  gas: 'Dissolved gases',
  bushing: 'Bushings',
  sisters: 'Sister-unit statistics',
  duty: 'Through-fault duty',
};

/** A method inside a sentence ("leakage reactance"); an unknown code as it is. */
export function methodWord(m: string): string {
  const label = METHOD_LABELS[m as Method];
  return label === undefined ? m : inSentence(label);
}

/** What an indicator compares (rules revision 2). `phase-comparison` names its phases from the key when it can. */
export const BASIS_LABELS: Record<Basis, string> = {
  change: 'against own baseline',
  sisters: 'against sister units',
  'phase-comparison': 'phase comparison',
  state: 'state (absolute value)',
  duty: 'duty',
};

/**
 * An indicator's basis in words: a change against a pre-fault sample or the previous test says so; a phase comparison
 * names its phases ("phase A vs C"); null before rules revision 2 (no basis stored).
 */
export function basisLabel(i: Pick<Indicator, 'key' | 'basis' | 'reference'>): string | null {
  if (!i.basis) return null;
  if (i.basis === 'change' && /pre-fault/i.test(i.reference ?? '')) return 'against own pre-fault sample';
  if (i.basis === 'change' && (/FromPrevious/.test(i.key) || /previous/i.test(i.reference ?? ''))) return 'against own previous test';
  if (i.basis === 'phase-comparison') {
    const m = /\.([ABC])([ABC])\./.exec(i.key);
    return m ? `phase ${m[1]} vs ${m[2]}` : BASIS_LABELS['phase-comparison'];
  }
  return BASIS_LABELS[i.basis] ?? i.basis;
}

/** How the duty's per-unit current was obtained (result `throughFault.currentBasis`). */
export const CURRENT_BASIS_LABELS: Record<CurrentBasis, string> = {
  winding: 'entered as winding current',
  'line-converted': 'converted from the line current by the vector group',
  'line-assumed': 'line current used as the winding current (factor unknown)',
};

/** What the shots' currents are (fault field `currentIs`). */
export const CURRENT_IS_LABELS: Record<CurrentIs, string> = {
  line: 'Line currents (relay or recorder on the line CTs)',
  winding: 'Winding currents',
};

/** Sweep windings (sweep field `winding`). */
export const WINDING_LABELS: Record<'hv' | 'lv' | 'tv', string> = { hv: 'HV', lv: 'LV', tv: 'TV (tertiary)' };

/** The dissolved gases by formula, with their names. */
export const GAS_LABELS: Record<'H2' | 'CH4' | 'C2H6' | 'C2H4' | 'C2H2' | 'CO' | 'CO2', string> = {
  H2: 'Hydrogen (H2)',
  CH4: 'Methane (CH4)',
  C2H6: 'Ethane (C2H6)',
  C2H4: 'Ethylene (C2H4)',
  C2H2: 'Acetylene (C2H2)',
  CO: 'Carbon monoxide (CO)',
  CO2: 'Carbon dioxide (CO2)',
};

/** The measured quantities of a reading set, by case field. */
export const QUANTITY_LABELS: Record<string, string> = {
  capacitancePF: 'Capacitance',
  dissipationPercent: 'Dissipation / power factor',
  reactance: 'Leakage reactance',
  threePhaseEquivalent: 'Three-phase equivalent impedance',
  excitationCurrentMA: 'Excitation current',
  windingResistanceOhm: 'Winding resistance',
  turnsRatio: 'Turns ratio',
  dissolvedGasPPM: 'Dissolved gases (oil sample)',
  dissipationByFrequency: 'Dissipation over frequency',
  bushings: 'Bushings',
};

/** A short label for an indicator key ("CHL capacitance shift vs baseline"); an unknown key is returned as it is. */
export function indicatorLabel(key: string): string {
  const p = key.split('.');
  const last = p[p.length - 1];
  const [head, a, b] = p;
  switch (head) {
    case 'capacitance':
      if (last === 'shiftPercent') return `${a} capacitance shift vs baseline`;
      if (last === 'shiftFromPreviousPercent') return `${a} capacitance shift vs previous test`;
      if (last === 'consistencyPercent') return `${a} GST/UST consistency`;
      break;
    case 'powerFactor':
      if (last === 'pf20Percent') return `${a} power factor at 20 °C`;
      if (last === 'riseFromBaselinePercent') return `${a} power factor rise vs baseline`;
      break;
    case 'reactance':
      if (a === 'phaseSpreadPercent') return 'Reactance per-phase spread';
      if (a === 'phaseSpreadChangePoints') return 'Reactance spread change vs baseline';
      if (a === 'threePhase' && last === 'percent') return 'Three-phase equivalent impedance';
      if (a === 'threePhase') return 'Three-phase impedance vs nameplate';
      if (last === 'percent') return `Phase ${a} leakage reactance`;
      if (last === 'shiftPercent') return `Phase ${a} reactance shift vs baseline`;
      if (last === 'shiftFromPreviousPercent') return `Phase ${a} reactance shift vs previous test`;
      if (last === 'deviationFromAveragePercent') return `Phase ${a} reactance vs the phases' mean`;
      break;
    case 'sweep': {
      // Phase comparison without a baseline trace: sweep.<winding>.AC.<figure>
      const ac = p.length === 4 && p[2] === 'AC' && ['hv', 'lv', 'tv'].includes(p[1]);
      const label = ac ? `${p[1].toUpperCase()} phase A vs C` : p.slice(1, -1).join('.');
      const words: Record<string, string> = {
        correlation: 'correlation',
        rLF: 'relative factor, low band',
        rMF: 'relative factor, mid band',
        rHF: 'relative factor, high band',
        asleDb: 'ASLE',
        class: 'DL/T 911 class',
      };
      return `Sweep ${label} ${words[last] ?? last}`;
    }
    case 'duty': {
      const words: Record<string, string> = {
        eventDutyPercent: 'Event duty (of mechanical limit)',
        thermalDurationPercent: "Shot time (of the thermal curve's allowed time)",
        forceRatioPercent: 'Force ratio (of design force)',
        shotsAboveSegment: 'Shots at or above segment start',
        cumulativeDutyPercent: 'Cumulative duty (Gapsight tally)',
      };
      if (words[a]) return words[a];
      break;
    }
    case 'gas':
      if (a === 'duvalZone') return 'Duval triangle 1 zone';
      if (last === 'risePPM') return `${GAS_LABELS[a as keyof typeof GAS_LABELS] ?? a} rise`;
      break;
    case 'excitation':
      if (a === 'outerPhaseDifferencePercent') return 'Excitation current, outer phases differ';
      if (last === 'changePercent') return `Phase ${a} excitation current change`;
      break;
    case 'resistance':
      if (a === 'phaseImbalancePercent') return 'Winding resistance phase imbalance';
      if (last === 'changePercent') return `Phase ${a} winding resistance change`;
      break;
    case 'ratio':
      if (last === 'changePercent') return `Phase ${a} turns ratio change`;
      if (last === 'deviationFromNameplatePercent') return `Phase ${a} turns ratio vs nameplate`;
      break;
    case 'sisters': {
      const what = a === 'capacitance' ? `${b} capacitance` : a === 'reactance' ? `phase ${b} reactance` : `${a} ${b}`;
      const words: Record<string, string> = {
        modifiedZ: 'modified z among sisters',
        deviationFromMedianPercent: "deviation from sisters' median",
        grubbsG: 'Grubbs G among sisters',
        dixonQ: "Dixon's Q among sisters",
      };
      return `${what[0].toUpperCase()}${what.slice(1)} ${words[last] ?? last}`;
    }
    case 'bushing':
      if (last === 'c1ShiftPercent') return `Bushing ${a} C1 shift vs reference`;
      if (last === 'c1Pf20RisePercent') return `Bushing ${a} C1 power factor rise`;
      break;
    case 'dfFrequency':
      return `${a} dissipation over frequency: ${last}`;
  }
  return key;
}

/** The unit of an indicator's value, read from its key ("%", "points", "ppm", "dB"; "" for ratios, scores and classes). */
export function indicatorUnit(key: string): string {
  const last = key.split('.').pop() ?? '';
  if (/Points$/.test(last)) return 'points';
  if (/PPM$/.test(last)) return 'ppm';
  if (/Db$/.test(last)) return 'dB';
  if (/Percent$/.test(last) || last === 'percent') return '%';
  return '';
}

/** "criteria set 2 · rules revision 2" of a stored screening (a result without `engineRevision` is revision 1). */
export function rulesText(s: { criteriaVersion: number; result?: { engineRevision?: number } | null }): string {
  return `criteria set ${s.criteriaVersion} · rules revision ${s.result?.engineRevision ?? 1}`;
}

/** A design family's windings type. */
export const WINDINGS_LABELS: Record<Windings, string> = {
  'two-winding': 'Two-winding',
  'three-winding': 'Three-winding',
  auto: 'Autotransformer',
  'auto-tertiary': 'Autotransformer with tertiary',
};

/** Winding conductor material. */
export const CONDUCTOR_LABELS: Record<Conductor, string> = { Cu: 'Copper (Cu)', Al: 'Aluminium (Al)' };

// ---------------------------------------------------------------------------------------------------------------------
// Records and their fields in words (the audit trail, corrections)

/** A count with its noun: "1 entry", "4 entries", "no entries". */
export function countWords(n: number, one: string, many: string): string {
  if (n === 0) return `no ${many}`;
  return `${n} ${n === 1 ? one : many}`;
}

/** What each role is called (as the administration names them). */
export const ROLE_WORDS: Record<string, string> = {
  protection: 'Protection engineer',
  tester: 'Test engineer',
  manager: 'Operations manager',
  engineer: 'Asset engineer',
  admin: 'Administrator',
};

/** The kinds of mail Gapsight sends (`notification.kind`). */
export const NOTIFICATION_KIND_LABELS: Record<string, string> = { screening: 'Screening mail', decision: 'Decision mail' };

/** Sweep test types (sweep field `testType`). */
export const SWEEP_TEST_LABELS: Record<'open-circuit' | 'short-circuit' | 'capacitive-interwinding' | 'inductive-interwinding', string> = {
  'open-circuit': 'Open circuit',
  'short-circuit': 'Short circuit',
  'capacitive-interwinding': 'Capacitive inter-winding',
  'inductive-interwinding': 'Inductive inter-winding',
};

/** Kinds of stored file: relay records on an event, photos and documents on a finding (`attachment.kind`). */
export const ATTACHMENT_KIND_LABELS: Record<string, string> = {
  'comtrade-cfg': 'COMTRADE configuration (.cfg)',
  'comtrade-dat': 'COMTRADE data (.dat)',
  'comtrade-cff': 'COMTRADE combined file (.cff)',
  csv: 'CSV table',
  text: 'Text file',
  pdf: 'PDF document',
  jpeg: 'JPEG photo',
  png: 'PNG image',
  webp: 'WebP image',
};

/** A file's content type in words ("PDF document"); an unknown type as it is. */
export function contentTypeWord(t: string): string {
  const words: Record<string, string> = {
    'application/pdf': 'PDF document',
    'text/plain': 'text',
    'text/csv': 'CSV table',
    'image/jpeg': 'JPEG photo',
    'image/png': 'PNG image',
    'image/webp': 'WebP image',
    'application/octet-stream': 'binary data',
  };
  return words[t.split(';')[0].trim().toLowerCase()] ?? t;
}

/** The records an audit entry can be about (`audit.entity`), as a noun inside a sentence. */
export const ENTITY_WORDS: Record<string, string> = {
  fault_event: 'fault event',
  reading_set: 'reading set',
  screening: 'screening',
  follow_up: 'follow-up',
  finding: 'finding',
  attachment: 'file',
  sweep_trace: 'sweep trace',
  notification: 'e-mail',
  user: 'person',
  unit: 'unit',
  design: 'design family',
  site: 'site',
  decision: 'decision',
};

const EVENT_FIELDS: Record<string, string> = {
  id: 'Fault event',
  unitId: 'Unit',
  createdById: 'Logged by',
  createdAt: 'Logged at',
  occurredAt: 'Fault time',
  type: 'Fault type',
  side: 'Faulted side',
  location: 'Location',
  currentIs: 'Shot currents are',
  faultedPhases: 'Faulted phases',
  shots: 'Shots',
  transformerTripped: 'Transformer tripped',
  protectionOperated: 'Protections operated',
  notes: 'Notes',
  status: 'Status',
  energisedAt: 'Re-energised at',
  restrictions: 'Restrictions',
  restrictionsLiftedAt: 'Restrictions lifted at',
  reason: 'Reason',
};

const READING_SET_FIELDS: Record<string, string> = {
  id: 'Reading set',
  unitId: 'Unit',
  kind: 'Kind of tests',
  eventId: 'Fault event',
  isReference: 'Reference set',
  takenAt: 'Taken at',
  temperatureC: 'Insulation temperature (°C)',
  topOilC: 'Top oil (°C)',
  bottomOilC: 'Bottom oil (°C)',
  ambientC: 'Ambient (°C)',
  humidityPercent: 'Humidity (%)',
  tapPosition: 'Tap position',
  instrument: 'Instrument',
  instrumentSerial: 'Instrument serial number',
  testKV: 'Test voltage (kV)',
  testFrequencyHz: 'Test frequency (Hz)',
  hoursDeenergised: 'Hours de-energised',
  hoursDeEnergised: 'Hours de-energised',
  demagnetised: 'Core demagnetised',
  windingTemperatureC: 'Winding temperature (°C)',
  notes: 'Notes',
  createdById: 'Entered by',
  createdAt: 'Entered at',
  capacitancePF: 'Capacitance (pF)',
  capacitanceModes: 'Capacitance by test mode',
  dissipationPercent: 'Dissipation / power factor (%)',
  reactance: 'Leakage reactance',
  threePhaseEquivalent: 'Three-phase equivalent impedance',
  excitationCurrentMA: 'Excitation current (mA)',
  excitationKV: 'Excitation test voltage (kV)',
  windingResistanceOhm: 'Winding resistance (Ω)',
  resistanceTemperatureC: 'Resistance measured at (°C)',
  turnsRatio: 'Turns ratio',
  dissolvedGasPPM: 'Dissolved gases (ppm)',
  dissipationByFrequency: 'Dissipation over frequency',
  bushings: 'Bushings',
  readings: 'Readings',
  file: 'File',
  rows: 'Rows',
  sha256: 'Checksum (SHA-256)',
};

const UNIT_FIELDS: Record<string, string> = {
  id: 'Unit',
  serial: 'Serial number',
  position: 'Position',
  siteId: 'Site',
  designId: 'Design family',
  year: 'Year built',
  phases: 'Phases',
  hvKV: 'HV rating (kV)',
  lvKV: 'LV rating (kV)',
  ratedKVA: 'Rating (kVA)',
  impedancePercent: 'Impedance (%)',
  systemImpedancePercent: 'System impedance (%)',
  conductor: 'Conductor',
  lastEventId: 'Last fault event',
  lastEventAt: 'Last fault time',
  lastEventStatus: 'Last fault status',
  lastRecommendation: 'Last recommendation',
};

const DESIGN_FIELDS: Record<string, string> = {
  id: 'Design family',
  reference: 'Reference',
  maker: 'Maker',
  windings: 'Windings',
  vectorGroup: 'Vector group',
  phases: 'Phases',
  hvKV: 'HV rating (kV)',
  lvKV: 'LV rating (kV)',
  tvKV: 'TV rating (kV)',
  coolingStages: 'Cooling stages',
  impedancePercent: 'Impedance (%)',
  impedanceBaseKVA: 'Impedance base (kVA)',
  conductor: 'Conductor',
  requiredCapacitance: 'Required capacitance measurements',
  notes: 'Notes',
};

const SITE_FIELDS: Record<string, string> = { id: 'Site', name: 'Name', timeZone: 'Time zone', locale: 'Date format (locale)', controlRoomEmail: 'Control room e-mail' };

const USER_FIELDS: Record<string, string> = {
  id: 'Person',
  email: 'E-mail',
  name: 'Name',
  roles: 'Roles',
  siteIds: 'Sites',
  allSites: 'All sites',
  active: 'Active',
  demo: 'Demo account',
  mustChangePassword: 'Must change the password',
  lastSignInAt: 'Last sign-in',
  lockedUntil: 'Sign-in locked until',
  failedSignIns: 'Failed sign-ins',
};

const OTHER_FIELDS: Record<string, Record<string, string>> = {
  follow_up: { eventId: 'Fault event', task: 'Task', dueAt: 'Due', closedAt: 'Closed at', result: 'Result' },
  finding: { eventId: 'Fault event', classification: 'Classification', text: 'Text' },
  screening: {
    eventId: 'Fault event',
    recommendation: 'Recommendation',
    criteriaVersion: 'Criteria set',
    comparison: 'Comparison run',
    missing: 'Tests missing',
    unreliable: 'Unreliable readings',
  },
  decision: {
    id: 'Decision',
    screeningId: 'Screening',
    managerId: 'Signed by',
    outcome: 'Outcome',
    restrictions: 'Restrictions',
    reason: 'Reason',
    againstRecommendation: 'Against the recommendation',
    signedAt: 'Signed at',
    recommendation: 'Recommendation',
  },
  sweep_trace: {
    readingSetId: 'Reading set',
    label: 'Label',
    testType: 'Test type',
    winding: 'Winding',
    phase: 'Phase',
    tapPosition: 'Tap position',
    baselineTapPosition: 'Baseline tap position',
    demagnetised: 'Core demagnetised',
    pointCount: 'Points',
    sha256: 'Checksum (SHA-256)',
    fileName: 'File',
    description: 'Description',
  },
  attachment: { eventId: 'Fault event', findingId: 'Finding', name: 'File name', kind: 'Type', contentType: 'Content type', size: 'Size (bytes)', sha256: 'Checksum (SHA-256)' },
  notification: { kind: 'Mail', eventId: 'Fault event', screeningId: 'Screening', to: 'To', resentFrom: 'Resent from mail' },
};

/** Field labels by record (`audit.entity`): every field a correction or an audited change can touch. */
export const FIELD_LABELS: Record<string, Record<string, string>> = {
  fault_event: EVENT_FIELDS,
  reading_set: READING_SET_FIELDS,
  unit: UNIT_FIELDS,
  design: DESIGN_FIELDS,
  site: SITE_FIELDS,
  user: USER_FIELDS,
  ...OTHER_FIELDS,
};

/** "dissolvedGasPPM" → "Dissolved gas ppm": the last resort for a field no label names. */
function humanise(key: string): string {
  const words = key
    .replace(/_/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .trim()
    .split(/\s+/)
    .map((w, i) => (/^[A-Z0-9]{2,}$/.test(w) ? w : i === 0 ? w.charAt(0).toUpperCase() + w.slice(1).toLowerCase() : w.toLowerCase()));
  return words.join(' ');
}

/** A field of a record in words ("Dissolved gases (ppm)", "Protections operated"); a field no label names is spelt out. */
export function fieldLabel(entity: string, key: string): string {
  return FIELD_LABELS[entity]?.[key] ?? EVENT_FIELDS[key] ?? READING_SET_FIELDS[key] ?? humanise(key);
}

/**
 * Free text (an engine reason, a note) with the protection codes it quotes put in words: "Internal protection operated
 * (differential, buchholz-trip)" → "… (differential, Buchholz trip)". Other text is left as it is.
 */
export function codesInWords(text: string): string {
  return text.replace(/(^|[^\w-])([a-z]+(?:-[a-z]+)+)(?![\w-])/g, (all, lead: string, code: string) => {
    const label = PROTECTION_LABELS[code as ProtectionCode];
    return label === undefined ? all : `${lead}${inSentence(label)}`;
  });
}
