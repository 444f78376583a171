// One audit entry in one plain sentence: who did what, to which record, with the outcome and the reason ("Morgan
// Manager signed: hold — reason: …", "Pat Protection corrected the fault: faulted phases A → AB"). Pure: the caller
// gives the people's names (and, when it knows them, the sessions' names and the follow-ups' tasks) and the site's zone.
// Covers every action and record the server audits (server/**/*.ts `audit(` calls); anything else still reads as words.
import { formatSignificant } from './format.js';
import { dayAndTime } from './session-name.js';
import {
  ATTACHMENT_KIND_LABELS,
  CONDUCTOR_LABELS,
  ENTITY_WORDS,
  FAULT_TYPE_LABELS,
  FINDING_LABELS,
  KIND_LABELS,
  NOTIFICATION_KIND_LABELS,
  OUTCOME_LABELS,
  RECOMMENDATION_LABELS,
  ROLE_WORDS,
  SIDE_LABELS,
  STATUS_LABELS,
  SWEEP_TEST_LABELS,
  WINDINGS_LABELS,
  WINDING_LABELS,
  countWords,
  contentTypeWord,
  fieldLabel,
  inSentence,
  protectionWord,
} from './vocabulary.js';

/** What an audit row holds (`audit_entry`), as the event file's answer carries it. */
export interface AuditEntryFacts {
  userId: number | null;
  action: string;
  entity: string;
  entityId: string;
  before?: unknown;
  after?: unknown;
  highlighted?: boolean;
  note?: string | null;
}

/** Names the sentence needs; only `person` is required. */
export interface AuditWordsContext {
  /** The site's time zone (times on its wall clock). */
  timeZone: string;
  /** A person's name by id; empty when unknown. */
  person: (id: number) => string | null | undefined;
  /** A reading set's name inside a sentence ("the tests of 29 Nov 2026 12:12 by Theo Tester"), when known. */
  readingSet?: (id: string) => string | null | undefined;
  /** A follow-up's task, when known. */
  followUp?: (id: string) => string | null | undefined;
  /** A site's name, when known. */
  site?: (id: number) => string | null | undefined;
  /** A design family's reference, when known. */
  design?: (id: number) => string | null | undefined;
}

type Fields = Record<string, unknown>;

const fields = (v: unknown): Fields => (v && typeof v === 'object' && !Array.isArray(v) ? (v as Fields) : {});
const text = (v: unknown): string | null => (typeof v === 'string' && v.trim() ? v.trim() : null);
const lowerFirst = inSentence;
const ucFirst = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Free text quoted, on one line, shortened past 160 characters. */
function quoted(s: string): string {
  const one = s.replace(/\s+/g, ' ').trim();
  return `“${one.length > 160 ? `${one.slice(0, 159)}…` : one}”`;
}

/** A person by id: their name; the system when no one; "a person no longer listed" when the name is unknown. */
function who(id: number | null | undefined, ctx: AuditWordsContext): string {
  if (id === null || id === undefined) return 'Gapsight';
  return ctx.person(id) || `A person no longer listed (no. ${id})`;
}

const DATE_KEYS = new Set(['occurredAt', 'takenAt', 'energisedAt', 'dueAt', 'closedAt', 'lastSignInAt', 'lockedUntil', 'restrictionsLiftedAt', 'signedAt', 'createdAt', 'lastEventAt', 'computedAt']);
/** Fields whose free text is quoted. */
const TEXT_KEYS = new Set(['notes', 'text', 'reason', 'restrictions', 'task', 'result', 'location', 'label', 'name', 'file', 'fileName', 'instrument']);
/** Fields of a stored view that are no one's change (ids, bookkeeping). */
const SKIPPED_KEYS = new Set(['id', 'createdById', 'createdAt', 'lastEventId', 'lastEventAt', 'lastEventStatus', 'lastRecommendation', 'sha256']);

function word(map: Record<string, string | { word: string }>, v: unknown): string | null {
  if (typeof v !== 'string') return null;
  const hit = map[v];
  if (hit === undefined) return null;
  return inSentence(typeof hit === 'string' ? hit : hit.word);
}

function numberWords(n: number): string {
  return formatSignificant(n, 6);
}

/** A flat record of named figures ("CH 1 210, CL 3 980") in words, or null when it is deeper than that. */
function figures(v: Fields): string | null {
  const entries = Object.entries(v);
  if (!entries.length || entries.length > 8) return null;
  if (!entries.every(([k, x]) => /^[A-Za-z0-9]{1,8}$/.test(k) && typeof x === 'number')) return null;
  return entries.map(([k, x]) => `${k} ${numberWords(x as number)}`).join(', ');
}

/**
 * A field's value in words: protections, statuses, kinds and outcomes by their labels, times on the site's clock, yes/no,
 * shots in kA and s, free text quoted; a set of readings too deep to print is "values" (the export has them in full).
 */
export function fieldValueWords(entity: string, key: string, v: unknown, ctx: Pick<AuditWordsContext, 'timeZone' | 'site' | 'person' | 'design'>): string {
  if (v === null || v === undefined || v === '' || (Array.isArray(v) && v.length === 0)) return 'none';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (DATE_KEYS.has(key) && typeof v === 'string') return dayAndTime(v, ctx.timeZone);
  switch (key) {
    case 'protectionOperated':
      return Array.isArray(v) ? v.map((p) => protectionWord(String(p))).join(', ') : String(v);
    case 'type':
      return word(FAULT_TYPE_LABELS, v) ?? String(v);
    case 'side':
      return word(SIDE_LABELS, v) ?? String(v);
    case 'currentIs':
      return v === 'line' ? 'line currents' : v === 'winding' ? 'winding currents' : String(v);
    case 'status':
    case 'lastEventStatus':
      return word(STATUS_LABELS, v) ?? String(v);
    case 'outcome':
      return word(OUTCOME_LABELS, v) ?? String(v);
    case 'recommendation':
    case 'lastRecommendation':
      return word(RECOMMENDATION_LABELS, v) ?? String(v);
    case 'classification':
      return word(FINDING_LABELS, v) ?? String(v);
    case 'conductor':
      return word(CONDUCTOR_LABELS, v) ?? String(v);
    case 'windings':
      return word(WINDINGS_LABELS, v) ?? String(v);
    case 'winding':
      return word(WINDING_LABELS, v) ?? String(v);
    case 'testType':
      return word(SWEEP_TEST_LABELS, v) ?? String(v);
    case 'contentType':
      return typeof v === 'string' ? contentTypeWord(v) : String(v);
    case 'roles':
      return Array.isArray(v) ? v.map((r) => ROLE_WORDS[String(r)] ?? String(r)).join(', ') : String(v);
    case 'siteIds':
      return Array.isArray(v) ? v.map((id) => ctx.site?.(Number(id)) || `site no. ${id}`).join(', ') : String(v);
    case 'siteId':
      return ctx.site?.(Number(v)) || `site no. ${v}`;
    case 'designId':
      return ctx.design?.(Number(v)) || `design family no. ${v}`;
    case 'managerId':
      return ctx.person(Number(v)) || `person no. ${v}`;
    case 'shots':
      if (Array.isArray(v)) {
        return v
          .map((s) => {
            const f = fields(s);
            return `${numberWords(Number(f.currentKA))} kA for ${numberWords(Number(f.durationS))} s`;
          })
          .join('; ');
      }
      break;
  }
  if (entity === 'reading_set' && key === 'kind') return word(KIND_LABELS, v) ?? String(v);
  if (entity === 'attachment' && key === 'kind') return ATTACHMENT_KIND_LABELS[String(v)] ?? String(v);
  if (entity === 'notification' && key === 'kind') return NOTIFICATION_KIND_LABELS[String(v)] ?? String(v);
  if (typeof v === 'number') return numberWords(v);
  if (typeof v === 'string') return TEXT_KEYS.has(key) ? quoted(v) : v;
  if (Array.isArray(v)) {
    if (v.every((x) => typeof x === 'string' || typeof x === 'number')) return v.join(', ');
    return countWords(v.length, 'item', 'items');
  }
  return figures(fields(v)) ?? 'values';
}

/** "Faulted phases A → AB; Protections operated differential → differential, Buchholz trip" (changed fields only). */
export function changesInWords(entity: string, before: unknown, after: unknown, ctx: AuditWordsContext): string {
  const b = fields(before);
  const a = fields(after);
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])].filter((k) => !SKIPPED_KEYS.has(k));
  const parts: string[] = [];
  for (const k of keys) {
    if (JSON.stringify(b[k]) === JSON.stringify(a[k])) continue;
    const label = lowerFirst(fieldLabel(entity, k));
    const from = k in b ? fieldValueWords(entity, k, b[k], ctx) : null;
    const to = k in a ? fieldValueWords(entity, k, a[k], ctx) : 'removed';
    parts.push(from === null ? `${label} ${to}` : from === 'values' && to === 'values' ? `${label} changed` : `${label} ${from} → ${to}`);
  }
  return parts.join('; ');
}

function withNote(sentence: string, note: string | null | undefined): string {
  return note ? `${sentence} (${lowerFirst(note)})` : sentence;
}

// ---- by record -----------------------------------------------------------------------------------------------------

function faultEventSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const before = fields(a.before);
  const after = fields(a.after);
  if (a.action === 'create') {
    const shots = Array.isArray(after.shots) ? countWords(after.shots.length, 'shot', 'shots') : null;
    const prot = Array.isArray(after.protectionOperated) && after.protectionOperated.length ? fieldValueWords('fault_event', 'protectionOperated', after.protectionOperated, ctx) : null;
    const what = [word(FAULT_TYPE_LABELS, after.type), shots].filter(Boolean).join(', ');
    return `${p} logged the fault of ${dayAndTime(text(after.occurredAt), ctx.timeZone)}${what ? `: ${what}` : ''}${prot ? `; ${prot} operated` : ''}`;
  }
  if (a.action === 'decide') {
    const outcome = word(OUTCOME_LABELS, after.outcome) ?? String(after.outcome ?? 'a decision');
    const restrictions = text(after.restrictions);
    const reason = text(after.reason);
    const rec = word(RECOMMENDATION_LABELS, after.recommendation);
    const against = a.highlighted || after.againstRecommendation === true;
    return (
      `${p} signed: ${outcome}${restrictions ? `, restrictions: ${quoted(restrictions)}` : ''}` +
      `${reason ? ` — reason: ${quoted(reason)}` : ''}` +
      `${rec ? (against ? ` — against the ${rec} recommendation` : ` — following the ${rec} recommendation`) : ''}`
    );
  }
  if (a.action === 'update') {
    if ('status' in after && 'status' in before && Object.keys(after).length === 1) {
      const from = fieldValueWords('fault_event', 'status', before.status, ctx);
      const to = fieldValueWords('fault_event', 'status', after.status, ctx);
      return withNote(`${p} moved the event from ${from} to ${to}`, a.note);
    }
    if ('restrictionsLiftedAt' in after) {
      const restrictions = text(before.restrictions);
      const reason = text(after.reason);
      return `${p} lifted the restrictions${restrictions ? ` ${quoted(restrictions)}` : ''}${reason ? ` — reason: ${quoted(reason)}` : ''}`;
    }
    if ('energisedAt' in after && Object.keys(after).length === 1) {
      const was = text(before.energisedAt);
      return `${p} recorded the unit re-energised at ${dayAndTime(text(after.energisedAt), ctx.timeZone)}${was ? ` (was ${dayAndTime(was, ctx.timeZone)})` : ''}`;
    }
    const changes = changesInWords('fault_event', before, after, ctx);
    const note = a.note && a.note !== 'Fault corrected' ? a.note : null;
    return withNote(`${p} corrected the fault${changes ? `: ${changes}` : ''}`, note);
  }
  return generic(a, p, ctx);
}

function readingSetName(a: AuditEntryFacts, ctx: AuditWordsContext): string {
  const known = ctx.readingSet?.(a.entityId);
  if (known) return known;
  const after = fields(a.after);
  const kind = word(KIND_LABELS, after.kind);
  const at = text(after.takenAt);
  return at ? `the ${kind ? `${kind} ` : ''}tests of ${dayAndTime(at, ctx.timeZone)}` : 'a reading set';
}

function readingSetSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const before = fields(a.before);
  const after = fields(a.after);
  if (a.action === 'create') {
    const kind = word(KIND_LABELS, after.kind);
    const readings = typeof after.readings === 'number' ? ` (${countWords(after.readings, 'reading', 'readings')})` : '';
    const at = dayAndTime(text(after.takenAt), ctx.timeZone);
    if (a.note && /pre-fault dissolved-gas/i.test(a.note)) return `${p} entered the pre-fault dissolved-gas sample of ${at}${readings}`;
    return withNote(`${p} entered ${kind ? `${kind} ` : ''}tests of ${at}${readings}`, a.note);
  }
  const name = readingSetName(a, ctx);
  if (a.action === 'import') {
    const rows = typeof after.rows === 'number' ? `${countWords(after.rows, 'row', 'rows')} of readings` : 'readings';
    const file = text(after.file);
    const temp =
      'windingTemperatureC' in after
        ? `; winding temperature ${fieldValueWords('reading_set', 'windingTemperatureC', before.windingTemperatureC, ctx)} → ${fieldValueWords('reading_set', 'windingTemperatureC', after.windingTemperatureC, ctx)} °C`
        : '';
    return `${p} imported ${rows}${file ? ` from ${quoted(file)}` : ''} into ${name}${temp}`;
  }
  if (a.action === 'update') {
    const keys = Object.keys(after);
    if (keys.length === 1 && keys[0] === 'isReference') {
      return after.isReference
        ? `${p} marked ${name} as the reference`
        : `${p} took the reference mark off ${name} (another set of the same kind became the reference)`;
    }
    const changes = changesInWords('reading_set', before, after, ctx);
    const note = a.note && !/^(Session|Reading set) corrected$/.test(a.note) ? a.note : null;
    return withNote(`${p} corrected ${name}${changes ? `: ${changes}` : ''}`, note);
  }
  if (a.action === 'delete') return withNote(`${p} removed ${name}`, a.note);
  return generic(a, p, ctx);
}

function screeningSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const after = fields(a.after);
  if (a.action !== 'screen') return generic(a, p, ctx);
  const rec = word(RECOMMENDATION_LABELS, after.recommendation) ?? 'no recommendation';
  const set = typeof after.criteriaVersion === 'number' ? ` (criteria set ${after.criteriaVersion})` : '';
  const missing = Array.isArray(after.missing) && after.missing.length ? `; ${countWords(after.missing.length, 'required test', 'required tests')} missing` : '';
  const what = after.comparison === true ? 'a comparison screening, not for decision' : 'the screening';
  return `${p} ran ${what}: ${rec}${set}${missing}`;
}

function followUpSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const before = fields(a.before);
  const after = fields(a.after);
  const task = text(after.task) ?? ctx.followUp?.(a.entityId) ?? null;
  const name = task ? `the follow-up ${quoted(task)}` : 'a follow-up';
  if (a.action === 'create') {
    const due = text(after.dueAt);
    return `${p} set ${name}, due ${due ? dayAndTime(due, ctx.timeZone) : 'when convenient'}`;
  }
  if (a.action === 'update') {
    if ('closedAt' in after) {
      const result = text(after.result);
      return `${p} closed ${name}${result ? `: ${quoted(result)}` : ''}`;
    }
    if ('dueAt' in after) {
      const due = text(after.dueAt);
      const was = text(before.dueAt);
      const sentence = `${ucFirst(name)} is now due ${due ? dayAndTime(due, ctx.timeZone) : 'when convenient'}${was ? ` (was ${dayAndTime(was, ctx.timeZone)})` : ''}`;
      return a.note && /re-energis/i.test(a.note) ? `${sentence}, counted from re-energising recorded by ${p}` : `${sentence}, moved by ${p}`;
    }
    const changes = changesInWords('follow_up', before, after, ctx);
    return withNote(`${p} changed ${name}${changes ? `: ${changes}` : ''}`, a.note);
  }
  return generic(a, p, ctx);
}

function userSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const before = fields(a.before);
  const after = fields(a.after);
  const name = text(after.name) ?? text(before.name) ?? ctx.person(Number(a.entityId)) ?? 'a person';
  if (a.action === 'create') {
    const roles = Array.isArray(after.roles) && after.roles.length ? ` (${fieldValueWords('user', 'roles', after.roles, ctx)})` : '';
    return `${p} added ${name}${roles}`;
  }
  if (a.action === 'sign-in-lock') return `Sign-in of ${name} locked after too many failed attempts`;
  if (a.action === 'update') {
    const note = a.note ?? '';
    if (/password reset/i.test(note)) return `${p} issued a one-time password to ${name}`;
    if (/sign-in unlocked/i.test(note)) return `${p} unlocked the sign-in of ${name}`;
    if (/password changed by its owner/i.test(note)) return `${p} changed their own password`;
    const changes = changesInWords('user', before, after, ctx);
    return withNote(`${p} changed ${name}${changes ? `: ${changes}` : ''}`, a.note);
  }
  return generic(a, p, ctx);
}

/** unit, design, site: the record named by its serial, reference or name. */
function fleetSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const before = fields(a.before);
  const after = fields(a.after);
  const key = a.entity === 'unit' ? 'serial' : a.entity === 'design' ? 'reference' : 'name';
  const label = text(after[key]) ?? text(before[key]);
  const noun = ENTITY_WORDS[a.entity];
  const name = label ? `the ${noun} ${label}` : `a ${noun}`;
  if (a.action === 'create') return withNote(`${p} added ${name}`, a.note);
  if (a.action === 'update') {
    const changes = changesInWords(a.entity, before, after, ctx);
    return withNote(`${p} changed ${name}${changes ? `: ${changes}` : ''}`, a.note);
  }
  return generic(a, p, ctx);
}

function sweepTraceSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const f = fields(a.action === 'delete' ? a.before : a.after);
  const label = text(f.label);
  const where = [
    word(WINDING_LABELS, f.winding),
    text(f.phase) ? `phase ${f.phase}` : null,
    word(SWEEP_TEST_LABELS, f.testType),
    typeof f.pointCount === 'number' ? countWords(f.pointCount, 'point', 'points') : null,
  ].filter(Boolean);
  const name = `the sweep trace${label ? ` ${quoted(label)}` : ''}${where.length ? ` (${where.join(', ')})` : ''}`;
  if (a.action === 'create') return `${p} uploaded ${name}`;
  if (a.action === 'delete') return `${p} removed ${name}`;
  return generic(a, p, ctx);
}

/** criteria_set: a draft made from a version, a draft changed (the leaves that changed, in words), a version published. */
function criteriaSetSentence(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const after = fields(a.after);
  const v = typeof after.version === 'number' ? ` ${after.version}` : '';
  if (a.action === 'create') {
    const from = typeof after.fromVersion === 'number' ? ` from version ${after.fromVersion}` : '';
    const name = text(after.name);
    return withNote(`${p} drafted criteria set${v}${from}${name ? ` (${quoted(name)})` : ''}`, a.note);
  }
  if (a.action === 'update') {
    const changes = Array.isArray(after.changes) ? after.changes.map(fields) : [];
    const shown = changes.slice(0, 5).map((c) => {
      const label = text(c.label) ?? 'a threshold';
      const value = (x: unknown) => (x === null || x === undefined ? 'none' : typeof x === 'object' ? 'values' : typeof x === 'string' ? quoted(x) : String(x));
      return `${inSentence(label)} ${value(c.from)} → ${value(c.to)}`;
    });
    const more = changes.length > 5 ? `; and ${countWords(changes.length - 5, 'more change', 'more changes')}` : '';
    const notes = JSON.stringify(fields(a.before).notes ?? null) !== JSON.stringify(after.notes ?? null) ? `${shown.length ? '; ' : ''}notes changed` : '';
    const what = `${shown.join('; ')}${more}${notes}`;
    return withNote(`${p} changed the draft criteria set${v}${what ? `: ${what}` : ''}`, a.note);
  }
  if (a.action === 'publish') return withNote(`${p} published criteria set${v}: it can no longer change and screenings now use it`, a.note);
  return generic(a, p, ctx);
}

function sentenceOf(a: AuditEntryFacts, ctx: AuditWordsContext): string {
  const p = who(a.userId, ctx);
  const after = fields(a.after);
  switch (a.entity) {
    case 'fault_event':
      return faultEventSentence(a, p, ctx);
    case 'reading_set':
      return readingSetSentence(a, p, ctx);
    case 'screening':
      return screeningSentence(a, p, ctx);
    case 'follow_up':
      return followUpSentence(a, p, ctx);
    case 'finding':
      if (a.action === 'create') {
        const cls = word(FINDING_LABELS, after.classification);
        const t = text(after.text);
        return `${p} recorded a finding${cls ? `: ${cls}` : ''}${t ? ` — ${quoted(t)}` : ''}`;
      }
      break;
    case 'attachment':
      if (a.action === 'create') {
        const name = text(after.name);
        const kind = ATTACHMENT_KIND_LABELS[String(after.kind)];
        const where = after.findingId !== undefined ? ' to a finding' : '';
        return `${p} attached ${name ? quoted(name) : 'a file'}${where}${kind ? ` (${inSentence(kind)})` : ''}`;
      }
      break;
    case 'sweep_trace':
      return sweepTraceSentence(a, p, ctx);
    case 'criteria_set':
      return criteriaSetSentence(a, p, ctx);
    case 'notification':
      if (a.action === 'create') {
        const kind = NOTIFICATION_KIND_LABELS[String(after.kind)];
        const to = text(after.to);
        return `${p} ${after.resentFrom !== undefined ? 'resent' : 'queued'} the ${kind ? inSentence(kind) : 'e-mail'}${to ? ` to ${to}` : ''}`;
      }
      break;
    case 'user':
      return userSentence(a, p, ctx);
    case 'unit':
    case 'design':
    case 'site':
      return fleetSentence(a, p, ctx);
  }
  return generic(a, p, ctx);
}

const VERBS: Record<string, string> = {
  create: 'added',
  update: 'changed',
  delete: 'deleted',
  import: 'imported into',
  screen: 'screened',
  decide: 'decided on',
  'sign-in-lock': 'locked the sign-in of',
};

/** Any other action or record, still in words: "Sam Admin changed the design family: …". */
function generic(a: AuditEntryFacts, p: string, ctx: AuditWordsContext): string {
  const verb = VERBS[a.action] ?? lowerFirst(fieldLabel('', a.action));
  const noun = ENTITY_WORDS[a.entity] ?? lowerFirst(fieldLabel('', a.entity));
  const changes = changesInWords(a.entity, a.before, a.after, ctx);
  return withNote(`${p} ${verb} ${/^[aeiou]/i.test(noun) ? 'an' : 'a'} ${noun}${changes ? `: ${changes}` : ''}`, a.note);
}

/** The entry as one sentence, ending with a full stop. */
export function auditSentence(a: AuditEntryFacts, ctx: AuditWordsContext): string {
  const s = sentenceOf(a, ctx).trim();
  return /[.!?…]”?$/.test(s) ? s : `${s}.`;
}

/** "1 entry", "4 entries", "no entries". */
export function auditEntriesCount(n: number): string {
  return countWords(n, 'entry', 'entries');
}
