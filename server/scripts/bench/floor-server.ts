import http from 'node:http';
import type { AddressInfo } from 'node:net';
import mysql from 'mysql2/promise';
import { rowsToReadingSet } from '../../../shared/readings/rows.js';
import { DB_POOL_SIZE } from '../../db/create-data-source.js';

// The floor of the read API: a bare node:http server over a bare mysql2 pool of the app's size (DB_POOL_SIZE) that
// answers the same URLs with the same rows, read in one round trip of plain SQL where the data allows it (the event
// file needs a second one for the people its rows name), and JSON.stringify. No authentication, no validation, no ORM:
// the least work that returns the same information. Computed figures (the event's through-fault duty) are left out:
// the floor answers their inputs (the earlier faults) instead.

export interface DbAddress { host: string; port: number; user: string; password: string; database: string }

type Row = Record<string, unknown>;
const json = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
const bool = (v: unknown) => (v === null || v === undefined ? null : Boolean(Number(v)));

const UNIT_COLS = 'u.id,u.serial,u.position,u.siteId,u.designId,u.year,u.phases,u.hvKV,u.lvKV,u.ratedKVA,u.impedancePercent,u.systemImpedancePercent,u.conductor,u.lastEventId,u.lastEventAt,u.lastEventStatus,u.lastRecommendation';
const EVENT_COLS = 'e.id,e.unitId,e.occurredAt,e.type,e.faultedPhases,e.side,e.location,e.currentIs,e.shots,e.transformerTripped,e.protectionOperated,e.notes,e.status,e.createdById,e.createdAt';
const RESTRICTIONS = (unit: string) =>
  `(SELECT GROUP_CONCAT(d2.restrictions ORDER BY d2.signedAt DESC, d2.id DESC SEPARATOR '; ') FROM decision d2 JOIN screening s2 ON s2.id = d2.screeningId JOIN fault_event e2 ON e2.id = s2.eventId WHERE e2.unitId = ${unit} AND d2.outcome = 'release-with-restrictions' AND d2.restrictionsLiftedAt IS NULL AND d2.restrictions <> '')`;

function eventRow(e: Row): Row {
  return { ...e, shots: json(e.shots), protectionOperated: json(e.protectionOperated), transformerTripped: bool(e.transformerTripped) };
}

/** Readings rows → values keyed as the case format keys them: the project's own one-pass row reader (pure). */
function valuesOf(rows: Row[]): Row {
  return rowsToReadingSet(rows as unknown as Parameters<typeof rowsToReadingSet>[0]) as Row;
}

/** The set conditions the app's answers carry beside the values (case-format names). */
function setConditions(s: Row): Row {
  const out: Row = { takenAt: s.takenAt };
  for (const [k, from] of [['temperatureC', 'temperatureC'], ['tapPosition', 'tapPosition'], ['demagnetised', 'demagnetised'], ['hoursDeEnergised', 'hoursDeenergised'], ['windingTemperatureC', 'windingTemperatureC']] as const)
    if (s[from] !== null && s[from] !== undefined) out[k] = from === 'demagnetised' ? bool(s[from]) : s[from];
  return out;
}

function groupBy(rows: Row[], key: string): Map<unknown, Row[]> {
  const m = new Map<unknown, Row[]>();
  for (const r of rows) (m.get(r[key]) ?? m.set(r[key], []).get(r[key])!).push(r);
  return m;
}

export async function startFloorServer(db: DbAddress): Promise<{ url: string; close: () => Promise<void>; pool: mysql.Pool }> {
  const pool = mysql.createPool({ ...db, connectionLimit: DB_POOL_SIZE, multipleStatements: true, timezone: 'Z', decimalNumbers: true, supportBigNumbers: true, bigNumberStrings: false });
  const many = async (sql: string, params: unknown[]) => (await pool.query(sql, params))[0] as Row[][];

  async function units(page: number, pageSize: number) {
    const [items, [count]] = await many(
      `SELECT ${UNIT_COLS}, s.name AS siteName, s.timeZone AS siteTimeZone, s.locale AS siteLocale, d.reference AS designReference, ${RESTRICTIONS('u.id')} AS activeRestrictions
       FROM (SELECT * FROM unit ORDER BY serial LIMIT ? OFFSET ?) u JOIN site s ON s.id = u.siteId JOIN design d ON d.id = u.designId ORDER BY u.serial;
       SELECT COUNT(*) AS total FROM unit`,
      [pageSize, (page - 1) * pageSize],
    );
    return { items, total: Number(count.total), page, pageSize };
  }

  async function events(page: number, pageSize: number) {
    const [items, [count]] = await many(
      `SELECT ${EVENT_COLS}, u.serial AS unitSerial, u.siteId, s.name AS siteName, s.timeZone AS siteTimeZone, s.locale AS siteLocale,
         (SELECT sc.recommendation FROM screening sc WHERE sc.eventId = e.id AND sc.comparison = 0 ORDER BY sc.id DESC LIMIT 1) AS recommendation
       FROM (SELECT * FROM fault_event ORDER BY occurredAt DESC, id DESC LIMIT ? OFFSET ?) e JOIN unit u ON u.id = e.unitId JOIN site s ON s.id = u.siteId ORDER BY e.occurredAt DESC, e.id DESC;
       SELECT COUNT(*) AS total FROM fault_event`,
      [pageSize, (page - 1) * pageSize],
    );
    return { items: items.map(eventRow), total: Number(count.total), page, pageSize };
  }

  async function eventFile(id: number) {
    const ids = 'SELECT id FROM reading_set WHERE eventId = ?';
    const r = await many(
      `SELECT * FROM fault_event WHERE id = ?;
       SELECT u.*, s.id AS s_id, s.name AS s_name, s.timeZone AS s_timeZone, s.locale AS s_locale FROM unit u JOIN fault_event e ON e.unitId = u.id JOIN site s ON s.id = u.siteId WHERE e.id = ?;
       SELECT d.* FROM design d JOIN unit u ON u.designId = d.id JOIN fault_event e ON e.unitId = u.id WHERE e.id = ?;
       SELECT p.id, p.occurredAt, p.type, p.side, p.location, p.currentIs, p.shots FROM fault_event p JOIN fault_event e ON e.id = ? WHERE p.unitId = e.unitId AND p.occurredAt < e.occurredAt AND p.id <> e.id ORDER BY p.occurredAt, p.id;
       SELECT * FROM reading_set WHERE eventId = ? ORDER BY takenAt, id;
       SELECT r.readingSetId, r.quantity, r.configuration, r.phase, r.mode, r.frequencyHz, r.value, r.unit FROM reading r WHERE r.readingSetId IN (${ids}) ORDER BY r.id;
       SELECT id, readingSetId, label, testType, terminals, winding, phase, tapPosition, baselineTapPosition, demagnetised, pointCount, minHz, maxHz, sha256, fileName, createdById, createdAt FROM sweep_trace WHERE readingSetId IN (${ids}) ORDER BY id;
       SELECT id, recommendation, criteriaVersion, comparison, computedById, computedAt, result FROM screening WHERE eventId = ? ORDER BY computedAt DESC, id DESC;
       SELECT d.* FROM decision d JOIN screening s ON s.id = d.screeningId WHERE s.eventId = ? ORDER BY d.signedAt DESC, d.id DESC;
       SELECT * FROM follow_up WHERE eventId = ? ORDER BY dueAt, id;
       SELECT * FROM finding WHERE eventId = ? ORDER BY recordedAt, id;
       SELECT * FROM notification WHERE eventId = ? ORDER BY id DESC LIMIT 200;
       SELECT * FROM attachment WHERE (ownerType = 'event' AND ownerId = ?) OR (ownerType = 'finding' AND ownerId IN (SELECT id FROM finding WHERE eventId = ?)) ORDER BY id;
       SELECT id, at, userId, action, entity, entityId, \`before\`, \`after\`, highlighted, note FROM audit_entry
         WHERE (entity = 'fault_event' AND entityId = ?) OR (entity = 'reading_set' AND entityId IN (SELECT CAST(id AS CHAR) FROM reading_set WHERE eventId = ?))
            OR (entity = 'screening' AND entityId IN (SELECT CAST(id AS CHAR) FROM screening WHERE eventId = ?)) OR (entity = 'follow_up' AND entityId IN (SELECT CAST(id AS CHAR) FROM follow_up WHERE eventId = ?))
            OR (entity = 'finding' AND entityId IN (SELECT CAST(id AS CHAR) FROM finding WHERE eventId = ?))
         ORDER BY at, id LIMIT 500`,
      [id, id, id, id, id, id, id, id, id, id, id, id, id, id, id, id, id, id, id],
    );
    const [[e], [u], [d], prior, sets, readings, sweeps, screenings, decisions, followUps, findings, notifications, attachments, audit] = r;
    if (!e) return null;
    const userIds = new Set<number>();
    for (const x of [e.createdById, ...sets.map((s) => s.createdById), ...screenings.map((s) => s.computedById), ...decisions.flatMap((x) => [x.managerId, x.restrictionsLiftedById]), ...followUps.map((f) => f.closedById), ...findings.map((f) => f.recordedById), ...audit.map((a) => a.userId)])
      if (typeof x === 'number') userIds.add(x);
    const users = userIds.size ? ((await pool.query('SELECT id, name, email FROM `user` WHERE id IN (?)', [[...userIds]]))[0] as Row[]) : [];
    const bySet = groupBy(readings, 'readingSetId');
    const sweepsBySet = groupBy(sweeps, 'readingSetId');
    const unitOut: Row = {};
    for (const [k, v] of Object.entries(u)) if (!k.startsWith('s_') && k !== 'createdAt' && k !== 'updatedAt') unitOut[k] = v;
    return {
      ...eventRow(e),
      unit: { ...unitOut, site: { id: u.s_id, name: u.s_name, timeZone: u.s_timeZone, locale: u.s_locale }, design: { ...d, coolingStages: json(d.coolingStages), requiredCapacitance: json(d.requiredCapacitance) } },
      priorFaults: prior.map((p) => ({ ...p, shots: json(p.shots) })),
      sessions: sets.map((s) => ({ ...s, values: { ...setConditions(s), ...valuesOf(bySet.get(s.id) ?? []) }, sweeps: sweepsBySet.get(s.id) ?? [] })),
      screenings: screenings.map((s) => ({ ...s, result: json(s.result) })),
      decision: decisions[0] ?? null,
      decisions,
      followUps,
      findings: findings.map((f) => ({ ...f, attachments: attachments.filter((a) => a.ownerType === 'finding' && a.ownerId === f.id) })),
      attachments: attachments.filter((a) => a.ownerType === 'event'),
      notifications,
      audit: audit.map((a) => ({ ...a, before: json(a.before), after: json(a.after) })),
      people: Object.fromEntries(users.map((x) => [x.id, x])),
      energisedAt: e.energisedAt,
      activeRestrictions: decisions[0]?.outcome === 'release-with-restrictions' && !decisions[0].restrictionsLiftedAt ? decisions[0].restrictions : null,
      restrictionsLifted: decisions[0]?.restrictionsLiftedAt ? { at: decisions[0].restrictionsLiftedAt, byId: decisions[0].restrictionsLiftedById, reason: decisions[0].restrictionsLiftReason ?? '' } : null,
    };
  }

  async function eventCase(id: number) {
    const unitOf = '(SELECT unitId FROM fault_event WHERE id = ?)';
    const designOf = `(SELECT designId FROM unit WHERE id = ${unitOf})`;
    const [[e], [u], prior, sets, readings, sisters, sisterReadings, traces] = await many(
      `SELECT * FROM fault_event WHERE id = ?;
       SELECT u.*, d.windings, d.vectorGroup, d.requiredCapacitance FROM unit u JOIN design d ON d.id = u.designId WHERE u.id = ${unitOf};
       SELECT p.occurredAt, p.type, p.side, p.location, p.currentIs, p.shots FROM fault_event p JOIN fault_event e ON e.id = ? WHERE p.unitId = e.unitId AND p.occurredAt < e.occurredAt AND p.id <> e.id ORDER BY p.occurredAt, p.id;
       SELECT * FROM reading_set WHERE unitId = ${unitOf} ORDER BY takenAt, id;
       SELECT r.readingSetId, r.quantity, r.configuration, r.phase, r.mode, r.frequencyHz, r.value, r.unit FROM reading r JOIN reading_set rs ON rs.id = r.readingSetId WHERE rs.unitId = ${unitOf} ORDER BY r.id;
       SELECT id, serial FROM unit WHERE designId = ${designOf} AND id <> ${unitOf} ORDER BY serial;
       SELECT rs.unitId, rs.takenAt, rs.temperatureC, rs.tapPosition, rs.demagnetised, rs.hoursDeenergised, rs.windingTemperatureC, r.quantity, r.configuration, r.phase, r.mode, r.frequencyHz, r.value, r.unit FROM reading r JOIN reading_set rs ON rs.id = r.readingSetId JOIN unit su ON su.id = rs.unitId
         WHERE su.designId = ${designOf} AND su.id <> ${unitOf} AND rs.kind <> 'post-fault' ORDER BY rs.takenAt, rs.id, r.id;
       SELECT t.id, t.readingSetId, rs.takenAt, t.label, t.testType, t.winding, t.phase, t.tapPosition, t.baselineTapPosition, t.demagnetised, t.points FROM sweep_trace t JOIN reading_set rs ON rs.id = t.readingSetId WHERE rs.unitId = ${unitOf}`,
      [id, id, id, id, id, id, id, id, id, id, id, id],
    );
    if (!e) return null;
    const before = (s: Row) => (s.takenAt as Date).getTime() < (e.occurredAt as Date).getTime();
    const bySet = groupBy(readings, 'readingSetId');
    const merged = (ss: Row[]) => (ss.length ? { ...setConditions(ss[ss.length - 1]), ...valuesOf(ss.flatMap((s) => bySet.get(s.id) ?? [])) } : undefined);
    const baseline = sets.filter((s) => s.kind !== 'post-fault' && (s.kind !== 'routine' || Number(s.isReference)) && before(s));
    const previous = sets.filter((s) => s.kind === 'routine' && !Number(s.isReference) && before(s));
    const sessions = sets.filter((s) => s.kind === 'post-fault' && s.eventId === e.id);
    const sisterRows = groupBy(sisterReadings, 'unitId');
    const sessionIds = new Set(sessions.map((s) => s.id));
    // Newest trace first (its set's time, then its id); one post-fault trace a label, paired with the newest baseline trace of that label.
    traces.sort((a, b) => (b.takenAt as Date).getTime() - (a.takenAt as Date).getTime() || Number(b.id) - Number(a.id));
    const post = traces.filter((t, i) => sessionIds.has(t.readingSetId) && traces.findIndex((x) => sessionIds.has(x.readingSetId) && x.label === t.label) === i);
    const ownIds = new Set([...baseline, ...previous].map((s) => s.id));
    const refs = traces.filter((t) => ownIds.has(t.readingSetId));
    return {
      format: 'gapsight-case/1',
      unit: { serial: u.serial, phases: u.phases, ratedKVA: u.ratedKVA, hvKV: u.hvKV, lvKV: u.lvKV, impedancePercent: u.impedancePercent, systemImpedancePercent: u.systemImpedancePercent, windings: u.windings, vectorGroup: u.vectorGroup, conductor: u.conductor, requiredCapacitance: json(u.requiredCapacitance) },
      fault: { occurredAt: e.occurredAt, type: e.type, side: e.side, location: e.location, currentIs: e.currentIs, transformerTripped: bool(e.transformerTripped), protectionOperated: json(e.protectionOperated), shots: json(e.shots) },
      priorFaults: prior.map((p) => ({ ...p, shots: json(p.shots) })),
      baseline: merged(baseline),
      previous: merged(previous),
      postFault: merged(sessions),
      sisters: sisters.filter((s) => sisterRows.has(s.id)).map((s) => {
        const rows = sisterRows.get(s.id)!;
        return { serial: s.serial, ...setConditions(rows[rows.length - 1]), ...valuesOf(rows) };
      }),
      sweeps: post.map((p) => {
        const b = refs.find((t) => t.label === p.label);
        return { label: p.label, testType: p.testType, winding: p.winding, phase: p.phase, tapPosition: p.tapPosition, baselineTapPosition: p.baselineTapPosition ?? b?.tapPosition, demagnetised: bool(p.demagnetised), baseline: b ? json(b.points) : undefined, postFault: json(p.points) };
      }),
    };
  }

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://x');
    const page = Number(url.searchParams.get('page') ?? 1);
    const pageSize = Number(url.searchParams.get('pageSize') ?? 50);
    const m = /^\/api\/events\/(\d+)(\/case)?$/.exec(url.pathname);
    const work =
      url.pathname === '/api/units' ? units(page, pageSize) : url.pathname === '/api/events' ? events(page, pageSize) : m ? (m[2] ? eventCase(Number(m[1])) : eventFile(Number(m[1]))) : Promise.resolve(undefined);
    work.then(
      (body) => {
        if (body === undefined || body === null) {
          res.writeHead(404, { 'content-type': 'application/json' }).end('{"error":"not found"}');
          return;
        }
        res.writeHead(200, { 'content-type': 'application/json; charset=utf-8' }).end(JSON.stringify(body));
      },
      (err: Error) => res.writeHead(500, { 'content-type': 'text/plain' }).end(err.message),
    );
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    pool,
    close: async () => {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      await pool.end();
    },
  };
}
