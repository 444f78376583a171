import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { AppError } from './app-error.js';

/** Field path → message, from zod issues (`shots.0.currentKA`). */
export function zodFields(error: z.ZodError, prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || prefix || '(body)';
    if (!fields[key]) fields[key] = issue.message;
  }
  return fields;
}

/** Parses a value with a schema or throws a 400 naming every bad field. */
export function parseOr400<T extends z.ZodType>(schema: T, value: unknown, prefix = ''): z.infer<T> {
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
