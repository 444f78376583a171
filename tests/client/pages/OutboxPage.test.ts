import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../src/api/auth';
import type { OutboxMessage } from '../../../src/api/outbox';
import { healthyDemo, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type ScriptedResponse } from '../helpers';

enableAutoUnmount(afterEach);

const messages: OutboxMessage[] = [
  {
    id: 12,
    to: 'ops@kestrel-valley.example',
    subject: 'KVP-HX-T2 after the fault of 2026-07-01: CONDITIONAL',
    text: 'Recommendation: CONDITIONAL\nCHL capacitance shifted +3.74 %.',
    receivedAt: '2026-07-03T09:01:00.000Z',
    attachments: [{ filename: 'gapsight-screening-61.pdf', contentType: 'application/pdf', size: 48_128 }],
  },
  { id: 11, to: 'night@kestrel-valley.example', subject: 'KVP-MB-T1: GO', text: 'Recommendation: GO', receivedAt: '2026-07-02T20:00:00.000Z', attachments: [] },
];

function signedInAs(roles: Role[], outbox: ScriptedResponse = { body: messages }) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles }) },
    'GET /api/health': { body: healthyDemo },
    'GET /api/dev/outbox': outbox,
    'GET /api/dev/outbox/12/attachments/0': { body: '%PDF-' },
  });
}

describe('OutboxPage (/dev/outbox)', () => {
  afterEach(resetClientState);

  it('lists the received messages with recipient, subject, time and attachments, the text expandable', async () => {
    signedInAs(['manager']);
    const { wrapper } = await mountApp('/dev/outbox');

    const items = wrapper.findAll('[data-test="outbox-message"]');
    expect(items).toHaveLength(2);
    expect(items[0].get('[data-test="outbox-subject"]').text()).toBe('KVP-HX-T2 after the fault of 2026-07-01: CONDITIONAL');
    expect(items[0].get('[data-test="outbox-to"]').text()).toBe('ops@kestrel-valley.example');
    expect(items[0].text()).toContain('2026-07-03 09:01 +00:00 UTC');
    expect(items[0].text()).toContain('1 attachment');

    await items[0].get('.q-item').trigger('click');
    await settle();
    expect(items[0].get('[data-test="outbox-text"]').text()).toContain('CHL capacitance shifted +3.74 %.');
    expect(items[0].get('[data-test="outbox-attachments"]').text()).toContain('gapsight-screening-61.pdf (PDF document, 47 kB)');
  });

  it("opens a message's attachment from the server's outbox attachment route", async () => {
    const { requests } = signedInAs(['manager']);
    const saved: string[] = [];
    const createObjectURL = vi.spyOn(URL, 'createObjectURL').mockImplementation(() => 'blob:outbox');
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      saved.push(this.download);
    });
    const { wrapper } = await mountApp('/dev/outbox');
    const first = wrapper.findAll('[data-test="outbox-message"]')[0];
    await first.get('.q-item').trigger('click');
    await settle();
    await first.get('[data-test="outbox-attachment"]').trigger('click');
    await vi.waitFor(() => expect(saved).toEqual(['gapsight-screening-61.pdf']));
    expect(requests.some((r) => r.method === 'GET' && r.url === '/api/dev/outbox/12/attachments/0')).toBe(true);
    createObjectURL.mockRestore();
    click.mockRestore();
  });

  it('says the mail sink is not running when the server answers 404', async () => {
    signedInAs(['admin'], { status: 404, body: { error: { code: 'not_found', message: 'Not found' } } });
    const { wrapper } = await mountApp('/dev/outbox');

    expect(wrapper.get('[data-test="outbox-error"]').text()).toContain('The local mail sink is not running');
  });

  it('says so when nothing was received yet', async () => {
    signedInAs(['manager'], { body: [] });
    const { wrapper } = await mountApp('/dev/outbox');

    expect(wrapper.get('[data-test="outbox-empty"]').text()).toContain('No message received yet');
  });

  it('is closed to roles other than admin and manager', async () => {
    const { requests } = signedInAs(['tester']);
    const { router } = await mountApp('/dev/outbox');

    expect(router.currentRoute.value.name).toBe('forbidden');
    expect(requests.some((r) => r.url === '/api/dev/outbox')).toBe(false);
  });

  it('appears in the drawer of a manager while the mail sink runs', async () => {
    signedInAs(['manager']);
    const { wrapper } = await mountApp('/dev/outbox');

    expect(wrapper.findAll('#app-nav .app-nav__label').map((l) => l.text())).toContain('Outbox');
  });
});
