import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { issueEntries, jsonDepth, MAX_BODY_DEPTH } from '../../shared/schemas/bounds.js';
import { AppError } from './app-error.js';

/** Field path → message, from zod issues (`shots.0.currentKA`); an unknown key is named by its own path
 * (`readingSets.0.capacitancePF.foo`: "unknown field"). */
export function zodFields(error: z.ZodError, prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of issueEntries(error.issues)) {
    const key = [prefix, ...issue.path].filter(Boolean).join('.') || prefix || '(body)';
    if (!fields[key]) fields[key] = issue.message;
  }
  return fields;
}

/** A 400 for a body nested deeper than MAX_BODY_DEPTH levels, before any schema walks it (no stack overflow). */
export function tooDeep(body: unknown): AppError | null {
  if (jsonDepth(body, MAX_BODY_DEPTH) <= MAX_BODY_DEPTH) return null;
  return new AppError('invalid_input', 'Some fields are invalid.', 400, { '(body)': `nested deeper than ${MAX_BODY_DEPTH} levels` });
}

/** Parses a value with a schema or throws a 400 naming every bad field. */
export function parseOr400<T extends z.ZodType>(schema: T, value: unknown, prefix = ''): z.infer<T> {
  const deep = tooDeep(value);
  if (deep) throw deep;
  const r = schema.safeParse(value);
  if (!r.success) throw new AppError('invalid_input', 'Some fields are invalid.', 400, zodFields(r.error, prefix));
  return r.data;
}

interface Parts {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

// Validates body, query and params; parsed values go to res.locals (Express 5's req.query is read-only).
export function validate(parts: Parts): RequestHandler {
  return (req, res, next) => {
    const deep = parts.body ? tooDeep(req.body) : null;
    if (deep) return next(deep);
    const fields: Record<string, string> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = parts[part];
      if (!schema) continue;
      const r = schema.safeParse(req[part] ?? {});
      if (r.success) res.locals[part] = r.data;
      else Object.assign(fields, zodFields(r.error, part === 'body' ? '' : part));
    }
    if (Object.keys(fields).length) return next(new AppError('invalid_input', 'Some fields are invalid.', 400, fields));
    next();
  };
}
