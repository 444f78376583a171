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
  const repo = manager.getRepository(AuditEntry);
  await repo.save(
    repo.create({
    userId: a.userId,
    action: a.action,
    entity: a.entity,
    entityId: String(a.entityId),
    before: (a.before ?? null) as AuditEntry['before'],
    after: (a.after ?? null) as AuditEntry['after'],
    highlighted: a.highlighted ?? false,
    note: a.note ?? null,
    }),
  );
}
