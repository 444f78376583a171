import type { z } from 'zod';
import { defOf, isCoerced, lengthBounds, numberBounds, objectMode, sampleValue, unwrap } from './schema-walk.js';

// Bad values for every field of a route's params, query and body, generated from the zod schema and a known-good base
// value: wrong type, out of range, too long, a lone surrogate, formula text, an unknown extra key, too many entries.

export type Part = 'params' | 'query' | 'body';
/** How a part travels: a path segment, a query string, a JSON body or multipart form fields (all text). */
export type Carrier = 'params' | 'query' | 'json' | 'multipart';
export type MutationKind = 'wrong-type' | 'out-of-range' | 'too-long' | 'lone-surrogate' | 'formula' | 'unknown-key' | 'too-many';

export interface FieldMutation {
  part: Part;
  /** Dotted path inside the part ('shots.0.currentKA'); '' for the part itself. */
  field: string;
  kind: MutationKind;
  /** What was sent, in words ('1e308', '121 characters'). */
  detail: string;
  /** Names the error may carry, one is enough (a `fields` key segment, or a word of a message). */
  names: string[];
  /**
   * `refuse`: a 4xx naming the field, nothing written. `no-500`: formula text, which a text field may store (exports
   * escape it) or refuse: no 5xx, and nothing deleted.
   */
  expect: 'refuse' | 'no-500';
  /** The part's new value, from the base's (a copy; the base is not touched). */
  apply(part: unknown): unknown;
}

export const FORMULA = '=HYPERLINK("http://x")';
export const LONE_SURROGATE = 'ab\ud800cd';
/** Length of an unbounded string: 100 000 characters (10 000 in a URL, whose headers Node caps at 16 KB). */
const UNBOUNDED_TEXT = { json: 100_000, multipart: 100_000, query: 10_000, params: 10_000 } as const;
/** Entries of a list or keyed section without a declared limit: a thousand (a unit has a handful of configurations,
 * phases, gases or bushings; the issue's probe sent 10 000, which costs ten times as long to send and answers alike). */
const MANY = 1000;

type Path = (string | number)[];
const clone = <T>(v: T): T => (v === undefined ? v : structuredClone(v));
const dotted = (p: Path) => p.map(String).join('.');
/** The last named (non-index) segment of a path. */
const lastName = (p: Path, fallback: string) => [...p].reverse().find((s) => typeof s === 'string') ?? fallback;

function setAt(root: unknown, path: Path, value: unknown): unknown {
  if (!path.length) return value;
  const out = (clone(root) ?? (typeof path[0] === 'number' ? [] : {})) as Record<string | number, unknown>;
  let cur = out;
  for (let i = 0; i < path.length - 1; i++) {
    const k = path[i]!;
    if (cur[k] === undefined || cur[k] === null || typeof cur[k] !== 'object') cur[k] = typeof path[i + 1] === 'number' ? [] : {};
    cur = cur[k] as Record<string | number, unknown>;
  }
  cur[path[path.length - 1]!] = value;
  return out;
}

const getAt = (root: unknown, path: Path): unknown => path.reduce<unknown>((v, k) => (v && typeof v === 'object' ? (v as Record<string | number, unknown>)[k] : undefined), root);

/**
 * A stand-in for an object nested `depth` levels deep ({ "a": { "a": … 1 } }): JSON.stringify (and the test client's
 * serializer) overflow the stack long before 5 000 levels, so the body is sent through `jsonText`, which writes it out.
 */
export const nested = (depth: number): string => `\u0000nested:${depth}`;

/** A body as JSON text, each `nested()` stand-in written out as its nested object. */
export function jsonText(body: unknown): string {
  return JSON.stringify(body).replace(/"\\u0000nested:(\d+)"/g, (_, d: string) => '{"a":'.repeat(Number(d)) + '1' + '}'.repeat(Number(d)));
}

interface Walk {
  part: Part;
  carrier: Carrier;
  out: FieldMutation[];
  seen: SeenSchemas;
}

/** Schemas already mutated, across routes (see `firstVisit` and `firstLeafVisit`). */
export class SeenSchemas {
  /** Nested objects and keyed sections (the same schema object under another field or route). */
  readonly nested = new WeakSet<object>();
  /** Leaf schemas with the part and path each was met at. */
  readonly leaves = new WeakMap<object, Set<string>>();
}

/**
 * A nested object or keyed section seen before (the reading-set sections serve four routes and four places in a case):
 * its fields were mutated where it was first met; here only the container itself is (its validation is the same code).
 */
function firstVisit(w: Walk, s: z.ZodType): boolean {
  if (w.seen.nested.has(s)) return false;
  w.seen.nested.add(s);
  return true;
}

const textual = (c: Carrier) => c !== 'json';

/** Every mutation of a part's schema, given the part's known-good value. */
export function mutationsOf(schema: z.ZodType, base: unknown, part: Part, carrier: Carrier, seen = new SeenSchemas()): FieldMutation[] {
  const w: Walk = { part, carrier, out: [], seen };
  walk(w, schema, base, []);
  return w.out;
}

function add(w: Walk, path: Path, kind: MutationKind, detail: string, value: (cur: unknown) => unknown, opts: { names?: string | string[]; expect?: FieldMutation['expect'] } = {}) {
  w.out.push({
    part: w.part,
    field: dotted(path),
    kind,
    detail,
    names: [opts.names ?? lastName(path, w.part)].flat(),
    expect: opts.expect ?? 'refuse',
    apply: (root) => setAt(root, path, value(getAt(root, path))),
  });
}

/**
 * A leaf met before at the same part and path (the create and the patch schema of a record share their field schemas;
 * so do a session and a unit's reading set): mutated once, where first met.
 */
function firstLeafVisit(w: Walk, s: z.ZodType, path: Path): boolean {
  const at = `${w.part}:${dotted(path)}`;
  const paths = w.seen.leaves.get(s) ?? new Set<string>();
  w.seen.leaves.set(s, paths);
  if (paths.has(at)) return false;
  paths.add(at);
  return true;
}

const LEAVES = ['string', 'number', 'boolean', 'enum', 'literal'];

function walk(w: Walk, schema: z.ZodType, sample: unknown, path: Path): void {
  const s = unwrap(schema);
  const d = defOf(s);
  if (LEAVES.includes(d.type) && w.part !== 'params' && !firstLeafVisit(w, s, path)) return;
  switch (d.type) {
    case 'object':
      return walkObject(w, s, sample, path);
    case 'record':
      return walkRecord(w, s, sample, path);
    case 'array':
      return walkArray(w, s, sample, path);
    case 'tuple': {
      if (path.length) add(w, path, 'wrong-type', 'text instead of a list', () => 'text');
      const items = d.items as z.ZodType[];
      items.forEach((item, i) => walk(w, item, Array.isArray(sample) ? sample[i] : undefined, [...path, i]));
      return;
    }
    case 'union':
      return walkUnion(w, s, sample, path);
    case 'string':
      return walkString(w, s, sample, path);
    case 'number':
      return walkNumber(w, s, path);
    case 'boolean':
      add(w, path, 'wrong-type', textual(w.carrier) ? 'two values' : '"yes" instead of true/false', () => (textual(w.carrier) ? ['true', 'false'] : 'yes'));
      return;
    case 'enum':
    case 'literal': {
      const options = d.type === 'enum' ? Object.values(d.entries as Record<string, unknown>) : (d.values as unknown[]);
      walkChoice(w, options, path);
      return;
    }
    case 'unknown':
    case 'any':
      // Checked by the service (criteria thresholds): a text is no threshold table.
      if (path.length && w.carrier === 'json') add(w, path, 'wrong-type', 'text instead of an object', () => 'text');
      return;
    default:
      return;
  }
}

function walkChoice(w: Walk, options: unknown[], path: Path) {
  const numeric = options.every((o) => typeof o === 'number');
  if (textual(w.carrier)) {
    add(w, path, 'wrong-type', 'two values', () => options.slice(0, 2).map(String).concat(options.length < 2 ? ['x'] : []));
  } else add(w, path, 'wrong-type', numeric ? 'text instead of a number' : 'a number instead of text', () => (numeric ? 'three' : 42));
  const outside = numeric ? Math.max(...(options as number[])) + 1 : 'not-an-option';
  add(w, path, 'out-of-range', `${JSON.stringify(outside)}, not one of the choices`, () => (textual(w.carrier) ? String(outside) : outside));
}

function walkString(w: Walk, s: z.ZodType, sample: unknown, path: Path) {
  const { max } = lengthBounds(s);
  const isDate = typeof sample === 'string' && /^\d{4}-\d{2}-\d{2}/.test(sample);
  if (w.carrier === 'json') add(w, path, 'wrong-type', 'a number instead of text', () => 12345);
  else if (w.carrier !== 'params') add(w, path, 'wrong-type', 'the field twice', () => ['a', 'b']);
  const n = max !== undefined ? max + 1 : UNBOUNDED_TEXT[w.carrier];
  add(w, path, 'too-long', `${n} characters${max === undefined ? ' (no limit declared)' : ` (limit ${max})`}`, () => 'k'.repeat(n));
  // A lone surrogate travels only in JSON: a URL or a multipart field carries UTF-8 bytes, where it cannot be written.
  if (w.carrier === 'json') add(w, path, 'lone-surrogate', 'a lone UTF-16 surrogate', () => LONE_SURROGATE);
  if (isDate) {
    add(w, path, 'out-of-range', 'year 0001', () => '0001-01-01T00:00:00Z');
    // A stored date: an event or a test cannot lie decades ahead (a filter of a list may).
    if (w.part === 'body') add(w, path, 'out-of-range', 'year 2099', () => '2099-01-01T00:00:00Z');
    add(w, path, 'out-of-range', 'year 10000', () => '+010000-01-01T00:00:00Z');
  } else add(w, path, 'formula', 'formula text', () => FORMULA, { expect: 'no-500' });
}

function walkNumber(w: Walk, s: z.ZodType, path: Path) {
  const b = numberBounds(s);
  const asText = textual(w.carrier);
  const put = (v: number | string) => () => (asText ? String(v) : v);
  if (asText) add(w, path, 'wrong-type', '"abc"', put('abc'));
  else add(w, path, 'wrong-type', 'a numeric text instead of a number', () => '12');
  if (b.max !== undefined) add(w, path, 'out-of-range', `${b.maxInclusive ? b.max + 1 : b.max} (limit ${b.max})`, put(b.maxInclusive ? b.max + 1 : b.max));
  else add(w, path, 'out-of-range', '1e308 (no upper limit declared)', put(1e308));
  if (b.min !== undefined) add(w, path, 'out-of-range', `${b.minInclusive ? b.min - 1 : b.min} (limit ${b.min})`, put(b.minInclusive ? b.min - 1 : b.min));
  else add(w, path, 'out-of-range', '-1e308 (no lower limit declared)', put(-1e308));
  if (asText && isCoerced(s)) add(w, path, 'wrong-type', '"NaN"', put('NaN'));
}

function walkObject(w: Walk, s: z.ZodType, sample: unknown, path: Path) {
  const shape = defOf(s).shape as Record<string, z.ZodType>;
  const obj = sample && typeof sample === 'object' && !Array.isArray(sample) ? (sample as Record<string, unknown>) : undefined;
  if (path.length && w.carrier === 'json') add(w, path, 'wrong-type', 'text instead of an object', () => 'text');
  if (path.length && !firstVisit(w, s)) return;
  for (const [key, field] of Object.entries(shape)) {
    const inner = unwrap(field);
    const t = defOf(inner).type;
    // Fields the base leaves out: their own value is set; what is inside an absent object is not generated.
    if (obj?.[key] === undefined && ['object', 'record'].includes(t)) {
      if (w.carrier === 'json') add(w, [...path, key], 'wrong-type', 'text instead of an object', () => 'text');
      continue;
    }
    walk(w, field, obj?.[key], [...path, key]);
  }
  // Unknown keys: JSON and multipart bodies (a query's unknown parameters are not fields of the route).
  if (w.part === 'body') {
    add(w, [...path, 'unexpectedField'], 'unknown-key', `an unknown key (${objectMode(s)} object)`, () => (w.carrier === 'json' ? 1 : '1'), { names: 'unexpectedField' });
  }
  if (!path.length && w.carrier === 'json') {
    // Too deep is a fault of the body as a whole: named by the key or as `(body)`.
    for (const depth of [40, 5000]) add(w, ['unexpectedField'], 'unknown-key', `an unknown key nested ${depth} deep`, () => nested(depth), { names: ['unexpectedField', '(body)'] });
  }
}

function walkRecord(w: Walk, s: z.ZodType, sample: unknown, path: Path) {
  const d = defOf(s);
  const keyType = unwrap(d.keyType as z.ZodType);
  const valueType = d.valueType as z.ZodType;
  const obj = sample && typeof sample === 'object' && !Array.isArray(sample) ? (sample as Record<string, unknown>) : {};
  const names = lastName(path, w.part);
  if (w.carrier !== 'json') return;
  add(w, path, 'wrong-type', 'text instead of an object', () => 'text');
  if (!firstVisit(w, s)) return;
  const first = Object.keys(obj)[0];
  const value = first !== undefined ? obj[first] : sampleValue(valueType);
  const { max } = lengthBounds(keyType);
  const keyLen = max !== undefined ? max + 1 : UNBOUNDED_TEXT.json;
  const withKey = (k: string) => (cur: unknown) => ({ ...(cur as object), [k]: clone(value) });
  if (value !== undefined) {
    add(w, path, 'too-long', `a label of ${keyLen} characters${max === undefined ? ' (no limit declared)' : ` (limit ${max})`}`, withKey('k'.repeat(keyLen)), { names });
    add(w, path, 'lone-surrogate', 'a label with a lone UTF-16 surrogate', withKey(LONE_SURROGATE), { names });
    add(w, path, 'too-many', `${MANY} entries`, (cur) => ({ ...(cur as object), ...Object.fromEntries(Array.from({ length: MANY }, (_, i) => [`K${i}`, clone(value)])) }), { names });
  }
  if (first !== undefined) walk(w, valueType, obj[first], [...path, first]);
}

function walkArray(w: Walk, s: z.ZodType, sample: unknown, path: Path) {
  const d = defOf(s);
  const element = d.element as z.ZodType;
  const list = Array.isArray(sample) ? sample : [];
  const { max } = lengthBounds(s);
  if (w.carrier === 'query' && defOf(unwrap(element)).type === 'string') {
    // One or several values of a list (`status=testing,released`): an unknown one, and one too long for a URL's field.
    add(w, path, 'out-of-range', '"not-an-option", not one of the choices', () => 'not-an-option');
    add(w, path, 'too-long', `${UNBOUNDED_TEXT.query} characters`, () => 'k'.repeat(UNBOUNDED_TEXT.query));
  }
  if (w.carrier !== 'json') return;
  add(w, path, 'wrong-type', 'text instead of a list', () => 'text');
  const item = list.length ? list[0] : sampleValue(element);
  if (item !== undefined) {
    const n = max !== undefined ? max + 1 : MANY;
    add(w, path, 'too-many', `${n} entries${max === undefined ? ' (no limit declared)' : ` (limit ${max})`}`, () => Array.from({ length: n }, () => clone(item)));
  }
  if (list.length) walk(w, element, list[0], [...path, 0]);
  else if (item !== undefined && ['enum', 'literal', 'string', 'number'].includes(defOf(unwrap(element)).type)) walk(w, element, item, [...path, 0]);
}

function walkUnion(w: Walk, s: z.ZodType, sample: unknown, path: Path) {
  const options = defOf(s).options as z.ZodType[];
  const plain = options.map((o) => defOf(unwrap(o)));
  if (plain.every((p) => p.type === 'literal')) return walkChoice(w, plain.flatMap((p) => p.values as unknown[]), path);
  if (w.carrier === 'json' && !plain.some((p) => p.type === 'boolean')) add(w, path, 'wrong-type', 'true instead of text or a number', () => true);
  // Inside the option the base value takes (a value of another option would be read by that one).
  const match = sample === undefined ? options[0] : options.find((o) => o.safeParse(sample).success);
  if (!match) return;
  const before = w.out.length;
  walk(w, match, sample, path);
  // Another option may take what this one refuses (a number for a text tap position): only in-type mutations remain.
  // When no option takes a value, zod names the union's own path: that name counts too.
  const inner = w.out.splice(before).filter((m) => m.field !== dotted(path) || m.kind !== 'wrong-type');
  w.out.push(...inner.map((m) => ({ ...m, names: [...m.names, lastName(path, w.part)] })));
}
