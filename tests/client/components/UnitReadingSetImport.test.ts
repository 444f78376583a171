// The unit file's reading-set CSV import: kind, date and reference flag go with the file; a refused file's bad rows
// are listed in row order and nothing is reported as created.
import { enableAutoUnmount, mount, type VueWrapper } from '@vue/test-utils';
import { Quasar, QSelect } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import UnitReadingSetImport from '../../../src/components/unit/UnitReadingSetImport.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { acceptAttribute, UPLOAD_TYPES } from '../../../shared/uploads/file-types';
import { resetClientState, scriptFetch, settle } from '../helpers';

enableAutoUnmount(afterEach);

function render(): VueWrapper {
  return mount(UnitReadingSetImport, { props: { unitId: 12 }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
}

async function fill(wrapper: VueWrapper): Promise<void> {
  wrapper.findAllComponents(QSelect)[0].vm.$emit('update:modelValue', 'routine');
  await wrapper.get('input[data-test="set-import-taken"]').setValue('2024-05-01');
  await wrapper.get('[data-test="set-import-reference"]').trigger('click');
  const input = wrapper.get('input[type="file"]').element as HTMLInputElement;
  Object.defineProperty(input, 'files', { value: [new File(['quantity,configuration,phase,value,unit\n'], 'routine.csv')], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
}

describe('UnitReadingSetImport', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('sends the kind, the date and the reference flag with the file, then reports it created', async () => {
    const { requests } = scriptFetch({ 'POST /api/units/12/reading-sets/import': { status: 201, body: { id: 5 } } });
    const wrapper = render();
    await fill(wrapper);
    await wrapper.get('[data-test="reading-set-import"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.emitted('created')).toHaveLength(1));

    const form = requests[0].body as FormData;
    expect(Object.fromEntries([...form.entries()].filter(([k]) => k !== 'file'))).toEqual({ kind: 'routine', takenAt: '2024-05-01', isReference: 'true' });
    expect((form.get('file') as File).name).toBe('routine.csv');
  });

  it('lists the bad rows of a refused file in row order', async () => {
    scriptFetch({
      'POST /api/units/12/reading-sets/import': {
        status: 400,
        body: { error: { code: 'invalid_file', message: 'The file has errors; nothing was imported.', fields: { 'row 12.unit': 'pF or nF', 'row 3.value': 'decimal comma: use a point (3.14)' } } },
      },
    });
    const wrapper = render();
    await fill(wrapper);
    await wrapper.get('[data-test="reading-set-import"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.find('[data-test="set-import-errors"]').exists()).toBe(true));

    expect(wrapper.findAll('[data-test="set-import-errors"] li').map((li) => li.text())).toEqual([
      'Row 3, value: decimal comma: use a point (3.14)',
      'Row 12, unit: pF or nF',
    ]);
    expect(wrapper.emitted('created')).toBeUndefined();
  });

  it('filters the picker by the readings types and names a PDF at once, sending nothing', async () => {
    const { requests } = scriptFetch({});
    const wrapper = render();
    const input = wrapper.get('input[type="file"]').element as HTMLInputElement;
    expect(input.accept).toBe(acceptAttribute(UPLOAD_TYPES.unitReadingSet));
    await wrapper.get('input[data-test="set-import-taken"]').setValue('2024-05-01');
    Object.defineProperty(input, 'files', { value: [new File(['%PDF-1.7'], 'factory-test-report.pdf', { type: 'application/pdf' })], configurable: true, writable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
    expect(wrapper.get('[data-test="set-import-errors"]').text()).toBe(
      'factory-test-report.pdf is not a readings file: pick a CSV (.csv), text (.txt) or Excel (.xlsx) file.',
    );
    await wrapper.get('[data-test="reading-set-import"]').trigger('submit');
    await settle();
    expect(requests).toHaveLength(0);
  });

  it('shows the server’s refusal of the type as it words it, once', async () => {
    const message = 'The file is not comma-separated text.';
    scriptFetch({ 'POST /api/units/12/reading-sets/import': { status: 415, body: { error: { code: 'unsupported_file_type', message, fields: { file: message } } } } });
    const wrapper = render();
    await fill(wrapper);
    await wrapper.get('[data-test="reading-set-import"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.find('[data-test="set-import-errors"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="set-import-errors"]').text()).toBe(message);
  });
});
