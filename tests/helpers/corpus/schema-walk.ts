import type { z } from 'zod';

// A small reader of zod 4 schemas (the parts the route schemas use): wrappers, objects, arrays, records, unions,
// enums, literals, numbers and strings with their bounds. Read through `_zod.def`, zod 4's public definition object.

type Def = Record<string, unknown> & { type: string; checks?: { _zod: { def: Record<string, unknown> } }[] };
export const defOf = (s: z.ZodType): Def => (s as unknown as { _zod: { def: Def } })._zod.def;

/** The schema a value is checked against once optional / nullable / default / pipe wrappers are looked through. */
export function unwrap(s: z.ZodType): z.ZodType {
  for (let i = 0; i < 20; i++) {
    const d = defOf(s);
    if (['optional', 'nullable', 'default', 'prefault', 'readonly', 'catch', 'nonoptional'].includes(d.type)) s = d.innerType as z.ZodType;
    // `.transform()` is pipe(schema → transform): the input is checked by `in`; `z.preprocess()` is pipe(transform → schema).
    else if (d.type === 'pipe') s = (defOf(d.in as z.ZodType).type === 'transform' ? d.out : d.in) as z.ZodType;
    else return s;
  }
  return s;
}

export interface Bounds {
  min?: number;
  minInclusive?: boolean;
  max?: number;
  maxInclusive?: boolean;
  /** z.int(): safe integers only. */
  int?: boolean;
}

/** A number's bounds from its checks. */
export function numberBounds(s: z.ZodType): Bounds {
  const b: Bounds = {};
  for (const c of defOf(s).checks ?? []) {
    const d = c._zod.def;
    if (d.check === 'greater_than') Object.assign(b, { min: d.value as number, minInclusive: d.inclusive as boolean });
    if (d.check === 'less_than') Object.assign(b, { max: d.value as number, maxInclusive: d.inclusive as boolean });
    if (d.check === 'number_format' && String(d.format).includes('int')) b.int = true;
  }
  return b;
}

/** A string's or array's length bounds from its checks. */
export function lengthBounds(s: z.ZodType): { min?: number; max?: number } {
  const b: { min?: number; max?: number } = {};
  for (const c of defOf(s).checks ?? []) {
    const d = c._zod.def;
    if (d.check === 'min_length') b.min = d.minimum as number;
    if (d.check === 'max_length') b.max = d.maximum as number;
    if (d.check === 'length_equals') b.min = b.max = d.length as number;
  }
  return b;
}

/** Whether an object schema refuses unknown keys (`z.strictObject`), keeps them (`z.looseObject`) or drops them. */
export function objectMode(s: z.ZodType): 'strict' | 'loose' | 'strip' {
  const catchall = defOf(s).catchall as z.ZodType | undefined;
  if (!catchall) return 'strip';
  return defOf(catchall).type === 'never' ? 'strict' : 'loose';
}

/** Whether a number is coerced from text (`z.coerce.number()`: query, params, multipart fields). */
export const isCoerced = (s: z.ZodType) => defOf(s).coerce === true;

/** A valid value of a simple schema (for list entries the base does not hold), or undefined when none is obvious. */
export function sampleValue(schema: z.ZodType): unknown {
  const s = unwrap(schema);
  const d = defOf(s);
  switch (d.type) {
    case 'enum':
      return Object.values(d.entries as Record<string, unknown>)[0];
    case 'literal':
      return (d.values as unknown[])[0];
    case 'boolean':
      return true;
    case 'number': {
      const b = numberBounds(s);
      const lo = b.min ?? 0;
      const hi = b.max ?? lo + 2;
      return b.int ? Math.ceil((lo + hi) / 2) || 1 : (lo + hi) / 2 || 1;
    }
    case 'string':
      return 'x'.repeat(Math.max(1, lengthBounds(s).min ?? 1));
    case 'union':
      return sampleValue((d.options as z.ZodType[])[0]!);
    case 'tuple':
      return (d.items as z.ZodType[]).map(sampleValue);
    default:
      return undefined;
  }
}
