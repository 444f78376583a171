// The API answers' schemas (shared/schemas/responses) against answers shaped like the server's: the page tests'
// fixtures, which the client renders, must parse; a key added, dropped or mistyped must not.
import { describe, expect, it } from 'vitest';
import { EVENT_STATUSES, FINDING_CLASSIFICATIONS, RECOMMENDATIONS, ROLES } from '../../shared/schemas/enums.js';
import { eventListQuerySchema, readingSetBodySchema, unitListQuerySchema } from '../../shared/schemas/fleet.js';
import {
  closedFollowUpSchema,
  decisionAnswerSchema,
  designListItemSchema,
  designViewSchema,
  eventDetailSchema,
  eventListPageSchema,
  healthAnswerSchema,
  loginAnswerSchema,
  outboxMessageSchema,
  runScreeningAnswerSchema,
  siteViewSchema,
  unitDetailSchema,
  unitListPageSchema,
  userViewSchema,
} from '../../shared/schemas/responses/index.js';
import { findingBodySchema } from '../../shared/schemas/screening.js';
import { design40, eventDetail, screenedEvent, screeningResult, unitDetail, unitItem } from '../client/pages/fixtures.js';

const user = {
  id: 7,
  email: 'r.okafor@kestrel-valley.example',
  name: 'Ruth Okafor',
  roles: ['tester', 'engineer'],
  siteIds: [],
  allSites: true,
  active: true,
  demo: true,
  mustChangePassword: false,
  lastSignInAt: '2026-07-02T08:00:00.000Z',
};

/** The event list's item for the fixtures' event: its own record plus unit, site and recommendation. */
function eventListItem() {
  const { unit: _u, throughFault: _t, dutyCase: _dc, sessions: _s, screenings: _sc, decision: _d, decisions: _ds, followUps: _f, findings: _fi, notifications: _n, attachments: _a, audit: _au, people: _p, energisedAt: _e, activeRestrictions: _r, restrictionsLifted: _l, ...event } = eventDetail();
  return { ...event, unitSerial: 'KVP-HX-T2', siteId: 1, siteName: 'Harrow Cross', siteTimeZone: 'Europe/London', recommendation: null };
}

describe('answers of the fleet routes', () => {
  it('parses a page of GET /api/units and the unit file of GET /api/units/:id', () => {
    expect(unitListPageSchema.safeParse({ items: [unitItem(), unitItem({ id: 4, serial: 'KVP-HX-T1', lastEventId: null, lastEventAt: null, lastEventStatus: null, lastRecommendation: null })], total: 2, page: 1, pageSize: 50 }).error).toBeUndefined();
    expect(unitDetailSchema.safeParse(unitDetail()).error).toBeUndefined();
  });

  it('parses GET /api/sites and GET /api/designs items', () => {
    expect(siteViewSchema.safeParse({ id: 1, name: 'Harrow Cross', timeZone: 'Europe/London', locale: null }).success).toBe(true);
    expect(siteViewSchema.safeParse({ id: 1, name: 'Harrow Cross', timeZone: 'Europe/London', locale: 'en-GB' }).success).toBe(true);
    expect(designViewSchema.safeParse(design40).success).toBe(true);
    expect(designListItemSchema.safeParse({ ...design40, unitCount: 3 }).success).toBe(true);
  });

  it('rejects a unit list item with a key the server does not send, or without one it sends', () => {
    const extra = unitListPageSchema.safeParse({ items: [{ ...unitItem(), colour: 'red' }], total: 1, page: 1, pageSize: 50 });
    expect(extra.success).toBe(false);
    expect(extra.error?.issues[0]).toMatchObject({ code: 'unrecognized_keys', keys: ['colour'], path: ['items', 0] });
    const { designReference: _, ...missing } = unitItem();
    expect(unitListPageSchema.safeParse({ items: [missing], total: 1, page: 1, pageSize: 50 }).error?.issues[0].path).toEqual(['items', 0, 'designReference']);
  });

  it('rejects an unknown event status, a date that is not ISO 8601 UTC and a non-integer id in a unit', () => {
    const bad = (over: Record<string, unknown>) => unitDetailSchema.safeParse({ ...unitDetail(), ...over }).error?.issues.map((i) => i.path.join('.'));
    expect(bad({ lastEventStatus: 'closed' })).toEqual(['lastEventStatus']);
    expect(bad({ lastEventAt: '1 July 2026' })).toEqual(['lastEventAt']);
    expect(bad({ designId: 2.5 })).toEqual(['designId']);
  });

  it('rejects a key added deep inside the unit file (the site of the unit) and inside the case format’s values', () => {
    const unit = unitDetail();
    expect(unitDetailSchema.safeParse({ ...unit, site: { ...unit.site, region: 'North' } }).error?.issues[0].path).toEqual(['site']);
    unit.readingSets[0].values = { ...unit.readingSets[0].values, operatorNote: 'not in the format' } as never;
    expect(unitDetailSchema.safeParse(unit).error?.issues[0].path).toEqual(['readingSets', 0, 'values']);
  });
});

describe('answers of the event routes', () => {
  it('parses the event file of GET /api/events/:id before and after a screening', () => {
    expect(eventDetailSchema.safeParse(eventDetail()).error).toBeUndefined();
    expect(eventDetailSchema.safeParse(screenedEvent()).error).toBeUndefined();
  });

  it('parses a page of GET /api/events', () => {
    expect(eventListPageSchema.safeParse({ items: [eventListItem()], total: 1, page: 1, pageSize: 50 }).error).toBeUndefined();
  });

  it('rejects an event file whose screening result breaks the result format, naming the path', () => {
    const event = screenedEvent();
    const broken = { ...event, screenings: [{ ...event.screenings[0], result: { ...screeningResult(), recommendation: 'maybe' } }] };
    expect(eventDetailSchema.safeParse(broken).error?.issues.map((i) => i.path.join('.'))).toEqual(['screenings.0.result.recommendation']);
  });

  it('rejects an event file without its e-mail log or with a notification in an unknown state', () => {
    const { notifications: _, ...withoutLog } = eventDetail();
    expect(eventDetailSchema.safeParse(withoutLog).error?.issues[0].path).toEqual(['notifications']);
    const mail = { id: 1, screeningId: 61, kind: 'screening', to: 'ops@kestrel-valley.example', subject: 'KVP-HX-T2: CONDITIONAL', status: 'bounced', attempts: 1, lastError: null, sentAt: null, createdAt: '2026-07-03T09:00:00.000Z' };
    expect(eventDetailSchema.safeParse(eventDetail({ notifications: [mail as never] })).error?.issues[0].path).toEqual(['notifications', 0, 'status']);
  });

  it('parses the answers of a screening run, a decision and a closed follow-up', () => {
    expect(runScreeningAnswerSchema.safeParse({ id: 61, result: screeningResult(), criteriaVersion: 2, comparison: false, computedAt: '2026-07-03T09:00:00.000Z', mailsQueued: 2 }).error).toBeUndefined();
    const followUp = { id: 71, task: 'Dissolved-gas sample 24 h after re-energising', dueAt: '2026-07-04T09:00:00.000Z', closedAt: null, closedById: null, result: null };
    const decision = { id: 81, screeningId: 61, managerId: 9, outcome: 'release-with-restrictions', restrictions: 'Load limited to 80 %', reason: 'Conditional: CHL shift under watch.', againstRecommendation: false, signedAt: '2026-07-03T10:00:00.000Z' };
    expect(decisionAnswerSchema.safeParse({ ...decision, eventStatus: 'released', followUps: [followUp] }).error).toBeUndefined();
    expect(decisionAnswerSchema.safeParse({ ...decision, eventStatus: 'screened', followUps: [] }).success).toBe(false);
    expect(closedFollowUpSchema.safeParse({ ...followUp, eventId: 11, closedAt: '2026-07-04T10:00:00.000Z', closedById: 9, result: 'C2H2 below 1 ppm' }).error).toBeUndefined();
  });
});

describe('answers of the sign-in, health and outbox routes', () => {
  it('parses the user of GET /api/auth/me and the answer of POST /api/auth/login', () => {
    expect(userViewSchema.safeParse(user).error).toBeUndefined();
    expect(loginAnswerSchema.safeParse({ token: 'eyJhbGciOiJIUzI1NiJ9.e30.x', user }).error).toBeUndefined();
    expect(userViewSchema.safeParse({ ...user, roles: ['tester', 'auditor'] }).error?.issues[0].path).toEqual(['roles', 1]);
    expect(userViewSchema.safeParse({ ...user, passwordHash: '$2a$10$…' }).success).toBe(false);
  });

  it('parses GET /api/health and GET /api/dev/outbox', () => {
    expect(healthAnswerSchema.safeParse({ status: 'ok', db: 'ok', demo: true, mailSink: true }).success).toBe(true);
    expect(healthAnswerSchema.safeParse({ status: 'degraded', db: 'down', demo: false, mailSink: false }).success).toBe(true);
    expect(healthAnswerSchema.safeParse({ status: 'fine', db: 'ok', demo: false, mailSink: false }).success).toBe(false);
    const message = { id: 4, to: 'ops@kestrel-valley.example', subject: 'KVP-HX-T2: CONDITIONAL', text: 'Screening…', receivedAt: '2026-07-03T09:01:00.000Z', attachments: [{ filename: 'report.pdf', contentType: 'application/pdf', size: 48213 }] };
    expect(outboxMessageSchema.safeParse(message).success).toBe(true);
    // Without its id an attachment cannot be opened from the outbox.
    const { id: _id, ...withoutId } = message;
    expect(outboxMessageSchema.safeParse(withoutId).error?.issues[0].path).toEqual(['id']);
  });
});

describe('the status and kind lists', () => {
  it('hold the values of the brief and the API contract', () => {
    expect(EVENT_STATUSES).toEqual(['logged', 'testing', 'screened', 'held', 'released']);
    expect(RECOMMENDATIONS).toEqual(['go', 'conditional', 'no-go']);
    expect([...ROLES].sort()).toEqual(['admin', 'engineer', 'manager', 'protection', 'tester']);
    expect(FINDING_CLASSIFICATIONS).toEqual(['no-damage', 'deformation-confirmed', 'other']);
  });

  it('are the lists the request schemas accept', () => {
    expect(eventListQuerySchema.safeParse({ status: 'held' }).success).toBe(true);
    expect(eventListQuerySchema.safeParse({ status: 'closed' }).success).toBe(false);
    expect(unitListQuerySchema.safeParse({ recommendation: 'no-go' }).success).toBe(true);
    expect(unitListQuerySchema.safeParse({ recommendation: 'stop' }).success).toBe(false);
    expect(readingSetBodySchema.safeParse({ kind: 'post-fault', takenAt: '2026-07-02T08:30:00Z' }).success).toBe(false);
    expect(readingSetBodySchema.safeParse({ kind: 'routine', takenAt: '2026-07-02T08:30:00Z' }).success).toBe(true);
    expect(findingBodySchema.safeParse({ classification: 'deformation-confirmed', text: 'Axial displacement of the LV winding.' }).success).toBe(true);
    expect(findingBodySchema.safeParse({ classification: 'unknown', text: 'x' }).success).toBe(false);
  });
});
