import type { EntityManager } from 'typeorm';
import { asStoredJson, GENESIS_HASH, type AuditChainFacts } from '../../shared/audit-chain.js';
import { AUDIT_CHAIN_COLUMNS, auditEntryHash, factsFromRaw, type RawAuditRow } from './audit-hash.js';
import type { Clock } from './clock.js';

export interface AuditInput {
  userId: number | null;
  action: 'create' | 'update' | 'delete' | 'decide' | 'screen' | 'import' | 'sign-in-lock' | string;
  entity: string;
  entityId: string | number;
  before?: unknown;
  after?: unknown;
  highlighted?: boolean;
  note?: string;
}

/**
 * Records one audited write inside the caller's transaction, dated by the clock, chained to the entry before it.
 *
 * The chain head (`audit_chain_head`, one row: the newest entry's id and hash) is read with a locking read, so a
 * second transaction that audits waits here until the first commits or rolls back, then reads the new head. Under that
 * lock the entry gets the next id (head id + 1) and its hash is computed before the INSERT, over its content, its id
 * and the previous hash; the head is moved on in the same transaction. So the app's database account needs only
 * INSERT and SELECT on `audit_entry`, and a rolled-back write leaves neither an entry nor a moved head.
 * Called outside a transaction (a plain manager), it opens one of its own.
 */
export async function audit(m: EntityManager, clock: Clock, a: AuditInput): Promise<void> {
  if (!m.queryRunner?.isTransactionActive) {
    await m.transaction((tx) => audit(tx, clock, a));
    return;
  }
  const heads: { lastId: number; lastHash: string }[] = await m.query('SELECT `lastId`, `lastHash` FROM `audit_chain_head` WHERE `id` = 1 FOR UPDATE');
  if (!heads.length) throw new Error('audit_chain_head has no row: run the migrations (npm run db:migrate)');
  const prevHash = heads[0].lastHash;
  const facts: AuditChainFacts = {
    id: Number(heads[0].lastId) + 1,
    at: clock.now(),
    userId: a.userId,
    action: a.action,
    entity: a.entity,
    entityId: String(a.entityId),
    before: asStoredJson(a.before),
    after: asStoredJson(a.after),
    highlighted: a.highlighted ?? false,
    note: a.note ?? null,
  };
  const hash = auditEntryHash(facts, prevHash);
  const json = (v: unknown) => (v === null ? null : JSON.stringify(v));
  await m.query(
    'INSERT INTO `audit_entry` (`id`, `at`, `userId`, `action`, `entity`, `entityId`, `before`, `after`, `highlighted`, `note`, `prevHash`, `hash`) ' +
      'VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)',
    [facts.id, facts.at, facts.userId, facts.action, facts.entity, facts.entityId, json(facts.before), json(facts.after), facts.highlighted, facts.note, prevHash, hash],
  );
  await m.query('UPDATE `audit_chain_head` SET `lastId` = ?, `lastHash` = ? WHERE `id` = 1', [facts.id, hash]);
}

/** Where the chain breaks: the first entry concerned, what happened, and a sentence saying so. */
export interface AuditChainBreak {
  id: number;
  kind: 'changed' | 'deleted' | 'reordered';
  message: string;
}

export type AuditChainReport = { intact: true; entries: number } | { intact: false; entries: number; broken: AuditChainBreak };

const BATCH = 1000;

interface ChainRow {
  facts: AuditChainFacts;
  id: number;
  prevHash: string;
  hash: string;
}

const range = (from: number, to: number) => (from === to ? `entry ${from} is` : `entries ${from}–${to} are`);

/**
 * Walks the audit trail in id order inside one read-only snapshot and reports the first break: an entry whose content
 * no longer matches its hash (changed), an entry whose link does not name the entry before it (entries deleted, an
 * entry rewritten with a fresh hash, or entries moved), newest entries missing against the chain head.
 */
export async function verifyAuditChain(m: EntityManager): Promise<AuditChainReport> {
  return m.transaction('REPEATABLE READ', async (tx) => {
    const heads: { lastId: number; lastHash: string }[] = await tx.query('SELECT `lastId`, `lastHash` FROM `audit_chain_head` WHERE `id` = 1');
    const idOfHash = async (hash: string): Promise<number | null> => {
      const rows: { id: number }[] = await tx.query('SELECT `id` FROM `audit_entry` WHERE `hash` = ? ORDER BY `id` LIMIT 1', [hash]);
      return rows.length ? Number(rows[0].id) : null;
    };
    const idOfPrevHash = async (hash: string): Promise<number | null> => {
      const rows: { id: number }[] = await tx.query('SELECT `id` FROM `audit_entry` WHERE `prevHash` = ?', [hash]);
      return rows.length ? Number(rows[0].id) : null;
    };
    let prev: ChainRow | null = null;
    let entries = 0;
    const broken = (b: AuditChainBreak): AuditChainReport => ({ intact: false, entries, broken: b });
    for (;;) {
      const raw: (RawAuditRow & { prevHash: string; hash: string })[] = await tx.query(
        `SELECT ${AUDIT_CHAIN_COLUMNS}, \`prevHash\`, \`hash\` FROM \`audit_entry\` WHERE \`id\` > ? ORDER BY \`id\` LIMIT ${BATCH}`,
        [prev ? prev.id : 0],
      );
      if (!raw.length) break;
      for (const x of raw) {
        const facts = factsFromRaw(x);
        const r: ChainRow = { facts, id: facts.id, prevHash: x.prevHash, hash: x.hash };
        const expectedPrev = prev ? prev.hash : GENESIS_HASH;
        if (auditEntryHash(r.facts, r.prevHash) !== r.hash) {
          // Content changed, or a whole entry moved to another id: ids are handed out one after the other, so it was
          // written either right after the entry it links to, or right before the entry that links to it.
          const linked = r.prevHash === GENESIS_HASH ? 0 : await idOfHash(r.prevHash);
          const next = await idOfPrevHash(r.hash);
          const candidates = [linked === null ? null : linked + 1, next === null ? null : next - 1];
          const writtenAs = candidates.find((c) => c !== null && c > 0 && c !== r.id && auditEntryHash({ ...r.facts, id: c }, r.prevHash) === r.hash);
          if (writtenAs) {
            return broken({ id: r.id, kind: 'reordered', message: `entry ${r.id} holds the entry written as entry ${writtenAs}: entries were reordered` });
          }
          return broken({ id: r.id, kind: 'changed', message: `entry ${r.id} was changed after it was written: its content no longer matches its hash` });
        }
        if (r.prevHash !== expectedPrev) {
          const linked = await idOfHash(r.prevHash);
          if (linked !== null && linked >= r.id) {
            return broken({ id: r.id, kind: 'reordered', message: `entry ${r.id} links to entry ${linked}, which comes after it: entries were reordered` });
          }
          if (!prev) {
            return broken({ id: r.id, kind: 'deleted', message: `entries before entry ${r.id} were deleted: the first entry left links to an entry that no longer exists` });
          }
          if (r.id > prev.id + 1) {
            return broken({
              id: prev.id + 1,
              kind: 'deleted',
              message: `${range(prev.id + 1, r.id - 1)} missing (deleted): entry ${r.id} does not link to entry ${prev.id}`,
            });
          }
          return broken({
            id: prev.id,
            kind: 'changed',
            message: `entry ${prev.id} was rewritten with a new hash: entry ${r.id} links to a different entry ${prev.id}`,
          });
        }
        prev = r;
        entries++;
      }
    }
    const head = heads[0] ?? { lastId: 0, lastHash: GENESIS_HASH };
    const lastId = prev ? prev.id : 0;
    if (Number(head.lastId) > lastId) {
      return broken({
        id: lastId + 1,
        kind: 'deleted',
        message: `${range(lastId + 1, Number(head.lastId))} missing (deleted): the chain head names entry ${head.lastId} as the newest`,
      });
    }
    if (!heads.length || Number(head.lastId) !== lastId || head.lastHash !== (prev ? prev.hash : GENESIS_HASH)) {
      return broken({
        id: lastId,
        kind: 'changed',
        message: `the newest entry (${lastId}) is not the one the chain head names (entry ${head.lastId}): the head or the entry was changed`,
      });
    }
    return { intact: true, entries };
  });
}
