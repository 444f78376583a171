// The relay records of an event: the types listed once (help under the picker, the picker's filter), a wrong type named
// as soon as it is picked and never sent, the server's refusal shown as it words it, kinds in words.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventAttachments from '../../../src/components/event/EventAttachments.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { acceptAttribute, UPLOAD_TYPES } from '../../../shared/uploads/file-types';
import { resetClientState, scriptFetch, settle } from '../helpers';

const stored = { id: 4, name: 'fault.cfg', contentType: 'text/plain', kind: 'comtrade-cfg', size: 2048, sha256: 'a'.repeat(64), createdAt: '2026-11-28T04:00:00Z' };

const render = (attachments = [stored]) =>
  mount(EventAttachments, { props: { eventId: 7, attachments, zone: 'UTC', canAttach: true }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });

async function pickFile(wrapper: VueWrapper, file: File): Promise<void> {
  const input = wrapper.get('input[type="file"]').element;
  Object.defineProperty(input, 'files', { value: [file], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
}

describe('EventAttachments', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('lists the relay-record types once, as help under the picker, and filters the picker by them', () => {
    const wrapper = render();
    expect((wrapper.get('input[type="file"]').element as HTMLInputElement).accept).toBe(acceptAttribute(UPLOAD_TYPES.relayRecord));
    const text = wrapper.text();
    expect(text).toContain('COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf); 12 MB at most');
    expect(text.split('.cff')).toHaveLength(2);
    expect(wrapper.get('[data-test="attachment"]').text()).toContain('COMTRADE configuration (.cfg)');
  });

  it('names a Word document as the wrong type at once and sends nothing', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render();
    await pickFile(wrapper, new File(['PK'], 'notes.docx', { type: 'application/vnd.openxmlformats-officedocument.wordprocessingml.document' }));
    expect(wrapper.get('[data-test="attachment-error"]').text()).toBe(
      'notes.docx is not a relay record: pick a COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) file.',
    );
    expect(wrapper.get('[data-test="attachment-upload"]').attributes('disabled')).toBeDefined();
    await wrapper.get('[data-test="attachment-upload"]').trigger('click');
    await settle();
    expect(requests).toHaveLength(0);
  });

  it('shows the server’s refusal of the content as it words it', async () => {
    const message = 'the .cfg file is a PDF document: upload it with a .pdf name';
    scriptFetch({ 'POST /api/events/7/attachments': { status: 415, body: { error: { code: 'unsupported_file_type', message, fields: { file: message } } } } });
    const wrapper = render([]);
    await pickFile(wrapper, new File(['%PDF-1.4'], 'fault.cfg'));
    expect(wrapper.find('[data-test="attachment-error"]').exists()).toBe(false);
    await wrapper.get('[data-test="attachment-upload"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.find('[data-test="attachment-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="attachment-error"]').text()).toBe(message);
  });
});
