import type { EntityManager, EntityTarget, FindOptionsWhere, ObjectLiteral } from 'typeorm';
import { AppError, notFound } from './app-error.js';
import { audit } from './audit.js';
import type { Clock } from './clock.js';

/** What the audited row helpers need to know of an entity: its audit name, its name in messages and its view. */
export interface AuditedKind<E extends ObjectLiteral & { id: number }, V> {
  target: EntityTarget<E>;
  /** The audit trail's entity name, e.g. `site`. */
  entity: string;
  /** The name in a not-found message, e.g. `Site`. */
  label: string;
  view: (row: E) => V;
}

/** 409 `<field>_taken` when another row already has this value in a unique field. */
export async function assertUnique<E extends ObjectLiteral & { id: number }>(
  m: EntityManager,
  target: EntityTarget<E>,
  field: keyof E & string,
  value: unknown,
  message: string,
  exceptId?: number,
): Promise<void> {
  const other = await m.getRepository(target).findOne({ where: { [field]: value } as FindOptionsWhere<E> });
  if (other && other.id !== exceptId) throw new AppError(`${field}_taken`, message, 409, { [field]: 'already in use' });
}

/** Saves a new row and audits its view as `create`; returns the view. */
export async function createAudited<E extends ObjectLiteral & { id: number }, V>(
  m: EntityManager,
  clock: Clock,
  userId: number,
  kind: AuditedKind<E, V>,
  values: Partial<E>,
): Promise<V> {
  const repo = m.getRepository(kind.target);
  const row = await repo.save(repo.create(values as E));
  await audit(m, clock, { userId, action: 'create', entity: kind.entity, entityId: row.id, after: kind.view(row) });
  return kind.view(row);
}

/**
 * Loads a row by id (404 when missing), runs the checks, applies the change, saves it and audits as `update` the view's
 * fields the change names (`fields`, the patch's keys) before and after; returns the whole view.
 */
export async function updateAudited<E extends ObjectLiteral & { id: number }, V>(
  m: EntityManager,
  clock: Clock,
  userId: number,
  kind: AuditedKind<E, V>,
  id: number,
  change: { check?: (row: E) => Promise<void>; apply: (row: E) => void; fields: readonly string[] },
): Promise<V> {
  const repo = m.getRepository(kind.target);
  const row = await repo.findOne({ where: { id } as FindOptionsWhere<E> });
  if (!row) throw notFound(kind.label);
  await change.check?.(row);
  const before = kind.view(row);
  change.apply(row);
  await repo.save(row);
  const after = kind.view(row);
  await audit(m, clock, { userId, action: 'update', entity: kind.entity, entityId: id, before: pick(before, change.fields), after: pick(after, change.fields) });
  return after;
}

/** The named fields of a view (those it has), for an audit entry that shows only what a change named. */
export function pick<V>(view: V, fields: readonly string[]): Record<string, unknown> {
  const all = view as Record<string, unknown>;
  return Object.fromEntries(fields.filter((f) => Object.hasOwn(all, f)).map((f) => [f, all[f]]));
}

/** A parsed patch without its absent keys: what a PATCH writes (a key sent as null is kept: it clears the field). */
export function present<P extends object>(patch: P): Partial<P> {
  return Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as Partial<P>;
}
