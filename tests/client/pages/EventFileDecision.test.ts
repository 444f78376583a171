// The event file after a screening: the manager's decision panel (against-the-recommendation rule, restrictions,
// follow-ups pre-filled, confirmation), the signed decision, follow-ups with their due state, findings, the e-mail log.
import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../src/api/auth';
import type { DecisionView, EventDetail } from '../../../src/api/events';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { screenedEvent, screeningResult, storedScreening } from './fixtures';
import { ICON_SVGS } from '../../../src/icons';

// Which icon a q-icon draws (inline SVG, no ligature word): its SVG paths, named back through src/icons.ts.
const iconOf = (el: Element) => {
  const drawn = [...el.querySelectorAll('path')].map((p) => p.getAttribute('d')).join('&&');
  return Object.keys(ICON_SVGS).find((name) => ICON_SVGS[name].split('&&').map((p) => p.split('@@')[0]).join('&&') === drawn);
};

enableAutoUnmount(afterEach);

// The event file is a lazy route with many components: transform it once before the tests, so that the first test's
// time is its own (a cold worker on a busy machine can take seconds).
beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

type Script = Parameters<typeof scriptFetch>[0];

function signedInAs(roles: Role[], event: EventDetail | (() => EventDetail) = screenedEvent(), extra: Script = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id: 9, name: 'Priya Nair', roles }) },
    'GET /api/health': { body: healthy },
    'GET /api/events/11': () => ({ body: typeof event === 'function' ? event() : event }),
    ...extra,
  });
}

const decisionPosts = (requests: { method: string; url: string }[]) =>
  requests.filter((r) => r.method === 'POST' && r.url === '/api/screenings/61/decision');

async function choose(wrapper: VueWrapper, outcome: string): Promise<void> {
  await wrapper.get(`[data-test="outcome-${outcome}"]`).trigger('click');
  await settle();
}

async function type(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  await wrapper.get(`textarea[data-test="${testId}"]`).setValue(value);
  await settle();
}

async function clickSign(wrapper: VueWrapper): Promise<void> {
  await wrapper.get('[data-test="decision-panel"]').trigger('submit');
  await settle();
}

const confirmButton = () => document.body.querySelector<HTMLElement>('[data-test="confirm-ok"]');

const signed: DecisionView = {
  id: 81,
  screeningId: 61,
  managerId: 9,
  outcome: 'hold',
  restrictions: null,
  reason: 'Bushing C1 doubtful; hold until the bushing is re-tested.',
  againstRecommendation: true,
  signedAt: '2026-07-03T11:00:00.000Z',
};

describe('EventFilePage — decision panel', () => {
  afterEach(() => {
    vi.useRealTimers();
    resetClientState();
  });

  it('pre-fills the follow-ups from the screening: gas samples 24 h, 1 week and 1 month from now, the sweep without a date', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-07-03T12:00:00.000Z'));
    signedInAs(['manager']);
    const { wrapper } = await mountApp('/events/11');

    await choose(wrapper, 'release-with-restrictions');
    const rows = wrapper.findAll('[data-test="decision-follow-up"]');
    expect(rows.map((r) => (r.get('input[data-test^="follow-up-task-"]').element as HTMLInputElement).value)).toEqual([
      'Dissolved-gas sample 24 h after re-energising',
      'Dissolved-gas sample 1 week after re-energising',
      'Dissolved-gas sample 1 month after re-energising',
      'Frequency-response sweep at the next outage',
    ]);
    expect(rows.map((r) => (r.get('input[data-test^="follow-up-due-"]').element as HTMLInputElement).value)).toEqual([
      '2026-07-04T13:00',
      '2026-07-10T13:00',
      '2026-08-02T13:00',
      '',
    ]);
  });

  it('requires a reason of at least 20 characters against the recommendation and posts nothing before', async () => {
    const { requests } = signedInAs(['manager'], screenedEvent(), {
      'POST /api/screenings/61/decision': { status: 201, body: { ...signed, outcome: 'release', againstRecommendation: true } },
    });
    const { wrapper } = await mountApp('/events/11');

    // conditional → plain release goes against the recommendation
    await choose(wrapper, 'release');
    expect(wrapper.get('[data-test="against-warning"]').text()).toContain('Against the recommendation.');
    await type(wrapper, 'decision-reason', 'Looks fine.');
    await clickSign(wrapper);

    const reasonField = wrapper.get('textarea[data-test="decision-reason"]').element.closest('.q-field')!;
    expect(reasonField.classList.contains('q-field--error')).toBe(true);
    expect(reasonField.textContent).toContain('at least 20 characters (11 so far)');
    expect(confirmButton()).toBeNull();
    expect(decisionPosts(requests)).toHaveLength(0);

    await type(wrapper, 'decision-reason', 'CHL shift is within the bushing C1 tolerance.');
    await clickSign(wrapper);
    expect(confirmButton()).not.toBeNull();
    expect(document.body.querySelector('[data-test="confirm-dialog"]')!.textContent).toContain('Against the recommendation.');
    expect(decisionPosts(requests)).toHaveLength(0);
    confirmButton()!.click();
    await vi.waitFor(() => expect(decisionPosts(requests)).toHaveLength(1));
    expect(decisionPosts(requests)[0]).toMatchObject({ body: { outcome: 'release', reason: 'CHL shift is within the bushing C1 tolerance.' } });
  });

  it('does not warn or ask for 20 characters when the outcome follows the recommendation', async () => {
    signedInAs(['manager']);
    const { wrapper } = await mountApp('/events/11');

    await choose(wrapper, 'hold');
    expect(wrapper.find('[data-test="against-warning"]').exists()).toBe(false);
    await type(wrapper, 'decision-reason', 'Hold.');
    await clickSign(wrapper);
    expect(confirmButton()).not.toBeNull();
  });

  it('requires restrictions for a release with restrictions', async () => {
    const { requests } = signedInAs(['manager']);
    const { wrapper } = await mountApp('/events/11');

    await choose(wrapper, 'release-with-restrictions');
    await type(wrapper, 'decision-reason', 'CHL shift 3.7 %: release under watch.');
    await clickSign(wrapper);

    const field = wrapper.get('textarea[data-test="decision-restrictions"]').element.closest('.q-field')!;
    expect(field.classList.contains('q-field--error')).toBe(true);
    expect(field.textContent).toContain('Say which restrictions apply');
    expect(confirmButton()).toBeNull();
    expect(decisionPosts(requests)).toHaveLength(0);
  });

  it('signs a release with restrictions after confirmation, sends the confirmed follow-ups, and then shows the decision', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-07-03T12:00:00.000Z'));
    const decision: DecisionView = {
      ...signed,
      outcome: 'release-with-restrictions',
      restrictions: 'Load limited to 80 %; reclosing blocked on feeder 4.',
      reason: 'CHL shift 3.7 %: release under watch.',
      againstRecommendation: false,
    };
    let decided = false;
    const { requests } = signedInAs(['manager'], () => (decided ? screenedEvent({ status: 'released', decision, decisions: [decision] }) : screenedEvent()), {
      'POST /api/screenings/61/decision': () => {
        decided = true;
        return { status: 201, body: decision };
      },
    });
    const { wrapper } = await mountApp('/events/11');

    await choose(wrapper, 'release-with-restrictions');
    await type(wrapper, 'decision-restrictions', decision.restrictions!);
    await type(wrapper, 'decision-reason', decision.reason);
    // Drop the sweep row: the manager edits the proposal.
    await wrapper.findAll('[data-test="decision-follow-up"]')[3].get('button').trigger('click');
    await settle();
    await clickSign(wrapper);
    confirmButton()!.click();
    await vi.waitFor(() => expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(false));

    expect(decisionPosts(requests)[0]).toMatchObject({
      body: {
        outcome: 'release-with-restrictions',
        restrictions: 'Load limited to 80 %; reclosing blocked on feeder 4.',
        reason: 'CHL shift 3.7 %: release under watch.',
        followUps: [
          { task: 'Dissolved-gas sample 24 h after re-energising', dueAt: '2026-07-04T12:00:00.000Z' },
          { task: 'Dissolved-gas sample 1 week after re-energising', dueAt: '2026-07-10T12:00:00.000Z' },
          { task: 'Dissolved-gas sample 1 month after re-energising', dueAt: '2026-08-02T12:00:00.000Z' },
        ],
      },
    });
    const shown = wrapper.get('[data-test="decision"]');
    expect(shown.get('[data-test="decision-outcome"]').text()).toBe('Release with restrictions');
    expect(shown.get('[data-test="decision-restrictions-text"]').text()).toContain('reclosing blocked');
    expect(shown.get('[data-test="decision-signed"]').text()).toContain('2026-07-03 12:00 +01:00 Europe/London');
    expect(shown.find('[data-test="decision-against"]').exists()).toBe(false);
  });

  it('shows a server refusal of the decision in words and keeps the form', async () => {
    signedInAs(['manager'], screenedEvent(), {
      'POST /api/screenings/61/decision': {
        status: 409,
        body: { error: { code: 'not_newest', message: 'A newer screening exists: decide on that one.' } },
      },
    });
    const { wrapper } = await mountApp('/events/11');

    await choose(wrapper, 'hold');
    await type(wrapper, 'decision-reason', 'Hold pending the sweep.');
    await clickSign(wrapper);
    confirmButton()!.click();
    await vi.waitFor(() => expect(wrapper.find('[data-test="decision-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="decision-error"]').text()).toContain('A newer screening exists: decide on that one.');
    expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(true);
  });

  it('hides the decision panel from users without the manager role (admin, tester, engineer) and says it awaits the manager', async () => {
    for (const roles of [['admin'], ['tester'], ['engineer', 'admin']] as Role[][]) {
      signedInAs(roles);
      const { wrapper } = await mountApp('/events/11');
      expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(false);
      expect(wrapper.get('[data-test="awaiting-decision"]').text()).toContain("Awaiting the operations manager's decision");
      wrapper.unmount();
      resetClientState();
    }
  });

  it('hides the decision panel from a manager while the event is not screened', async () => {
    signedInAs(['manager'], screenedEvent({ status: 'testing' }));
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(false);
  });

  it('highlights a signed decision against the recommendation with an icon and the words', async () => {
    signedInAs(['engineer'], screenedEvent({
      status: 'held',
      screenings: [storedScreening({ recommendation: 'go', result: screeningResult({ recommendation: 'go' }) })],
      decision: signed,
      decisions: [signed],
      people: { ...screenedEvent().people, '9': { id: 9, name: 'Priya Nair', email: 'p.nair@kestrel-valley.example' } },
    }));
    const { wrapper } = await mountApp('/events/11');

    const shown = wrapper.get('[data-test="decision"]');
    expect(shown.get('[data-test="decision-outcome"]').text()).toBe('Hold');
    const against = shown.get('[data-test="decision-against"]');
    expect(against.text()).toContain('Against the recommendation');
    expect(iconOf(against.get('.q-icon').element)).toBe('report');
    expect(shown.get('[data-test="recommendation-badge"]').attributes('data-recommendation')).toBe('go');
    expect(shown.get('[data-test="decision-signed"]').text()).toContain('by Priya Nair');
  });
});

describe('EventFilePage — follow-ups, findings and e-mail log', () => {
  afterEach(() => {
    vi.useRealTimers();
    resetClientState();
  });

  const released = (extra: Partial<EventDetail> = {}) =>
    screenedEvent({
      status: 'released',
      followUps: [
        { id: 1, task: 'Dissolved-gas sample 24 h after re-energising', dueAt: '2026-07-04T12:00:00.000Z', closedAt: null, closedById: null, result: null },
        { id: 2, task: 'Dissolved-gas sample 1 week after re-energising', dueAt: '2026-07-10T12:00:00.000Z', closedAt: null, closedById: null, result: null },
        { id: 3, task: 'Frequency-response sweep at the next outage', dueAt: null, closedAt: null, closedById: null, result: null },
        { id: 4, task: 'Dissolved-gas sample (pre-energising)', dueAt: '2026-07-03T08:00:00.000Z', closedAt: '2026-07-03T09:00:00.000Z', closedById: 7, result: 'C2H2 0 ppm' },
      ],
      ...extra,
    });

  it('shows each follow-up’s due state as icon and word — overdue, scheduled, no date, closed', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-07-05T12:00:00.000Z'));
    signedInAs(['engineer'], released());
    const { wrapper } = await mountApp('/events/11');

    const items = wrapper.findAll('[data-test="follow-up"]');
    expect(items.map((i) => i.attributes('data-state'))).toEqual(['overdue', 'scheduled', 'undated', 'closed']);
    expect(items.map((i) => i.get('[data-test="follow-up-state"]')).map((s) => `${iconOf(s.get('.q-icon').element)} ${s.text()}`)).toEqual(['alarm Overdue', 'event Scheduled', 'event_busy No date', 'task_alt Closed']);
    expect(wrapper.get('[data-test="follow-up-summary"]').text()).toContain('3 open, 1 overdue');
    expect(items[3].get('[data-test="follow-up-result"]').text()).toContain('by Ruth Okafor: C2H2 0 ppm');
    // An engineer may not close follow-ups.
    expect(wrapper.find('[data-test="follow-up-close-1"]').exists()).toBe(false);
  });

  it('lets a tester close a follow-up with its result, and asks for the result first', async () => {
    const { requests } = signedInAs(['tester'], released(), {
      'POST /api/follow-ups/1/close': { body: { id: 1, closedAt: '2026-07-04T13:00:00.000Z', result: 'DGA normal' } },
    });
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="follow-up-close-1"]').trigger('click');
    await settle();
    await wrapper.get('[data-test="follow-up-submit"]').trigger('click');
    await settle();
    expect(wrapper.get('textarea[data-test="follow-up-result-input"]').element.closest('.q-field')!.textContent).toContain('Record the result');
    expect(requests.some((r) => r.url === '/api/follow-ups/1/close')).toBe(false);

    await wrapper.get('textarea[data-test="follow-up-result-input"]').setValue('DGA normal: C2H2 0 ppm, H2 12 ppm');
    await wrapper.get('[data-test="follow-up-submit"]').trigger('click');
    await vi.waitFor(() => expect(requests.some((r) => r.url === '/api/follow-ups/1/close')).toBe(true));
    expect(requests.find((r) => r.url === '/api/follow-ups/1/close')!.body).toEqual({ result: 'DGA normal: C2H2 0 ppm, H2 12 ppm' });
  });

  it('lists findings with their classification in words and lets an asset engineer record one', async () => {
    const { requests } = signedInAs(
      ['engineer'],
      released({
        findings: [{ id: 5, classification: 'deformation-confirmed', text: 'LV winding phase B buckled inward at the bottom.', recordedById: 7, recordedAt: '2026-07-08T10:00:00.000Z', attachments: [] }],
      }),
      { 'POST /api/events/11/findings': { status: 201, body: { id: 6 } } },
    );
    const { wrapper } = await mountApp('/events/11');

    const finding = wrapper.get('[data-test="finding"]');
    expect(finding.text()).toContain('Deformation confirmed');
    expect(finding.text()).toContain('LV winding phase B buckled inward');

    await wrapper.get('[data-test="finding-no-damage"]').trigger('click');
    await wrapper.get('textarea[data-test="finding-text"]').setValue('Internal inspection: no displacement seen.');
    await wrapper.get('[data-test="finding-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.url === '/api/events/11/findings')).toBe(true));
    expect(requests.find((r) => r.url === '/api/events/11/findings')!.body).toEqual({ classification: 'no-damage', text: 'Internal inspection: no displacement seen.' });
  });

  it('offers the findings form to asset engineers only', async () => {
    signedInAs(['manager', 'tester'], released());
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.find('[data-test="finding-form"]').exists()).toBe(false);
    expect(wrapper.get('[data-test="no-findings"]').text()).toContain('the asset engineer records what was found');
  });

  it('lists the event’s e-mails with recipient, subject, status as icon and word, attempts and the last error', async () => {
    signedInAs(
      ['manager'],
      screenedEvent({
        notifications: [
          { id: 1, screeningId: 61, kind: 'screening', to: 'ops@kestrel-valley.example', subject: 'KVP-HX-T2: CONDITIONAL', status: 'sent', attempts: 1, lastError: null, sentAt: '2026-07-03T09:01:00.000Z', createdAt: '2026-07-03T09:00:00.000Z' },
          { id: 2, screeningId: 61, kind: 'screening', to: 'night@kestrel-valley.example', subject: 'KVP-HX-T2: CONDITIONAL', status: 'failed', attempts: 5, lastError: '550 mailbox unavailable', sentAt: null, createdAt: '2026-07-03T09:00:00.000Z' },
        ],
      }),
    );
    const { wrapper } = await mountApp('/events/11');

    const rows = wrapper.findAll('[data-test="email-row"]');
    expect(rows).toHaveLength(2);
    expect(rows[0].text()).toContain('ops@kestrel-valley.example');
    expect(rows[0].text()).toContain('Sent');
    expect(rows[1].text()).toContain('Failed');
    expect(rows[1].text()).toContain('550 mailbox unavailable');
    expect(rows[1].findAll('td')[4].text()).toBe('5');
  });
});
