import type { EntityManager } from 'typeorm';

/** True when the database answers a trivial query. */
export async function databaseAnswers(m: EntityManager): Promise<boolean> {
  try {
    await m.query('SELECT 1');
    return true;
  } catch {
    return false;
  }
}
