import type { Transporter } from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import type { Clock } from '../../common/clock.js';
import { OUTCOME_LABELS } from '../../../shared/vocabulary.js';
import { buildDecisionMail } from '../../reports/decision-mail.js';
import { buildManagerMail } from '../../reports/manager-mail.js';
import { screeningReportPdf } from '../../reports/report.service.js';
import type { ResentNotification } from '../../../shared/schemas/responses/index.js';
import { audit } from '../../common/audit.js';
import { notFound } from '../../common/app-error.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { Decision } from '../screenings/decision.entity.js';
import type { Screening } from '../screenings/screening.entity.js';
import { Site } from '../sites/site.entity.js';
import { Unit } from '../units/unit.entity.js';
import { User } from '../users/user.entity.js';
import { Notification } from './notification.entity.js';
import type { Logger } from '../../logger.js';

/** Tries per message before it stays `failed`; the wait doubles each time (1, 2, 4, 8, 16 minutes). */
export const MAX_MAIL_ATTEMPTS = 6;
/** While one worker sends a message, others leave it alone this long. */
const LEASE_SECONDS = 300;

export interface Mailer {
  transport: Transporter;
  from: string;
}

/** The managers who get a site's mail: active users holding `manager` who cover all sites or this one. */
export async function siteManagers(m: EntityManager, siteId: number): Promise<{ id: number; email: string }[]> {
  return m.query(
    "SELECT u.id, u.email FROM `user` u WHERE u.active = 1 AND JSON_CONTAINS(u.roles, '\"manager\"') " +
      'AND (u.allSites = 1 OR EXISTS (SELECT 1 FROM user_site us WHERE us.userId = u.id AND us.siteId = ?)) ORDER BY u.id',
    [siteId],
  );
}

/** Queues the screening's mail to every manager of the unit's site (inside the screening's transaction). */
export async function queueScreeningMail(m: EntityManager, clock: Clock, s: Screening, siteId: number, unitSerial: string): Promise<number> {
  const managers = await siteManagers(m, siteId);
  if (!managers.length) return 0;
  await m.getRepository(Notification).insert(
    managers.map((u) => ({
      eventId: s.eventId,
      screeningId: s.id,
      to: u.email,
      subject: `[Gapsight] ${s.recommendation.toUpperCase()} — ${unitSerial}`.slice(0, 500),
      status: 'queued' as const,
      attempts: 0,
      nextAttemptAt: clock.now(),
      createdAt: clock.now(),
    })),
  );
  return managers.length;
}

/**
 * Queues the signed decision's mail (inside the decision's transaction) to the site's control-room address and to the
 * active people who entered the event's sessions, each address once. Returns how many were queued.
 */
export async function queueDecisionMail(m: EntityManager, clock: Clock, decision: Decision, s: Screening): Promise<number> {
  const event = await m.getRepository(FaultEvent).findOneByOrFail({ id: s.eventId });
  const unit = await m.getRepository(Unit).findOneByOrFail({ id: event.unitId });
  const site = await m.getRepository(Site).findOneByOrFail({ id: unit.siteId });
  const testers: { email: string }[] = await m.query(
    'SELECT DISTINCT u.email FROM reading_set rs JOIN `user` u ON u.id = rs.createdById WHERE rs.eventId = ? AND u.active = 1 ORDER BY u.email',
    [event.id],
  );
  const seen = new Set<string>();
  const to = [site.controlRoomEmail, ...testers.map((t) => t.email)].filter((a): a is string => {
    if (!a || seen.has(a.toLowerCase())) return false;
    seen.add(a.toLowerCase());
    return true;
  });
  if (!to.length) return 0;
  const subject = `[Gapsight] Decision: ${OUTCOME_LABELS[decision.outcome].word.toUpperCase()} — ${unit.serial} (${site.name})`.slice(0, 500);
  await m.getRepository(Notification).insert(
    to.map((address) => ({ kind: 'decision' as const, eventId: event.id, screeningId: s.id, to: address, subject, status: 'queued' as const, attempts: 0, nextAttemptAt: clock.now(), createdAt: clock.now() })),
  );
  return to.length;
}

/** Queues a fresh copy of a stored mail (same kind, report and address; a new row), audited. */
export async function resendNotification(m: EntityManager, clock: Clock, userId: number, id: number) {
  const n = await m.getRepository(Notification).findOneBy({ id });
  if (!n) throw notFound('Notification');
  const repo = m.getRepository(Notification);
  const copy = await repo.save(
    repo.create({ kind: n.kind, eventId: n.eventId, screeningId: n.screeningId, to: n.to, subject: n.subject, status: 'queued', attempts: 0, lastError: null, sentAt: null, nextAttemptAt: clock.now(), messageId: null, createdAt: clock.now() }),
  );
  await audit(m, clock, {
    userId,
    action: 'create',
    entity: 'notification',
    entityId: copy.id,
    after: { kind: copy.kind, eventId: copy.eventId, screeningId: copy.screeningId, to: copy.to, resentFrom: n.id },
    note: `resent from mail ${n.id}`,
  });
  return {
    id: copy.id,
    resentFrom: n.id,
    kind: copy.kind,
    eventId: copy.eventId,
    screeningId: copy.screeningId,
    to: copy.to,
    subject: copy.subject,
    status: 'queued',
    createdAt: copy.createdAt.toISOString(),
  } satisfies ResentNotification;
}

/** Claims due messages with a lease (SKIP LOCKED: several app servers never send one message twice at once). */
async function claim(db: DataSource, clock: Clock, limit: number): Promise<number[]> {
  return db.transaction(async (m) => {
    const now = clock.now();
    const rows: { id: number }[] = await m.query(
      "SELECT id FROM notification WHERE status IN ('queued', 'failed') AND nextAttemptAt IS NOT NULL AND nextAttemptAt <= ? ORDER BY id LIMIT ? FOR UPDATE SKIP LOCKED",
      [now, limit],
    );
    if (rows.length) await m.query('UPDATE notification SET nextAttemptAt = ? WHERE id IN (?)', [new Date(now.getTime() + LEASE_SECONDS * 1000), rows.map((r) => r.id)]);
    return rows.map((r) => Number(r.id));
  });
}

/** Records a delivered notification (the worker after sending; the demo seed for the mail of its story). */
export async function recordMailSent(m: EntityManager, clock: Clock, id: number, sent: { subject: string; messageId: string | null; attempts: number }): Promise<void> {
  await m.getRepository(Notification).update(id, {
    status: 'sent',
    subject: sent.subject.slice(0, 500),
    attempts: sent.attempts,
    sentAt: clock.now(),
    messageId: sent.messageId?.slice(0, 255) || null,
    nextAttemptAt: null,
    lastError: null,
  });
}

/** Sends the due notifications: mail with the PDF report attached; failures are kept with their error and retried. */
export async function deliverDueNotifications(db: DataSource, clock: Clock, mailer: Mailer, appUrl: string, limit = 20): Promise<{ sent: number; failed: number }> {
  const ids = await claim(db, clock, limit);
  let sent = 0;
  let failed = 0;
  const built = new Map<number, Promise<{ subject: string; text: string; html: string; pdf: Buffer; filename: string }>>();
  const build = (kind: Notification['kind'], screeningId: number) => {
    const key = kind === 'decision' ? -screeningId : screeningId;
    if (!built.has(key)) {
      built.set(
        key,
        (async () => {
          const { data, pdf, filename } = await screeningReportPdf(db.manager, screeningId, appUrl);
          if (kind !== 'decision') return { ...buildManagerMail(data), pdf, filename };
          const d = await db.getRepository(Decision).findOne({ where: { screeningId }, order: { signedAt: 'DESC', id: 'DESC' } });
          if (!d) throw new Error('a decision mail without a decision has nothing to say');
          const signer = await db.getRepository(User).findOneBy({ id: d.managerId });
          const facts = {
            outcome: d.outcome,
            restrictions: d.restrictions,
            reason: d.reason,
            againstRecommendation: d.againstRecommendation,
            signedAt: d.signedAt.toISOString(),
            signedBy: signer ? { name: signer.name, email: signer.email } : null,
          };
          return { ...buildDecisionMail(data, facts), pdf, filename };
        })(),
      );
    }
    return built.get(key)!;
  };
  const repo = db.getRepository(Notification);
  for (const id of ids) {
    const n = await repo.findOneByOrFail({ id });
    try {
      if (n.screeningId === null) throw new Error('a notification without a screening has nothing to say');
      const mail = await build(n.kind, n.screeningId);
      const info = await mailer.transport.sendMail({
        from: mailer.from,
        to: n.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        attachments: [{ filename: mail.filename, content: mail.pdf, contentType: 'application/pdf' }],
      });
      await recordMailSent(db.manager, clock, id, { subject: mail.subject, messageId: String(info.messageId ?? ''), attempts: n.attempts + 1 });
      sent++;
    } catch (err) {
      const attempts = n.attempts + 1;
      const retry = attempts < MAX_MAIL_ATTEMPTS ? new Date(clock.now().getTime() + 60_000 * 2 ** (attempts - 1)) : null;
      await repo.update(id, { status: 'failed', attempts, lastError: (err instanceof Error ? err.message : String(err)).slice(0, 2000), nextAttemptAt: retry });
      failed++;
    }
  }
  return { sent, failed };
}

/** Runs delivery every few seconds and on demand; returns the kick and a stop function. */
export function startMailWorker(
  db: DataSource,
  clock: Clock,
  mailer: Mailer,
  appUrl: () => string,
  log: Pick<Logger, 'error'>,
  everyMs = 10_000,
): { kick: () => void; stop: () => Promise<void> } {
  let running: Promise<unknown> | null = null;
  let again = false;
  const run = () => {
    if (running) {
      again = true;
      return;
    }
    running = deliverDueNotifications(db, clock, mailer, appUrl())
      .catch((err: unknown) => log.error({ err }, 'mail delivery failed'))
      .finally(() => {
        running = null;
        if (again && db.isInitialized) {
          again = false;
          run();
        }
      });
  };
  const timer = setInterval(() => db.isInitialized && run(), everyMs);
  timer.unref();
  return {
    kick: () => setImmediate(run),
    stop: async () => {
      clearInterval(timer);
      await running;
    },
  };
}
