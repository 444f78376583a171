// The readings import of a session: the picker offers the readings types, a wrong type or a binary file is named before
// anything is read or sent, bad rows are listed by place in words, and the server's answer shows beside the button.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventReadingsImport from '../../../src/components/event/EventReadingsImport.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { acceptAttribute, UPLOAD_TYPES } from '../../../shared/uploads/file-types';
import { resetClientState, scriptFetch, settle } from '../helpers';

const render = () => mount(EventReadingsImport, { props: { sessionId: 12 }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });

async function pickFile(wrapper: VueWrapper, file: File): Promise<void> {
  const input = wrapper.get('input[type="file"]').element;
  Object.defineProperty(input, 'files', { value: [file], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
  await settle();
}

const CANONICAL = 'quantity,configuration,phase,value,unit\n';

describe('EventReadingsImport', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('offers the readings types in the picker and names a Word document as the wrong type at once', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render();
    expect((wrapper.get('input[type="file"]').element as HTMLInputElement).accept).toBe(acceptAttribute(UPLOAD_TYPES.sessionReadings));
    expect(wrapper.text()).toContain('CSV (.csv) or text (.txt); canonical header');
    await pickFile(wrapper, new File(['PK'], 'readings.docx', { type: 'application/vnd.openxmlformats-officedocument.wordprocessingml.document' }));
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-read-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="import-read-error"]').text()).toBe('readings.docx is not a readings file: pick a CSV (.csv) or text (.txt) file.');
    expect(wrapper.find('[data-test="import-mapping"]').exists()).toBe(false);
    expect(requests).toHaveLength(0);
  });

  it('says a binary file named .csv is not comma-separated text instead of offering its bytes as columns', async () => {
    const wrapper = render();
    await pickFile(wrapper, new File([new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0xff, 0xfe, 0x2c])], 'export.csv', { type: 'text/csv' }));
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-read-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="import-read-error"]').text()).toContain('export.csv is not comma-separated text');
    expect(wrapper.find('[data-test="import-mapping"]').exists()).toBe(false);
  });

  it('lists bad rows by row and column in words before anything is sent', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render();
    await pickFile(wrapper, new File([`${CANONICAL}capacitance,CH,,3131,pF\ncapacitance,CL,,"9990,5",pF\n`], 'readings.csv', { type: 'text/csv' }));
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-errors"]').exists()).toBe(true));
    const items = wrapper.findAll('[data-test="import-error"]').map((li) => li.text());
    expect(items[0]).toMatch(/^Row 3, value: .*decimal comma/);
    expect(requests).toHaveLength(0);
  });

  it('shows the server’s message and the field messages it does not already say, by place', async () => {
    scriptFetch({
      'POST /api/sessions/12/imports': {
        status: 400,
        body: {
          error: {
            code: 'invalid_file',
            message: 'The file has errors; nothing was imported.',
            fields: { 'row 2.value': 'CH is already in the session: correct the session instead' },
          },
        },
      },
    });
    const wrapper = render();
    await pickFile(wrapper, new File([`${CANONICAL}capacitance,CH,,3131,pF\n`], 'readings.csv', { type: 'text/csv' }));
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-upload"]').exists()).toBe(true));
    await wrapper.get('[data-test="import-upload"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-upload-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="import-upload-error"]').text()).toBe('The file has errors; nothing was imported.');
    expect(wrapper.findAll('[data-test="import-upload-problem"]').map((li) => li.text())).toEqual(['Row 2, value: CH is already in the session: correct the session instead']);
  });
});
