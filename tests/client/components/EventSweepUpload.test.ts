// The sweep upload: winding, phase and the baseline trace's tap go with the file; a label with no baseline trace says
// "no baseline trace to compare with" before anything is uploaded.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar, QSelect } from 'quasar';
import { quasarOptions } from '../../../src/quasar-options';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventSweepUpload from '../../../src/components/event/EventSweepUpload.vue';
import { acceptAttribute, UPLOAD_TYPES } from '../../../shared/uploads/file-types';
import { resetClientState, scriptFetch, settle } from '../helpers';

function render(baselineLabels: string[] | null = ['HV-A-open', 'HV-C-open']) {
  return mount(EventSweepUpload, { props: { sessionId: 31, baselineLabels }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
}

async function pick(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  const select = wrapper.findAllComponents(QSelect).find((c) => c.attributes('data-test') === testId || c.find(`[data-test="${testId}"]`).exists());
  if (!select) throw new Error(`no select ${testId}`);
  select.vm.$emit('update:modelValue', value);
  await settle();
}

async function pickFile(wrapper: VueWrapper, file: File): Promise<void> {
  const input = wrapper.get('[data-test="sweep-file"]').element.querySelector('input[type="file"]') ?? wrapper.get('input[type="file"]').element;
  Object.defineProperty(input, 'files', { value: [file], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
}

const sweepCsv = () => new File(['frequencyHz,magnitudeDb\n1000,-42.1\n2000,-45.0\n'], 'hv-b-open.csv', { type: 'text/csv' });

describe('EventSweepUpload', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('sends the winding, the phase, the taps and the demagnetised flag with the file', async () => {
    const { requests } = scriptFetch({ 'POST /api/sessions/31/sweeps': { status: 201, body: { id: 9, label: 'HV-A-open' } } });
    const wrapper = render();

    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    await pick(wrapper, 'sweep-test-type', 'open-circuit');
    await pick(wrapper, 'sweep-winding', 'hv');
    await pick(wrapper, 'sweep-phase', 'A');
    await wrapper.get('input[data-test="sweep-tap"]').setValue('9b');
    await wrapper.get('input[data-test="sweep-baseline-tap"]').setValue('9b');
    await wrapper.get('[data-test="sweep-demagnetised"]').trigger('click');
    await pickFile(wrapper, sweepCsv());
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));

    const form = requests[0].body as FormData;
    expect(Object.fromEntries([...form.entries()].filter(([k]) => k !== 'file'))).toEqual({
      label: 'HV-A-open',
      testType: 'open-circuit',
      winding: 'hv',
      phase: 'A',
      tapPosition: '9b',
      baselineTapPosition: '9b',
      demagnetised: 'true',
    });
    expect((form.get('file') as File).name).toBe('hv-b-open.csv');
    expect(wrapper.emitted('uploaded')).toHaveLength(1);
  });

  it('leaves winding, phase and taps out when they are not given', async () => {
    const { requests } = scriptFetch({ 'POST /api/sessions/31/sweeps': { status: 201, body: { id: 9 } } });
    const wrapper = render();

    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    await pick(wrapper, 'sweep-test-type', 'short-circuit');
    await pickFile(wrapper, sweepCsv());
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));

    const form = requests[0].body as FormData;
    expect([...form.keys()].sort()).toEqual(['file', 'label', 'testType']);
  });

  it('says "no baseline trace to compare with" for a label the unit has no baseline trace of', async () => {
    const wrapper = render();
    expect(wrapper.get('[data-test="sweep-baseline-labels"]').text()).toContain('HV-A-open, HV-C-open');

    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-B-open');
    await settle();
    expect(wrapper.get('[data-test="sweep-no-baseline-warning"]').text()).toContain('no baseline trace to compare with');
    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-C-open');
    await settle();
    expect(wrapper.find('[data-test="sweep-no-baseline-warning"]').exists()).toBe(false);
    expect(wrapper.get('[data-test="sweep-baseline-found"]').text()).toContain('compared with the baseline trace');
  });

  it('says so when the unit has no baseline trace at all, and says nothing while the unit’s traces are unknown', async () => {
    const none = render([]);
    expect(none.get('[data-test="sweep-baseline-labels"]').text()).toContain('no baseline trace to compare with');
    none.unmount();

    const unknown = render(null);
    await unknown.get('input[data-test="sweep-label"]').setValue('HV-B-open');
    await settle();
    expect(unknown.find('[data-test="sweep-no-baseline-warning"]').exists()).toBe(false);
    expect(unknown.find('[data-test="sweep-baseline-labels"]').exists()).toBe(false);
  });

  it('shows the server’s refusal of a field next to it', async () => {
    scriptFetch({
      'POST /api/sessions/31/sweeps': { status: 400, body: { error: { code: 'invalid_input', message: 'Some fields are invalid.', fields: { phase: 'A, B or C' } } } },
    });
    const wrapper = render();

    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    await pick(wrapper, 'sweep-test-type', 'open-circuit');
    await pick(wrapper, 'sweep-phase', 'A');
    await pickFile(wrapper, sweepCsv());
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.text()).toContain('Some fields are invalid.'));
    expect(wrapper.findAllComponents(QSelect).find((c) => c.props('label') === 'Phase')!.text()).toContain('A, B or C');
  });

  it('offers the sweep types in the picker and says at once that a workbook is not a sweep file, sending nothing', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render();
    const input = wrapper.get('input[type="file"]').element as HTMLInputElement;
    expect(input.accept).toBe(acceptAttribute(UPLOAD_TYPES.sweep));
    expect(wrapper.text()).toContain('CSV (.csv) or text (.txt), one point a line');

    await pickFile(wrapper, new File(['PK'], 'HV-A.xlsx', { type: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' }));
    expect(wrapper.get('[data-test="sweep-upload"]').text()).toContain('HV-A.xlsx is not a sweep file: pick a CSV (.csv) or text (.txt) file.');

    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    await pick(wrapper, 'sweep-test-type', 'open-circuit');
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await settle();
    expect(requests).toHaveLength(0);

    await pickFile(wrapper, sweepCsv());
    expect(wrapper.text()).not.toContain('is not a sweep file');
  });

  it('shows the server’s message about the file and every problem it found, by line and column in words', async () => {
    const message = 'The sweep file was not saved: line 4, magnitude (dB): not a number (and 1 more problem).';
    scriptFetch({
      'POST /api/sessions/31/sweeps': {
        status: 400,
        body: { error: { code: 'invalid_file', message, fields: { 'row 4.magnitudeDb': 'not a number', 'row 9.frequencyHz': 'not above the row before' } } },
      },
    });
    const wrapper = render();
    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    await pick(wrapper, 'sweep-test-type', 'open-circuit');
    await pickFile(wrapper, sweepCsv());
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.find('[data-test="sweep-error"]').exists()).toBe(true));
    const shown = wrapper.get('[data-test="sweep-error"]');
    expect(shown.text()).toContain(message);
    expect(shown.findAll('li').map((li) => li.text())).toEqual(['Line 4, magnitude (dB): not a number', 'Line 9, frequency (Hz): not above the row before']);
  });

  it('shows a refusal of the file type under the file, once', async () => {
    const message = 'trace.csv is not comma-separated text: a sweep file has one point a line, frequencyHz,magnitudeDb[,phaseDeg].';
    scriptFetch({ 'POST /api/sessions/31/sweeps': { status: 415, body: { error: { code: 'unsupported_file_type', message, fields: { file: message } } } } });
    const wrapper = render();
    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    await pick(wrapper, 'sweep-test-type', 'open-circuit');
    await pickFile(wrapper, sweepCsv());
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.text()).toContain(message));
    expect(wrapper.text().split(message)).toHaveLength(2);
    expect(wrapper.find('[data-test="sweep-error"]').exists()).toBe(false);
  });
});
