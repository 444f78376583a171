// The audit trail's hash chain: the canonical text of one audit entry, which the server hashes with SHA-256
// (server/common/audit-hash.ts). Each entry's text carries the hash of the entry before it (`prevHash`), so changing,
// deleting or reordering a stored entry breaks the chain from that entry on. Pure: no I/O, no Node modules.

/** The `prevHash` of the first entry of a chain: 64 zeros. */
export const GENESIS_HASH = '0'.repeat(64);

/** What the chain covers of one audit entry: every column but `hash` itself. */
export interface AuditChainFacts {
  id: number;
  at: Date;
  userId: number | null;
  action: string;
  entity: string;
  entityId: string;
  before: unknown;
  after: unknown;
  highlighted: boolean;
  note: string | null;
}

/**
 * JSON with object keys sorted (by UTF-16 code units, as Array.prototype.sort does), no spaces, keys whose value is
 * undefined left out, as JSON.stringify writes values otherwise (so a value reads back from a JSON column to the same
 * text). Arrays keep their order; undefined in an array is written as null, as JSON.stringify does.
 */
export function canonicalJson(value: unknown): string {
  if (value === undefined) return 'null';
  if (value === null || typeof value !== 'object') {
    const s = JSON.stringify(value);
    return s === undefined ? 'null' : s;
  }
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined || typeof v === 'function' ? 'null' : canonicalJson(v))).join(',')}]`;
  const obj = value as Record<string, unknown>;
  const withToJson = obj as { toJSON?: () => unknown };
  if (typeof withToJson.toJSON === 'function') return canonicalJson(withToJson.toJSON());
  const keys = Object.keys(obj)
    .filter((k) => obj[k] !== undefined && typeof obj[k] !== 'function')
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
}

/**
 * A value as a JSON column gives it back: through JSON text and back (dates become ISO strings, undefined keys
 * vanish, -0 becomes 0); undefined and a top-level "null" become null. What audit() stores and what the chain hashes.
 */
export function asStoredJson(value: unknown): unknown {
  if (value === undefined) return null;
  const text = JSON.stringify(value);
  return text === undefined ? null : (JSON.parse(text) as unknown);
}

/**
 * The text one entry's hash is taken over: canonical JSON of
 * {action, after, at (ISO 8601 UTC, milliseconds), before, entity, entityId, highlighted, id, note, prevHash, userId}.
 */
export function auditChainText(e: AuditChainFacts, prevHash: string): string {
  return canonicalJson({
    id: e.id,
    at: e.at.toISOString(),
    userId: e.userId,
    action: e.action,
    entity: e.entity,
    entityId: e.entityId,
    before: asStoredJson(e.before),
    after: asStoredJson(e.after),
    highlighted: e.highlighted,
    note: e.note,
    prevHash,
  });
}
