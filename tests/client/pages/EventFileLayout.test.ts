// The event file laid out by task: the verdict area first with the next step, then the card of the person expected to
// act (tester → sessions with the run control, manager → decision, engineer → findings, protection → the fault and
// relay records), the other sections foldable (folded when empty or not needed now) and reached from the in-page menu.
import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it } from 'vitest';
import type { Role } from '../../../src/api/auth';
import type { EventDetail } from '../../../src/api/events';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { eventDetail, screenedEvent, screeningResult, storedScreening } from './fixtures';

enableAutoUnmount(afterEach);

beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

function signedInAs(roles: Role[], event: EventDetail) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles }) },
    'GET /api/health': { body: healthy },
    'GET /api/events/11': { body: event },
  });
}

/** The page's sections in order: their data-test and whether they are unfolded. */
function sections(wrapper: VueWrapper): { test: string; open: boolean }[] {
  return wrapper.findAll('[data-event-section]').map((s) => ({ test: s.attributes('data-test') ?? '', open: s.attributes('data-open') === 'true' }));
}

describe('EventFilePage — layout by task', () => {
  afterEach(resetClientState);

  it('gives a tester, while testing, the next step and the sessions card (with the run control) first', async () => {
    signedInAs(['tester'], eventDetail());
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="next-step"]').text()).toContain('Enter the post-fault readings and sweeps, then run the screening');
    const order = sections(wrapper);
    expect(order[0]).toEqual({ test: 'sessions', open: true });
    expect(wrapper.get('[data-test="sessions"]').text()).toContain('your part now');
    expect(wrapper.find('[data-test="sessions"] [data-test="run-screening"]').exists()).toBe(true);
    // Empty sections are folded and come after the open ones; the audit trail is last.
    const byTest = Object.fromEntries(order.map((s) => [s.test, s.open]));
    expect(byTest['follow-ups-section']).toBe(false);
    expect(byTest['findings-section']).toBe(false);
    expect(byTest['email-section']).toBe(false);
    expect(byTest['fault-section']).toBe(true);
    expect(order[order.length - 1].test).toBe('audit-section');
    const firstFolded = order.findIndex((s) => !s.open);
    expect(order.slice(firstFolded, -1).every((s) => !s.open)).toBe(true);
    // The verdict area comes before every section.
    const html = wrapper.html();
    expect(html.indexOf('data-test="next-step"')).toBeLessThan(html.indexOf('data-test="sessions"'));
  });

  it('gives a manager, on a screened event, the decision panel right after the verdict and the evidence open (conditional)', async () => {
    signedInAs(['manager'], screenedEvent());
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="next-step"]').text()).toContain('Sign the decision below');
    const order = sections(wrapper);
    expect(order.slice(0, 2)).toEqual([
      { test: 'decision-section', open: true },
      { test: 'screening-section', open: true },
    ]);
    expect(wrapper.get('[data-test="decision-section"]').find('[data-test="decision-panel"]').exists()).toBe(true);
    // Not needed now for the manager: the sessions are folded (still in the page).
    expect(order.find((s) => s.test === 'sessions')!.open).toBe(false);
    expect(wrapper.find('[data-test="session"]').exists()).toBe(true);
  });

  it('folds the full indicator table when the verdict is go', async () => {
    const go = storedScreening({ recommendation: 'go', result: screeningResult({ recommendation: 'go', reasons: ['No indicator above watch'] }) });
    signedInAs(['manager'], screenedEvent({ screenings: [go] }));
    const { wrapper } = await mountApp('/events/11');

    expect(sections(wrapper).find((s) => s.test === 'screening-section')!.open).toBe(false);
    expect(wrapper.findAll('[data-test="indicator-row"]')).toHaveLength(4);
  });

  it('gives an asset engineer, on a held event, the findings card first', async () => {
    signedInAs(['engineer'], screenedEvent({ status: 'held' }));
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="next-step"]').text()).toContain('Record the inspection findings');
    expect(sections(wrapper)[0]).toEqual({ test: 'findings-section', open: true });
    expect(wrapper.find('[data-test="finding-form"]').exists()).toBe(true);
  });

  it('gives a protection engineer the fault and the relay records first, and says who is expected to act', async () => {
    signedInAs(['protection'], screenedEvent({ attachments: [] }));
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="next-step"]').text()).toContain('The operations manager is expected to sign the decision');
    expect(sections(wrapper).slice(0, 2)).toEqual([
      { test: 'fault-section', open: true },
      { test: 'attachments', open: true },
    ]);
    // Their card, but nothing waits on them now.
    expect(wrapper.get('[data-test="fault-section"] .event-section__mine').text()).toBe('your part');
  });

  it('folds and unfolds a section from its heading, and the in-page menu unfolds the section it links to', async () => {
    signedInAs(['tester'], eventDetail());
    const { wrapper } = await mountApp('/events/11');

    const toggle = wrapper.get('[data-test="section-toggle-fault"]');
    expect(toggle.attributes('aria-expanded')).toBe('true');
    await toggle.trigger('click');
    expect(wrapper.get('[data-test="fault-section"]').attributes('data-open')).toBe('false');
    expect(toggle.attributes('aria-expanded')).toBe('false');
    expect(wrapper.get('#fault-body').isVisible()).toBe(false);

    const menu = wrapper.get('[data-test="event-page-menu"]');
    const links = menu.findAll('a').map((a) => a.attributes('href'));
    expect(links).toEqual(['#verdict', ...sections(wrapper).map((s) => `#${wrapper.get(`[data-test="${s.test}"]`).attributes('id')}`)]);
    await menu.get('[data-test="menu-email"]').trigger('click');
    await settle();
    expect(wrapper.get('[data-test="email-section"]').attributes('data-open')).toBe('true');
  });

  it('shows the duty once (with the fault) and the cautions once (beside the verdict)', async () => {
    signedInAs(['manager'], screenedEvent());
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.findAll('[data-test="duty-figures"]')).toHaveLength(1);
    expect(wrapper.find('[data-test="fault-section"] [data-test="duty-figures"]').exists()).toBe(true);
    expect(wrapper.findAll('[data-test="cautions"]')).toHaveLength(1);
    expect(wrapper.find('[data-test="screenings"] [data-test="cautions"]').exists()).toBe(true);
  });
});
