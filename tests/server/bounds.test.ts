// Bounds through the API: absurd numbers, oversized lists, dates outside 1900 … a day after now (or past year 9999, or not
// real), unknown fields and deep nesting answer 400 naming the field, and write nothing. And every text column of every
// entity is bounded by the schema that writes it (or is set by the server).
import { getMetadataArgsStorage, type EntityTarget, type ObjectLiteral } from 'typeorm';
import { describe, expect, it } from 'vitest';
import { entities } from '../../server/db/entities.js';
import { FaultEvent } from '../../server/features/events/fault-event.entity.js';
import { ReadingSet } from '../../server/features/readings/reading-set.entity.js';
import { Reading } from '../../server/features/readings/reading.entity.js';
import { Unit } from '../../server/features/units/unit.entity.js';
import { userCreateBodySchema } from '../../shared/schemas/auth.js';
import {
  designBodySchema,
  eventBodySchema,
  readingSetBodySchema,
  sessionBodySchema,
  siteBodySchema,
  sweepUploadFieldsSchema,
  unitBodySchema,
} from '../../shared/schemas/fleet.js';
import { decisionBodySchema, findingBodySchema } from '../../shared/schemas/screening.js';
import { makeDesign, makeSite } from '../helpers/factories.js';
import { cleanCase } from '../shared/case-builder.js';
import { correctionsFlow, fault } from './corrections/flow.js';

const f = correctionsFlow();
const counts = async () => {
  const n = <T extends ObjectLiteral>(e: EntityTarget<T>) => f.env.db.getRepository(e).count();
  return { units: await n(Unit), events: await n(FaultEvent), sets: await n(ReadingSet), readings: await n(Reading) };
};

/** Unknown keys nested `depth` levels deep. */
function nested(depth: number): unknown {
  let v: unknown = { leaf: 1 };
  for (let i = 0; i < depth; i += 1) v = { foo: v };
  return v;
}

describe('absurd numbers and oversized lists answer 400 naming the field, nothing written', () => {
  it('a unit with 1e308 or 2^64 kV', async () => {
    const [site, design] = [await makeSite(f.env.db), await makeDesign(f.env.db)];
    const before = await counts();
    for (const hvKV of [1e308, 2 ** 64]) {
      const res = await f.api().post('/api/units').set(f.as.admin).send({ serial: `KVP-B-${hvKV}`, siteId: site.id, designId: design.id, hvKV });
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ hvKV: 'must be 1200 kV or less (check the unit)' });
    }
    expect(await counts()).toEqual(before);
  });

  it('a fault with 10 000 shots, and a session at ±1e308 °C', async () => {
    const { unitId, eventId } = await f.event({ session: false });
    const before = await counts();
    const shots = Array.from({ length: 10_000 }, () => ({ currentKA: 1, durationS: 0.1 }));
    const many = await f.api().post('/api/events').set(f.as.protection).send({ ...fault, unitId, shots });
    expect(many.status).toBe(400);
    expect(many.body.error.fields).toEqual({ shots: 'at most 20 shots' });
    for (const temperatureC of [1e308, -1e308]) {
      const hot = await f.api().post(`/api/events/${eventId}/sessions`).set(f.as.tester).send({ takenAt: '2026-11-29T08:00:00Z', temperatureC });
      expect(hot.status).toBe(400);
      expect(Object.keys(hot.body.error.fields)).toEqual(['temperatureC']);
    }
    expect(await counts()).toEqual(before);
  });

  it('a reading set with 10 000 capacitance configurations', async () => {
    const { unitId } = await f.event({ session: false });
    const before = await counts();
    const capacitancePF = Object.fromEntries(Array.from({ length: 10_000 }, (_, i) => [`C${i}`, 3000]));
    const res = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ kind: 'routine', takenAt: '2025-06-01', capacitancePF });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ capacitancePF: 'at most 50 configurations' });
    expect(await counts()).toEqual(before);
  });

  it('a previewed case with 1e308 kV names the case path', async () => {
    const c = cleanCase();
    const res = await f.api().post('/api/screenings/preview').set(f.as.engineer).send({ ...c, unit: { ...c.unit, hvKV: 1e308 } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'unit.hvKV': 'must be 1200 kV or less (check the unit)' });
  });
});

describe('dates outside 1900 … a day after now, past 9999 or not real answer 400 naming the field', () => {
  it.each([
    ['0001-01-01T00:00:00Z', 'before 1900-01-01: check the year'],
    ['2099-01-01T00:00:00Z', 'later than a day after now: check the year'],
    ['10000-01-01', 'not an ISO 8601 date or date-time'],
    ['+010000-01-01T00:00:00Z', 'not an ISO 8601 date or date-time'],
    ['2026-02-30', 'not a real date or time (2026-02-30)'],
  ])('fault at %s', async (occurredAt, message) => {
    const { unitId, eventId, sessionId } = await f.event();
    const before = await counts();
    const res = await f.api().post('/api/events').set(f.as.protection).send({ ...fault, unitId, occurredAt });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ occurredAt: message });
    const test = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ kind: 'routine', takenAt: occurredAt });
    expect(test.status).toBe(400);
    expect(test.body.error.fields).toEqual({ takenAt: message });
    const corrected = await f.api().patch(`/api/sessions/${sessionId}`).set(f.as.tester).send({ takenAt: occurredAt });
    expect(corrected.status).toBe(400);
    expect(corrected.body.error.fields).toEqual({ takenAt: message });
    const moved = await f.api().patch(`/api/events/${eventId}`).set(f.as.protection).send({ occurredAt });
    expect(moved.status).toBe(400);
    expect(moved.body.error.fields).toEqual({ occurredAt: message });
    expect(await counts()).toEqual(before);
  });
});

describe('unknown fields and deep nesting', () => {
  it('an unknown field holding 25 levels in a reading set is a 400 naming its path (40 deep: the depth check below)', async () => {
    const { unitId } = await f.event({ session: false });
    const before = await counts();
    const body = { kind: 'routine', takenAt: '2025-06-01', capacitanceModes: { CHL: { gstPF: 8536, gstGuardPF: 3131, ustPF: 5405, foo: nested(25) } } };
    const res = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'capacitanceModes.CHL.foo': 'unknown field' });
    const top = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ kind: 'routine', takenAt: '2025-06-01', foo: 1, bar: { x: 1 } });
    expect(top.status).toBe(400);
    expect(top.body.error.fields).toEqual({ foo: 'unknown field', bar: 'unknown field' });
    expect(await counts()).toEqual(before);
  });

  it('an unknown field in a previewed case, deep in a sister, names its path', async () => {
    const c = cleanCase();
    const res = await f.api().post('/api/screenings/preview').set(f.as.engineer).send({ ...c, sisters: [{ serial: 'KVP-MB-T1', capacitancePF: { CH: 3105 }, foo: nested(20) }] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'sisters.0.foo': 'unknown field' });
  });

  it('a body nested 40 or 5 000 levels deep is a 400 before any schema walks it (no stack overflow)', async () => {
    const { unitId } = await f.event({ session: false });
    const before = await counts();
    for (const depth of [40, 5000]) {
      const text = `{"kind":"routine","takenAt":"2025-06-01","capacitancePF":${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}}`;
      const res = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).set('Content-Type', 'application/json').send(text);
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ '(body)': 'nested deeper than 32 levels' });
    }
    const health = await f.api().get('/api/health');
    expect(health.status).toBe(200);
    expect(await counts()).toEqual(before);
  });
});

// ---- Every varchar/char column is bounded by the schema that writes it ----------------------------------------------

type Check = { schema: { safeParse(v: unknown): { error?: { issues: { path: PropertyKey[] }[] } } }; body: (text: string) => unknown; path: string; text?: (n: number) => string };
const value = (path: string, text: string) => {
  const out: Record<string, unknown> = {};
  let at = out;
  const parts = path.split('.');
  parts.forEach((p, i) => {
    if (i === parts.length - 1) at[p] = text;
    else at = (at[p] = {}) as Record<string, unknown>;
  });
  return out;
};
const field = (schema: Check['schema'], path: string, text?: Check['text']): Check => ({ schema, path, body: (t) => value(path, t), text });
/** A label used as a key of a keyed section (`capacitancePF: { <label>: 3000 }`). */
const keyOf = (schema: Check['schema'], section: string, v: unknown): Check => ({ schema, path: section, body: (t) => ({ [section]: { [t]: v } }) });
const email = (n: number) => `${'a'.repeat(Math.max(1, n - 12))}@example.com`;
const SERVER = 'set by the server';

/** Entity.column → the schema that writes it, or why none does. */
const COLUMNS: Record<string, Check | string> = {
  'Site.name': field(siteBodySchema, 'name'),
  'Site.timeZone': field(siteBodySchema, 'timeZone'),
  'Site.locale': field(siteBodySchema, 'locale'),
  'Site.controlRoomEmail': field(siteBodySchema, 'controlRoomEmail', email),
  'Design.reference': field(designBodySchema, 'reference'),
  'Design.maker': field(designBodySchema, 'maker'),
  'Design.windings': field(designBodySchema, 'windings'),
  'Design.vectorGroup': field(designBodySchema, 'vectorGroup'),
  'Design.conductor': field(designBodySchema, 'conductor'),
  'Unit.serial': field(unitBodySchema, 'serial'),
  'Unit.position': field(unitBodySchema, 'position'),
  'Unit.conductor': field(unitBodySchema, 'conductor'),
  'Unit.lastEventStatus': SERVER,
  'Unit.lastRecommendation': SERVER,
  'FaultEvent.type': field(eventBodySchema, 'type'),
  'FaultEvent.faultedPhases': field(eventBodySchema, 'faultedPhases'),
  'FaultEvent.side': field(eventBodySchema, 'side'),
  'FaultEvent.location': field(eventBodySchema, 'location'),
  'FaultEvent.currentIs': field(eventBodySchema, 'currentIs'),
  'FaultEvent.status': SERVER,
  'ReadingSet.kind': field(readingSetBodySchema, 'kind'),
  'ReadingSet.tapPosition': field(sessionBodySchema, 'tapPosition'),
  'ReadingSet.instrument': field(sessionBodySchema, 'instrument'),
  'ReadingSet.instrumentSerial': field(sessionBodySchema, 'instrumentSerial'),
  'Reading.quantity': `${SERVER} (the section's name)`,
  'Reading.configuration': keyOf(sessionBodySchema, 'capacitancePF', 3000),
  'Reading.phase': keyOf(sessionBodySchema, 'windingResistanceOhm', 0.5),
  'Reading.mode': `${SERVER} (gst, gstGuard, ust)`,
  'Reading.unit': `${SERVER} (the section's unit)`,
  'SweepTrace.label': field(sweepUploadFieldsSchema, 'label'),
  'SweepTrace.testType': field(sweepUploadFieldsSchema, 'testType'),
  'SweepTrace.terminals': field(sweepUploadFieldsSchema, 'terminals'),
  'SweepTrace.winding': field(sweepUploadFieldsSchema, 'winding'),
  'SweepTrace.phase': field(sweepUploadFieldsSchema, 'phase'),
  'SweepTrace.tapPosition': field(sweepUploadFieldsSchema, 'tapPosition'),
  'SweepTrace.baselineTapPosition': field(sweepUploadFieldsSchema, 'baselineTapPosition'),
  'SweepTrace.sha256': SERVER,
  'SweepTrace.fileName': 'the uploaded file name, cut to 255 characters by the upload',
  'Screening.recommendation': SERVER,
  'Decision.outcome': field(decisionBodySchema, 'outcome'),
  'Finding.classification': field(findingBodySchema, 'classification'),
  'FollowUp.task': { schema: decisionBodySchema, path: 'followUps.0.task', body: (t) => ({ followUps: [{ task: t }] }) },
  'User.email': field(userCreateBodySchema, 'email', email),
  'User.name': field(userCreateBodySchema, 'name'),
  'User.passwordHash': SERVER,
  'Attachment.ownerType': SERVER,
  'Attachment.name': 'the uploaded file name, cut to 255 characters by the upload',
  'Attachment.contentType': SERVER,
  'Attachment.kind': SERVER,
  'Attachment.sha256': SERVER,
  'CriteriaSet.status': SERVER,
  'Notification.kind': SERVER,
  'Notification.to': `${SERVER} (a site's or a user's stored e-mail address)`,
  'Notification.subject': SERVER,
  'Notification.status': SERVER,
  'Notification.messageId': SERVER,
  'AppSetting.key': SERVER,
  'AuditEntry.action': SERVER,
  'AuditEntry.entity': SERVER,
  'AuditEntry.entityId': SERVER,
  'AuditEntry.note': SERVER,
  'AuditEntry.prevHash': SERVER,
  'AuditEntry.hash': SERVER,
  'SinkMessage.to': `${SERVER} (the local mail sink)`,
  'SinkMessage.subject': `${SERVER} (the local mail sink)`,
  'SecurityEvent.kind': SERVER,
  'SecurityEvent.email': `${SERVER} (cut to the column)`,
  'SecurityEvent.address': SERVER,
  'SecurityEvent.route': SERVER,
  'SecurityEvent.detail': SERVER,
};

const textColumns = () => {
  const mine = new Set<unknown>(entities);
  return getMetadataArgsStorage()
    .columns.filter((c) => mine.has(c.target) && ['varchar', 'char'].includes(String(c.options.type)))
    .map((c) => ({ name: `${(c.target as { name: string }).name}.${c.propertyName}`, length: Number(c.options.length) }));
};
const issueAt = (check: Check, text: string) =>
  (check.schema.safeParse(check.body(text)).error?.issues ?? []).some((i) => i.path.map(String).join('.').startsWith(check.path));

describe('text columns', () => {
  it('every varchar/char column of every entity is listed: bounded by a schema, or set by the server', () => {
    const unlisted = textColumns().map((c) => c.name).filter((n) => !(n in COLUMNS));
    expect(unlisted).toEqual([]);
  });

  it.each(Object.entries(COLUMNS).filter((e): e is [string, Check] => typeof e[1] !== 'string'))('%s: one character over the column is refused on its path', (name, check) => {
    const column = textColumns().find((c) => c.name === name);
    expect(column, `${name} is no column any more`).toBeDefined();
    const make = check.text ?? ((n: number) => 'x'.repeat(n));
    expect(issueAt(check, make(column!.length + 1))).toBe(true);
  });

  it('keyed labels fit at their column length (20 and 8) and not one over', () => {
    const cfg = COLUMNS['Reading.configuration'] as Check;
    expect(issueAt(cfg, 'C'.repeat(20))).toBe(false);
    expect(issueAt(cfg, 'C'.repeat(21))).toBe(true);
    const phase = COLUMNS['Reading.phase'] as Check;
    expect(issueAt(phase, 'A'.repeat(8))).toBe(false);
    expect(issueAt(phase, 'A'.repeat(9))).toBe(true);
  });
});
