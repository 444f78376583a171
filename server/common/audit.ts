import type { EntityManager } from 'typeorm';
import { AuditEntry } from './audit-entry.entity.js';
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

/** Records one audited write inside the caller's transaction, dated by the clock. */
export async function audit(m: EntityManager, clock: Clock, a: AuditInput): Promise<void> {
  const repo = m.getRepository(AuditEntry);
  await repo.save(
    repo.create({
      at: clock.now(),
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
