import type { DataSource } from 'typeorm';
import { medianOf } from './engine.js';

// The screening write path: POST /api/events/:id/screenings on events in a row (case assembly, engine, stored result,
// audit row, status move, notification rows), time per screening, against the engine alone (screenCase) on the very
// case each screening assembled (read back from the stored screening).

export interface ScreeningFigure { count: number; routeMs: number; engineMs: number }

export async function benchScreenings(db: DataSource, post: (url: string, body: unknown) => Promise<{ status: number; text: string }>, eventIds: readonly number[]): Promise<ScreeningFigure> {
  const { screenCase } = await import('../../../shared/screening/index.js');
  const { loadCriteria } = await import('../../features/criteria/criteria.service.js');
  const route: number[] = [];
  const ids: number[] = [];
  for (const id of eventIds) {
    const t = performance.now();
    const res = await post(`/api/events/${id}/screenings`, {});
    route.push(performance.now() - t);
    if (res.status !== 201) throw new Error(`screening of event ${id}: ${res.status} ${res.text.slice(0, 300)}`);
    ids.push((JSON.parse(res.text) as { id: number }).id);
  }
  const criteria = (await loadCriteria(db.manager)).criteria;
  const cases: { case: unknown }[] = await db.query(`SELECT \`case\` FROM screening WHERE id IN (${ids.map(() => '?').join(',')})`, ids);
  const docs = cases.map((r) => (typeof r.case === 'string' ? JSON.parse(r.case) : r.case));
  for (const d of docs.slice(0, 5)) screenCase(d, criteria); // warm-up
  const engine: number[] = [];
  for (const d of docs) {
    const t = performance.now();
    screenCase(d, criteria);
    engine.push(performance.now() - t);
  }
  return { count: eventIds.length, routeMs: medianOf(route), engineMs: medianOf(engine) };
}
