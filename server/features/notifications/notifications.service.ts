import type { Transporter } from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import { buildManagerMail } from '../../reports/manager-mail.js';
import { renderPdf } from '../../reports/pdf.js';
import { loadReportData } from '../../reports/report-data.service.js';
import { buildReportDocDefinition } from '../../reports/screening-report.js';
import type { Screening } from '../screenings/screening.entity.js';
import { Notification } from './notification.entity.js';

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
export async function queueScreeningMail(m: EntityManager, s: Screening, siteId: number, unitSerial: string): Promise<number> {
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
      nextAttemptAt: new Date(),
    })),
  );
  return managers.length;
}

/** Claims due messages with a lease (SKIP LOCKED: several app servers never send one message twice at once). */
async function claim(db: DataSource, limit: number): Promise<number[]> {
  return db.transaction(async (m) => {
    const rows: { id: number }[] = await m.query(
      "SELECT id FROM notification WHERE status IN ('queued', 'failed') AND nextAttemptAt IS NOT NULL AND nextAttemptAt <= NOW(3) ORDER BY id LIMIT ? FOR UPDATE SKIP LOCKED",
      [limit],
    );
    if (rows.length) await m.query(`UPDATE notification SET nextAttemptAt = NOW(3) + INTERVAL ${LEASE_SECONDS} SECOND WHERE id IN (?)`, [rows.map((r) => r.id)]);
    return rows.map((r) => Number(r.id));
  });
}

/** Sends the due notifications: mail with the PDF report attached; failures are kept with their error and retried. */
export async function deliverDueNotifications(db: DataSource, mailer: Mailer, appUrl: string, limit = 20): Promise<{ sent: number; failed: number }> {
  const ids = await claim(db, limit);
  let sent = 0;
  let failed = 0;
  const built = new Map<number, Promise<{ subject: string; text: string; html: string; pdf: Buffer; filename: string }>>();
  const build = (screeningId: number) => {
    if (!built.has(screeningId)) {
      built.set(
        screeningId,
        (async () => {
          const data = await loadReportData(db.manager, screeningId, appUrl);
          const mail = buildManagerMail(data);
          const pdf = await renderPdf(buildReportDocDefinition(data));
          return { ...mail, pdf, filename: `gapsight-${data.unit.serial}-screening-${screeningId}.pdf` };
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
      await repo.update(id, { status: 'sent', subject: mail.subject.slice(0, 500), attempts: n.attempts + 1, sentAt: new Date(), messageId: String(info.messageId ?? '').slice(0, 255) || null, nextAttemptAt: null, lastError: null });
      sent++;
    } catch (err) {
      const attempts = n.attempts + 1;
      const retry = attempts < MAX_MAIL_ATTEMPTS ? new Date(Date.now() + 60_000 * 2 ** (attempts - 1)) : null;
      await repo.update(id, { status: 'failed', attempts, lastError: (err instanceof Error ? err.message : String(err)).slice(0, 2000), nextAttemptAt: retry });
      failed++;
    }
  }
  return { sent, failed };
}

/** Runs delivery every few seconds and on demand; returns the kick and a stop function. */
export function startMailWorker(db: DataSource, mailer: Mailer, appUrl: () => string, everyMs = 10_000): { kick: () => void; stop: () => Promise<void> } {
  let running: Promise<unknown> | null = null;
  let again = false;
  const run = () => {
    if (running) {
      again = true;
      return;
    }
    running = deliverDueNotifications(db, mailer, appUrl())
      .catch((err) => console.error('Mail delivery failed:', err instanceof Error ? err.message : err))
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
