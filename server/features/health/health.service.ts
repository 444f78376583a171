import type { EntityManager } from 'typeorm';

/**
 * How long the health check waits for the database's answer. Opening a connection is bounded (2 s, see
 * server/db/create-data-source.ts); this also bounds a server that accepted the connection but does not answer.
 */
export const HEALTH_DB_TIMEOUT_MS = 2_500;

/** True when the database answers a trivial query within `timeoutMs`. */
export async function databaseAnswers(m: EntityManager, timeoutMs = HEALTH_DB_TIMEOUT_MS): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), timeoutMs);
    timer.unref();
  });
  try {
    return await Promise.race([m.query('SELECT 1').then(() => true), late]);
  } catch {
    return false;
  } finally {
    clearTimeout(timer);
  }
}
