import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type ScriptedResponse, type RecordedRequest } from '../helpers';
import { eventDetail, unitDetail } from './fixtures';

enableAutoUnmount(afterEach);

// The event file is a lazy route with many components: transform it once before the tests, so that the first test's
// time is its own (a cold worker on a busy machine can take seconds).
beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

function signedInAsProtection(post: ScriptedResponse | ((r: RecordedRequest) => ScriptedResponse) = { status: 201, body: { id: 11 } }) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['protection'], name: 'Dara Whitcombe' }) },
    'GET /api/health': { body: healthy },
    'GET /api/units/3': { body: unitDetail() },
    'GET /api/units': { body: { items: [], total: 0 } },
    'POST /api/events': post,
    'GET /api/events/11': { body: eventDetail() },
  });
}

async function type(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  await wrapper.get(`input[data-test="${testId}"]`).setValue(value);
  await settle();
}

function fieldText(wrapper: VueWrapper, testId: string): string {
  return wrapper.get(`input[data-test="${testId}"]`).element.closest('.q-field')?.textContent ?? '';
}

describe('EventNewPage (/events/new)', () => {
  afterEach(resetClientState);

  it('shows live duty figures as the shot is typed: 6.3 kA on the LV side of a 40 MVA 132/33 kV, 10.5 % unit is 9.0 × rated', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');
    expect(wrapper.get('[data-test="duty-empty"]').text()).toContain('enter at least one shot');

    await wrapper.get('[data-test="side-lv"]').trigger('click');
    await type(wrapper, 'shot-current-0', '6.3');
    await type(wrapper, 'shot-duration-0', '0.12');

    // case-format worked example: rated LV current 40000/(√3·33) = 699.819 A; 6300/699.819 = 9.0023 per unit.
    expect(wrapper.get('[data-test="duty-per-unit"]').text()).toBe('9.0 × rated');
    // (9.0023/9.5238)² = 89.35 % of the design force (maximum 100/10.5 = 9.5238 per unit, category IV).
    expect(wrapper.get('[data-test="duty-force"]').text()).toBe('89.3 %');
    expect(wrapper.get('[data-test="duty-category"]').text()).toBe('IV');
    expect(wrapper.get('[data-test="duty-high"]').text()).toContain('Yes');
    expect(wrapper.get('[data-test="duty-beyond"]').text()).toContain('No');
    // I²t = 9.0023² × 0.12 = 9.725
    expect(wrapper.get('[data-test="duty-i2t"]').text()).toContain('9.73');

    await type(wrapper, 'shot-current-0', '3.15');
    expect(wrapper.get('[data-test="duty-per-unit"]').text()).toBe('4.5 × rated');
    expect(wrapper.get('[data-test="duty-high"]').text()).toContain('No');
  });

  it('asks where the fault was (default: the measured side) and whether the currents are line or winding currents, and sends both', async () => {
    const { requests } = signedInAsProtection();
    const { wrapper, router } = await mountApp('/events/new?unitId=3');

    await type(wrapper, 'occurred-at', '2026-07-01T04:12');
    await wrapper.get('[data-test="type-phase-to-ground"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    await settle();
    // Not picked yet: the fault location follows the measured side.
    expect(wrapper.get('[data-test="location-lv"]').attributes('aria-checked')).toBe('true');
    expect(wrapper.get('[data-test="location-hv"]').attributes('aria-checked')).toBe('false');
    expect(wrapper.get('[data-test="current-is-line"]').attributes('aria-checked')).toBe('true');
    await wrapper.get('[data-test="location-hv"]').trigger('click');
    await wrapper.get('[data-test="current-is-winding"]').trigger('click');
    await type(wrapper, 'shot-current-0', '1.0');
    await type(wrapper, 'shot-duration-0', '0.3');
    await wrapper.get('[data-test="event-form"]').trigger('submit');
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('event-file'), { timeout: 5000 });

    const post = requests.find((r) => r.method === 'POST' && r.url === '/api/events')!.body as Record<string, unknown>;
    expect(post.side).toBe('lv');
    expect(post.location).toBe('hv');
    expect(post.currentIs).toBe('winding');
  });

  it('shows the winding current beside the line current as a shot is typed (YNd1, phase-to-phase on the delta LV side)', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="type-phase-to-phase"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    await type(wrapper, 'shot-current-0', '6.3');
    await type(wrapper, 'shot-duration-0', '0.12');

    const figures = wrapper.get('[data-test="shot-winding-0"]').text();
    // Line: 6300/699.819 = 9.0 × rated. A phase-to-phase fault at delta terminals drives 2/3 of the line current
    // through the faulted delta winding (delta relations): 4200 A; rated delta winding current 699.819/√3 = 404.04 A,
    // so 4200/404.04 = 10.4 × rated (= 2/√3 × the line per unit).
    expect(figures).toContain('line 9.0 × rated');
    expect(figures).toContain('winding 10.4 × rated');
    expect(figures).toContain('4200 A in the LV winding');
    expect(wrapper.get('[data-test="duty-per-unit"]').text()).toBe('10.4 × rated');
    expect(wrapper.get('[data-test="duty-current-basis"]').text()).toBe('converted from the line current by the vector group');
    expect(wrapper.get('[data-test="duty-winding"]').text()).toContain('1.155 × line current');
    // 10.4 × rated is above the design maximum 100/10.5 = 9.52 × rated: the shot says so.
    expect(wrapper.get('[data-test="shot-over-maximum-0"]').text()).toContain('Above the design maximum current (9.5 × rated');
  });

  it('converts a ground fault on the grounded-wye HV side, measured at the delta LV terminals, by √3', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="type-phase-to-ground"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    await wrapper.get('[data-test="location-hv"]').trigger('click');
    await type(wrapper, 'shot-current-0', '1.0');
    await type(wrapper, 'shot-duration-0', '0.2');

    const figures = wrapper.get('[data-test="shot-winding-0"]').text();
    // 1000/699.819 = 1.43 × rated line; the delta-side lines see 1/√3 of the winding current: 2.47 × rated; in amperes
    // the faulted delta winding carries the line current, 1000 A.
    expect(figures).toContain('line 1.4 × rated');
    expect(figures).toContain('winding 2.5 × rated');
    expect(figures).toContain('1000 A in the LV winding');
    expect(wrapper.find('[data-test="shot-over-maximum-0"]').exists()).toBe(false);
  });

  it('shows the engine’s reason when the winding current cannot be derived (ground fault measured at the delta terminals)', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="type-phase-to-ground"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    await type(wrapper, 'shot-current-0', '3.0');
    await type(wrapper, 'shot-duration-0', '0.2');

    expect(wrapper.get('[data-test="shot-winding-0"]').text()).toContain('line 4.3 × rated');
    expect(wrapper.get('[data-test="shot-winding-unknown-0"]').text()).toContain('winding current unknown');
    // The reason once, below the shots.
    expect(wrapper.findAll('[data-test="shot-winding-reason"]')).toHaveLength(1);
    expect(wrapper.get('[data-test="shot-winding-reason"]').text()).toContain('ground fault measured at delta terminals');
    expect(wrapper.get('[data-test="duty-current-basis"]').text()).toContain('line current used as the winding current');
    expect(wrapper.get('[data-test="duty-winding-reason"]').text()).toContain('enter the winding current or attach the relay record');

    // Said to be winding currents: no conversion needed, the reason goes away (rated delta winding current 404.04 A).
    await wrapper.get('[data-test="current-is-winding"]').trigger('click');
    await settle();
    expect(wrapper.find('[data-test="shot-winding-reason"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="shot-winding-unknown-0"]').exists()).toBe(false);
    const figures = wrapper.get('[data-test="shot-winding-0"]').text();
    expect(figures).not.toContain('line');
    expect(figures).toContain('winding 7.4 × rated');
    expect(figures).toContain('3000 A in the LV winding');
    expect(wrapper.get('[data-test="duty-current-basis"]').text()).toBe('entered as winding current');
  });

  it('warns next to the shot when it is above the design maximum, instead of printing an absurd force', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="type-three-phase"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    // 63 kA typed for 6.3 kA: 90 × rated, far above the 9.52 × rated the 10.5 % impedance allows.
    await type(wrapper, 'shot-current-0', '63');
    await type(wrapper, 'shot-duration-0', '0.12');

    const warning = wrapper.get('[data-test="shot-over-maximum-0"]').text();
    expect(warning).toContain('Above the design maximum current (9.5 × rated');
    // 9.5238 × 699.819 A = 6.66 kA
    expect(warning).toContain('about 6.66 kA');
    expect(warning).toContain('kA, not A');
    expect(wrapper.get('[data-test="duty-force"]').text()).toContain('over 100 %');
    // (90/9.52)² = 8936 %: not printed.
    expect(wrapper.get('[data-test="duty-force"]').text()).not.toMatch(/\d{4}/);
    expect(wrapper.get('[data-test="duty-over-maximum"]').text()).toContain('Check the current');

    await type(wrapper, 'shot-current-0', '6.3');
    expect(wrapper.find('[data-test="shot-over-maximum-0"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="duty-over-maximum"]').exists()).toBe(false);
  });

  it('tells a fault below the mechanical segment as time against the allowed time, not as a percentage of K', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="type-three-phase"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    // 3.32414 kA / 699.819 A = 4.75 × rated: below the segment start 0.5 × 9.52 = 4.76 (category IV), and on the
    // IEEE C57.109 thermal curve point (4.75 × rated, 60 s). Two shots, 0.5 s + 0.3 s.
    await type(wrapper, 'shot-current-0', '3.32414');
    await type(wrapper, 'shot-duration-0', '0.5');
    await wrapper.get('[data-test="add-shot"]').trigger('click');
    await settle();
    await type(wrapper, 'shot-current-1', '2');
    await type(wrapper, 'shot-duration-1', '0.3');

    expect(wrapper.get('[data-test="duty-high"]').text()).toContain('No');
    const thermal = wrapper.get('[data-test="duty-thermal"]').text();
    // 0.8 s of 60 s = 1.3 %
    expect(thermal).toContain('0.8 s of 60 s allowed');
    expect(thermal).toContain('(1.3 %)');
    expect(wrapper.get('[data-test="duty-i2t"]').text()).not.toContain('% of K');
  });

  it('checks shot ranges as the user types and names a decimal comma', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await type(wrapper, 'shot-current-0', '600');
    expect(fieldText(wrapper, 'shot-current-0')).toContain('above 500 kA: check the unit');
    await type(wrapper, 'shot-current-0', '6,3');
    expect(fieldText(wrapper, 'shot-current-0')).toContain('decimal comma');
    await type(wrapper, 'shot-duration-0', '0');
    expect(wrapper.get('input[data-test="shot-duration-0"]').element.closest('.q-field')?.classList.contains('q-field--error')).toBe(true);
    await type(wrapper, 'shot-duration-0', '0.1');
    expect(wrapper.get('input[data-test="shot-duration-0"]').element.closest('.q-field')?.classList.contains('q-field--error')).toBe(false);
  });

  it('adds and removes reclose shot rows, with the units inside the fields', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="add-shot"]').trigger('click');
    await settle();
    expect(wrapper.findAll('[data-test="shot-row"]')).toHaveLength(2);
    expect(fieldText(wrapper, 'shot-current-1')).toContain('kA');
    expect(fieldText(wrapper, 'shot-duration-1')).toContain('s');
    await wrapper.get('[data-test="remove-shot-1"]').trigger('click');
    await settle();
    expect(wrapper.findAll('[data-test="shot-row"]')).toHaveLength(1);
  });

  it('warns that an internal protection makes the recommendation no-go, and not for overcurrent', async () => {
    signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="protection-overcurrent"]').trigger('click');
    await settle();
    expect(wrapper.find('[data-test="internal-warning"]').exists()).toBe(false);
    await wrapper.get('[data-test="protection-buchholz-trip"]').trigger('click');
    await settle();
    const warning = wrapper.get('[data-test="internal-warning"]').text();
    expect(warning).toContain('Buchholz trip');
    expect(warning).toContain('no-go');
  });

  it('submits the fault with the time read in the site’s zone and opens the event file', async () => {
    const { requests } = signedInAsProtection();
    const { wrapper, router } = await mountApp('/events/new?unitId=3');

    await type(wrapper, 'occurred-at', '2026-07-01T04:12');
    expect(fieldText(wrapper, 'occurred-at')).toContain('Europe/London');
    await wrapper.get('[data-test="type-three-phase"]').trigger('click');
    await wrapper.get('[data-test="side-lv"]').trigger('click');
    for (const p of ['A', 'B', 'C']) await wrapper.get(`[data-test="phase-${p}"]`).trigger('click');
    await type(wrapper, 'shot-current-0', '6.3');
    await type(wrapper, 'shot-duration-0', '0.12');
    await wrapper.get('[data-test="add-shot"]').trigger('click');
    await settle();
    await type(wrapper, 'shot-current-1', '6.1');
    await type(wrapper, 'shot-duration-1', '0.08');
    await wrapper.get('[data-test="protection-overcurrent"]').trigger('click');
    await wrapper.get('[data-test="event-form"]').trigger('submit');
    // The event file is a lazy route: its first load in a cold test worker can take over a second.
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('event-file'), { timeout: 5000 });

    const post = requests.find((r) => r.method === 'POST' && r.url === '/api/events');
    expect(post?.body).toEqual({
      unitId: 3,
      // 04:12 British Summer Time is 03:12 UTC.
      occurredAt: '2026-07-01T03:12:00.000Z',
      type: 'three-phase',
      side: 'lv',
      // Rules revision 2: where the fault was (default: the measured side) and what the currents are (default: line).
      location: 'lv',
      currentIs: 'line',
      faultedPhases: 'ABC',
      shots: [
        { currentKA: 6.3, durationS: 0.12 },
        { currentKA: 6.1, durationS: 0.08 },
      ],
      transformerTripped: true,
      protectionOperated: ['overcurrent'],
    });
    expect(router.currentRoute.value.params.id).toBe('11');
  });

  it('sends nothing while required fields are missing, and marks them', async () => {
    const { requests } = signedInAsProtection();
    const { wrapper } = await mountApp('/events/new?unitId=3');

    await wrapper.get('[data-test="event-form"]').trigger('submit');
    await settle();

    expect(requests.some((r) => r.method === 'POST')).toBe(false);
    expect(wrapper.get('[data-test="form-error"]').text()).toContain('Some fields need attention');
    expect(fieldText(wrapper, 'occurred-at')).toContain('required');
    expect(wrapper.text()).toContain('pick the fault type');
  });

  it('shows the server’s field errors next to the fields they name', async () => {
    signedInAsProtection({
      status: 400,
      body: { error: { code: 'invalid_input', message: 'Some fields are invalid.', fields: { 'shots.0.durationS': 'longer than the recorder window' } } },
    });
    const { wrapper, router } = await mountApp('/events/new?unitId=3');

    await type(wrapper, 'occurred-at', '2026-07-01T04:12');
    await wrapper.get('[data-test="type-phase-to-ground"]').trigger('click');
    await wrapper.get('[data-test="side-hv"]').trigger('click');
    await type(wrapper, 'shot-current-0', '1.2');
    await type(wrapper, 'shot-duration-0', '0.5');
    await wrapper.get('[data-test="event-form"]').trigger('submit');
    await settle();

    expect(router.currentRoute.value.name).toBe('event-new');
    expect(fieldText(wrapper, 'shot-duration-0')).toContain('longer than the recorder window');
    expect(wrapper.get('[data-test="form-error"]').text()).toContain('Some fields are invalid.');
  });

  it('is open to protection engineers and administrators only', async () => {
    storeToken('valid');
    scriptFetch({ 'GET /api/auth/me': { body: makeUser({ roles: ['tester'] }) }, 'GET /api/health': { body: healthy } });
    const { router, wrapper } = await mountApp('/events/new');

    expect(router.currentRoute.value.name).toBe('forbidden');
    expect(wrapper.findAll('#app-nav .app-nav__label').map((n) => n.text())).not.toContain('Log a fault');
  });
});
