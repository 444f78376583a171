import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type ScriptedResponse, type RecordedRequest } from '../helpers';
import { eventDetail, unitDetail } from './fixtures';

enableAutoUnmount(afterEach);

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
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('event-file'));

    const post = requests.find((r) => r.method === 'POST' && r.url === '/api/events');
    expect(post?.body).toEqual({
      unitId: 3,
      // 04:12 British Summer Time is 03:12 UTC.
      occurredAt: '2026-07-01T03:12:00.000Z',
      type: 'three-phase',
      side: 'lv',
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
