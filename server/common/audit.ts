import type { EntityManager } from 'typeorm';
import { AuditEntry } from './audit-entry.entity.js';

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

/** Records one audited write inside the caller's transaction. */
export async function audit(manager: EntityManager, a: AuditInput): Promise<void> {
  await manager.insert(AuditEntry, {
    userId: a.userId,
    action: a.action,
    entity: a.entity,
    entityId: String(a.entityId),
    before: a.before ?? null,
    after: a.after ?? null,
    highlighted: a.highlighted ?? false,
    note: a.note ?? null,
  });
}
