import type { Transporter } from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import type { Clock } from '../../common/clock.js';
import { buildManagerMail } from '../../reports/manager-mail.js';
import { screeningReportPdf } from '../../reports/report.service.js';
import type { Screening } from '../screenings/screening.entity.js';
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
  const build = (screeningId: number) => {
    if (!built.has(screeningId)) {
      built.set(
        screeningId,
        (async () => {
          const { data, pdf, filename } = await screeningReportPdf(db.manager, screeningId, appUrl);
          return { ...buildManagerMail(data), pdf, filename };
        })(),
      );
    }
    return built.get(screeningId)!;
  };
  const repo = db.getRepository(Notification);
  for (const id of ids) {
    const n = await repo.findOneByOrFail({ id });
    try {
      if (n.screeningId === null) throw new Error('a notification without a screening has nothing to say');
      const mail = await build(n.screeningId);
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
