// "Correct the fault": the form starts from the stored facts, sends only the fields changed, checks them with the
// server's schema before sending, and shows the server's field errors under the fields.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventFaultCorrectForm from '../../../src/components/event/EventFaultCorrectForm.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { eventDetail } from '../pages/fixtures';
import { resetClientState, scriptFetch, settle, type ScriptedResponse } from '../helpers';

const event = eventDetail();

function render() {
  return mount(EventFaultCorrectForm, {
    props: { event, zone: 'Europe/London' },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

const corrected = (over: Record<string, unknown> = {}): ScriptedResponse => ({
  body: { ...event, throughFault: event.throughFault, screeningStale: false, note: null, ...over },
});

async function fill(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  await wrapper.get(`[data-test="${testId}"] input, input[data-test="${testId}"], textarea[data-test="${testId}"]`).setValue(value);
  await settle();
}

async function save(wrapper: VueWrapper): Promise<void> {
  await wrapper.get('[data-test="fault-correct-form"]').trigger('submit');
  await settle();
}

describe('EventFaultCorrectForm', () => {
  afterEach(() => {
    resetClientState();
  });

  it('starts from the stored facts', () => {
    const wrapper = render();
    expect((wrapper.get('input[data-test="correct-shot-current-0"]').element as HTMLInputElement).value).toBe('6.3');
    expect((wrapper.get('input[data-test="correct-shot-duration-1"]').element as HTMLInputElement).value).toBe('0.08');
    expect((wrapper.get('textarea[data-test="correct-notes"]').element as HTMLTextAreaElement).value).toBe('Cable fault on the 33 kV feeder 4.');
  });

  it('sends only the fields changed and says it was saved', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/events/11': corrected() });
    const wrapper = render();
    await fill(wrapper, 'correct-shot-current-0', '6.5');
    await wrapper.get('[data-test="correct-tripped"]').trigger('click');
    await fill(wrapper, 'correct-notes', 'Cable fault on feeder 4, 1.2 km out.');
    await save(wrapper);
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    expect(requests[0].body).toEqual({
      shots: [
        { currentKA: 6.5, durationS: 0.12 },
        { currentKA: 6.1, durationS: 0.08 },
      ],
      transformerTripped: false,
      notes: 'Cable fault on feeder 4, 1.2 km out.',
    });
    await vi.waitFor(() => expect(wrapper.emitted('saved')).toBeTruthy());
  });

  it('sends nothing while nothing changed, and says so', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/events/11': corrected() });
    const wrapper = render();
    await save(wrapper);
    expect(requests).toHaveLength(0);
    expect(wrapper.get('[data-test="correct-error"]').text()).toBe('nothing changed yet');
  });

  it('refuses a shot current above 500 kA before sending, under the field', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/events/11': corrected() });
    const wrapper = render();
    await fill(wrapper, 'correct-shot-current-0', '6300');
    await save(wrapper);
    expect(requests).toHaveLength(0);
    expect(wrapper.get('input[data-test="correct-shot-current-0"]').element.closest('.q-field')!.textContent).toContain('above 500 kA: check the unit');
  });

  it('names a decimal comma under the shot field and sends nothing', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/events/11': corrected() });
    const wrapper = render();
    await fill(wrapper, 'correct-shot-current-0', '6,5');
    await save(wrapper);
    expect(requests).toHaveLength(0);
    expect(wrapper.get('input[data-test="correct-shot-current-0"]').element.closest('.q-field')!.textContent).toContain('decimal comma: use a point (3.14)');
  });

  it('shows the server\'s answer when the event was decided meanwhile', async () => {
    scriptFetch({
      'PATCH /api/events/11': { status: 409, body: { error: { code: 'invalid_status', message: 'The fault cannot be corrected: the screening that used it is decided (the event is released).' } } },
    });
    const wrapper = render();
    await fill(wrapper, 'correct-notes', 'late');
    await save(wrapper);
    await vi.waitFor(() => expect(wrapper.find('[data-test="correct-error"]').text()).toMatch(/is decided/));
    expect(wrapper.emitted('saved')).toBeUndefined();
  });
});
