// Correcting a session: the form starts from the stored conditions and readings and sends only what changed (a
// cleared field as null), checked by the server's schema first.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventSessionCorrectForm from '../../../src/components/event/EventSessionCorrectForm.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { eventDetail } from '../pages/fixtures';
import { resetClientState, scriptFetch, settle } from '../helpers';

const session = eventDetail().sessions[0];

function render() {
  return mount(EventSessionCorrectForm, {
    props: { session, zone: 'Europe/London', configurations: ['CH', 'CL', 'CHL'] },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

async function fill(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  await wrapper.get(`input[data-test="${testId}"]`).setValue(value);
  await settle();
}

async function save(wrapper: VueWrapper): Promise<void> {
  await wrapper.get(`[data-test="session-correct-form-${session.id}"]`).trigger('submit');
  await settle();
}

describe('EventSessionCorrectForm', () => {
  afterEach(() => {
    resetClientState();
  });

  it('sends only the changed conditions and the changed section of readings', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/sessions/31': { body: { ...session, eventStatus: 'testing', screeningStale: true, note: 'back in testing' } } });
    const wrapper = render();
    expect((wrapper.get('input[data-test="session-correct-capacitance-CHL"]').element as HTMLInputElement).value).toBe('5405');
    await fill(wrapper, 'session-correct-humidityPercent', '55');
    await fill(wrapper, 'session-correct-capacitance-CHL', '5300');
    await fill(wrapper, 'session-correct-instrumentSerial', '');
    await save(wrapper);
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    expect(requests[0].body).toEqual({ humidityPercent: 55, instrumentSerial: null, capacitancePF: { CH: 3131, CL: 9990, CHL: 5300 } });
    await vi.waitFor(() => expect(wrapper.emitted('saved')).toBeTruthy());
  });

  it('refuses a humidity above 100 % before sending, under the field', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render();
    await fill(wrapper, 'session-correct-humidityPercent', '140');
    await save(wrapper);
    expect(requests).toHaveLength(0);
    expect(wrapper.get('input[data-test="session-correct-humidityPercent"]').element.closest('.q-field')!.getAttribute('class')).toContain('q-field--error');
  });

  it('shows the server\'s "record a new session instead" when the screening was decided meanwhile', async () => {
    scriptFetch({
      'PATCH /api/sessions/31': { status: 409, body: { error: { code: 'invalid_status', message: 'The screening that used this session is decided: its readings never change. Record a new session instead.' } } },
    });
    const wrapper = render();
    await fill(wrapper, 'session-correct-ambientC', '12');
    await save(wrapper);
    await vi.waitFor(() => expect(wrapper.get('[data-test="session-correct-error"]').text()).toMatch(/Record a new session instead/));
  });
});
