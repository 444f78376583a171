import { createHash } from 'node:crypto';
import { auditChainText, type AuditChainFacts } from '../../shared/audit-chain.js';

/** SHA-256 (hex) of an entry's canonical text (shared/audit-chain.ts), which includes the previous entry's hash. */
export function auditEntryHash(e: AuditChainFacts, prevHash: string): string {
  return createHash('sha256').update(auditChainText(e, prevHash), 'utf8').digest('hex');
}

/**
 * The columns of `audit_entry` as the chain reads them in raw SQL: the JSON columns as their stored text (CAST, so the
 * driver's own JSON handling plays no part), then parsed once here.
 */
export const AUDIT_CHAIN_COLUMNS =
  '`id`, `at`, `userId`, `action`, `entity`, `entityId`, CAST(`before` AS CHAR) AS `before`, CAST(`after` AS CHAR) AS `after`, `highlighted`, `note`';

export interface RawAuditRow {
  id: number | string;
  at: Date | string;
  userId: number | string | null;
  action: string;
  entity: string;
  entityId: string;
  before: string | null;
  after: string | null;
  highlighted: number | string | boolean;
  note: string | null;
}

/** A row read with AUDIT_CHAIN_COLUMNS (on a connection with timezone 'Z') → what the chain hashes. */
export function factsFromRaw(r: RawAuditRow): AuditChainFacts {
  return {
    id: Number(r.id),
    at: r.at instanceof Date ? r.at : new Date(`${String(r.at).replace(' ', 'T')}Z`),
    userId: r.userId === null ? null : Number(r.userId),
    action: r.action,
    entity: r.entity,
    entityId: r.entityId,
    before: r.before === null ? null : (JSON.parse(r.before) as unknown),
    after: r.after === null ? null : (JSON.parse(r.after) as unknown),
    highlighted: Boolean(Number(r.highlighted)),
    note: r.note,
  };
}
