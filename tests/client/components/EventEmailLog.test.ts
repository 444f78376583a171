// The event's e-mail log: what was mailed and its delivery state; managers and admins resend a mail.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { NotificationView } from '../../../src/api/events';
import EventEmailLog from '../../../src/components/event/EventEmailLog.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { resetClientState, scriptFetch } from '../helpers';

const notifications: NotificationView[] = [
  {
    id: 41,
    screeningId: 9,
    kind: 'decision',
    to: 'control@grid.example',
    subject: '[Gapsight] Decision: RELEASE — KVP-HX-T2',
    status: 'failed',
    attempts: 2,
    lastError: 'connection refused',
    sentAt: null,
    createdAt: '2026-07-03T09:00:00.000Z',
  },
  {
    id: 40,
    screeningId: 9,
    kind: 'screening',
    to: 'ops@grid.example',
    subject: '[Gapsight] CONDITIONAL — KVP-HX-T2',
    status: 'sent',
    attempts: 1,
    lastError: null,
    sentAt: '2026-07-03T08:02:00.000Z',
    createdAt: '2026-07-03T08:00:00.000Z',
  },
];

function render(canResend: boolean) {
  return mount(EventEmailLog, {
    props: { notifications, zone: 'Europe/London', canResend },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

describe('EventEmailLog', () => {
  afterEach(() => {
    resetClientState();
  });

  it('names what each mail is about, and shows Resend only to those who may resend', () => {
    const reader = render(false);
    expect(reader.findAll('[data-test="email-kind"]').map((c) => c.text())).toEqual(['Decision', 'Screening']);
    expect(reader.find('[data-test="email-resend"]').exists()).toBe(false);
    reader.unmount();
    const manager = render(true);
    expect(manager.findAll('[data-test="email-resend"]')).toHaveLength(2);
  });

  it("resends the row's mail through the resend route and tells the page to reload", async () => {
    const { requests } = scriptFetch({
      'POST /api/notifications/41/resend': {
        status: 201,
        body: { id: 42, resentFrom: 41, kind: 'decision', eventId: 11, screeningId: 9, to: 'control@grid.example', subject: '[Gapsight] Decision: RELEASE — KVP-HX-T2', status: 'queued', createdAt: '2026-07-03T10:00:00.000Z' },
      },
    });
    const wrapper = render(true);
    await wrapper.findAll('[data-test="email-resend"]')[0].trigger('click');
    await vi.waitFor(() => expect(wrapper.emitted('changed')).toBeTruthy());
    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['POST /api/notifications/41/resend']);
  });

  it('does not ask the page to reload when the server refuses', async () => {
    const { requests } = scriptFetch({ 'POST /api/notifications/41/resend': { status: 403, body: { error: { code: 'forbidden', message: 'Not allowed.' } } } });
    const wrapper = render(true);
    await wrapper.findAll('[data-test="email-resend"]')[0].trigger('click');
    await vi.waitFor(() => expect(requests).toHaveLength(1));
    await vi.waitFor(() => expect(wrapper.find('[data-test="email-resend"]').attributes('disabled')).toBeUndefined());
    expect(wrapper.emitted('changed')).toBeFalsy();
  });
});
