// A large readings upload shows its progress: the share of bytes sent (XMLHttpRequest's upload progress), then
// "Checking N readings…" once every byte is sent, until the server answers; the answer then reads as before.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventReadingsImport from '../../../src/components/event/EventReadingsImport.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { resetClientState, settle } from '../helpers';

/** A stand-in XMLHttpRequest: records what is sent and lets the test drive upload progress and the answer. */
class FakeXhr {
  static last: FakeXhr | null = null;
  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: unknown = null;
  status = 0;
  responseText = '';
  upload: { onprogress: ((e: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  constructor() {
    FakeXhr.last = this;
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(k: string, v: string) {
    this.headers[k] = v;
  }
  send(body: unknown) {
    this.body = body;
  }
  abort() {
    this.onabort?.();
  }
  getAllResponseHeaders() {
    return 'content-type: application/json\r\n';
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

const label = (i: number) => {
  let s = '';
  let n = i;
  do {
    s = String.fromCharCode(65 + (n % 26)) + s;
    n = Math.floor(n / 26);
  } while (n > 0);
  return `C${s}`;
};

async function pickFile(wrapper: VueWrapper, file: File): Promise<void> {
  const input = wrapper.get('input[type="file"]').element;
  Object.defineProperty(input, 'files', { value: [file], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
  await settle();
}

describe('upload progress of a large readings file', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    resetClientState();
    document.body.innerHTML = '';
  });

  it('shows the share sent, then "Checking N readings…", then the answer; the bar is gone once answered', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    // 1 200 readings, each value cell padded with spaces (the parser trims them): about 360 kB, a "large" upload.
    const pad = ' '.repeat(280);
    const csv = `quantity,configuration,phase,value,unit\n${Array.from({ length: 1200 }, (_, i) => `capacitance,${label(i)},,${pad}${1000 + i},pF`).join('\n')}\n`;
    const wrapper = mount(EventReadingsImport, { props: { sessionId: 12 }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
    await pickFile(wrapper, new File([csv], 'big.csv', { type: 'text/csv' }));
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-upload"]').exists()).toBe(true), { timeout: 20000 });
    expect(wrapper.find('[data-test="upload-progress"]').exists()).toBe(false);

    await wrapper.get('[data-test="import-upload"]').trigger('click');
    await settle();
    const xhr = FakeXhr.last!;
    expect(xhr).not.toBeNull();
    expect([xhr.method, xhr.url]).toEqual(['POST', '/api/sessions/12/imports']);
    expect(xhr.body).toBeInstanceOf(FormData);

    const total = 400_000;
    xhr.upload.onprogress?.({ loaded: 100_000, total, lengthComputable: true });
    await settle();
    // 100 000 of 400 000 bytes = 25 %; 400 000 bytes = 400 kB (decimal units).
    expect(wrapper.get('[data-test="upload-progress"]').text()).toBe('Uploading… 25 % of 400 kB');
    expect(wrapper.get('[data-test="upload-progress"]').attributes('role')).toBe('status');

    xhr.upload.onprogress?.({ loaded: total, total, lengthComputable: true });
    await settle();
    expect(wrapper.get('[data-test="upload-progress"]').text()).toBe('Checking 1 200 readings…');

    xhr.answer(200, { imported: 1200, rows: [] });
    await vi.waitFor(() => expect(wrapper.emitted('imported')).toBeTruthy());
    expect(wrapper.emitted('imported')![0]).toEqual([{ imported: 1200, rows: [] }]);
    expect(wrapper.find('[data-test="upload-progress"]').exists()).toBe(false);
  }, 60000);

  it('an error answer through the progress path reads as through fetch: the message and the field problems', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    const pad = ' '.repeat(280);
    const csv = `quantity,configuration,phase,value,unit\n${Array.from({ length: 1000 }, (_, i) => `capacitance,${label(i)},,${pad}${1000 + i},pF`).join('\n')}\n`;
    const wrapper = mount(EventReadingsImport, { props: { sessionId: 7 }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
    await pickFile(wrapper, new File([csv], 'big.csv', { type: 'text/csv' }));
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-upload"]').exists()).toBe(true), { timeout: 20000 });
    await wrapper.get('[data-test="import-upload"]').trigger('click');
    await settle();
    FakeXhr.last!.answer(400, { error: { code: 'invalid_file', message: 'The file is too long; nothing was imported.', fields: { file: 'at most 5 000 rows a file; this file has 6 000: split it into smaller files' } } });
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-upload-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="import-upload-error"]').text()).toBe('The file is too long; nothing was imported.');
    expect(wrapper.findAll('[data-test="import-upload-problem"]').map((li) => li.text()).join(' ')).toContain('at most 5 000 rows a file; this file has 6 000');
    expect(wrapper.find('[data-test="upload-progress"]').exists()).toBe(false);
  }, 60000);
});
