// The reading-sets import dialog: a picked file is read in a dry run (the sets found per unit and the problems shown in
// words, no import offered while a row is bad); a clean file is imported with POST /api/units/reading-sets/import.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import ReadingSetsImportDialog from '../../../src/components/unit/ReadingSetsImportDialog.vue';
import { quasarOptions } from '../../../src/quasar-options';
import type { ReadingSetsImportPreview } from '../../../src/api/units-io';
import { READING_SET_SHEET_FIELDS } from '../../../shared/imports/reading-sets-sheet-fields';
import { allInBody, formFieldsOf, inBody, pickFileInBody, resetClientState, scriptFetch, settle } from '../helpers';

const noColumns = Object.fromEntries(READING_SET_SHEET_FIELDS.map((f) => [f, null])) as ReadingSetsImportPreview['columns'];

function preview(over: Partial<ReadingSetsImportPreview>): ReadingSetsImportPreview {
  return {
    dryRun: true,
    imported: 0,
    sheet: 'Readings',
    headerRow: 1,
    headers: ['Serial', 'Kind', 'Taken at', 'Quantity', 'Configuration', 'Phase', 'Value', 'Unit'],
    columns: { ...noColumns, serial: 'Serial', kind: 'Kind', takenAt: 'Taken at', quantity: 'Quantity', configuration: 'Configuration', phase: 'Phase', value: 'Value', unit: 'Unit' },
    total: 3,
    setCount: 2,
    sets: [
      { serial: 'T-1', kind: 'factory', takenAt: '2011-03-14', rows: 2, firstRow: 2, ok: true },
      { serial: 'T-2', kind: 'routine', takenAt: '2020-06-01', rows: 1, firstRow: 4, ok: false },
    ],
    fields: { 'row 4.serial': "no unit with serial 'T-2'" },
    ...over,
  };
}

function render(): VueWrapper {
  return mount(ReadingSetsImportDialog, { props: { modelValue: true }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
}

const inDialog = inBody;
const allInDialog = allInBody;
const pickFile = pickFileInBody;
const formOf = formFieldsOf;

describe('ReadingSetsImportDialog', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('shows the sets found per unit and the problems in words, and does not offer the import', async () => {
    const { requests } = scriptFetch({ 'POST /api/units/reading-sets/import': { body: preview({}) } });
    render();
    await pickFile(new File(['x'], 'baselines.xlsx'));
    await vi.waitFor(() => expect(inDialog('sets-import-problems')).not.toBeNull());

    expect(requests.map(formOf)).toEqual([{ dryRun: 'true' }]);
    expect(allInDialog('sets-import-problem').map((e) => e.textContent?.trim())).toEqual(["Row 4, Unit serial: no unit with serial 'T-2'"]);
    expect(allInDialog('sets-import-set').map((e) => [...e.querySelectorAll('td')].map((td) => td.textContent?.trim()))).toEqual([
      ['T-1', 'Factory', '2011-03-14', '2', '2'],
      ['T-2', 'Routine', '2020-06-01', '1', '4'],
    ]);
    expect(inDialog('sets-import-submit')?.hasAttribute('disabled')).toBe(true);
  });

  it('imports a clean file and reports what was imported', async () => {
    const answer = { imported: 1, sets: [{ id: 9, unitId: 3, serial: 'T-1', kind: 'factory', takenAt: '2011-03-14', rows: 2 }] };
    const { requests } = scriptFetch({
      'POST /api/units/reading-sets/import': (r) =>
        (r.body as FormData).get('dryRun') === 'true'
          ? { body: preview({ setCount: 1, sets: [preview({}).sets[0]], fields: {} }) }
          : { status: 201, body: answer },
    });
    const wrapper = render();
    await pickFile(new File(['x'], 'baselines.csv'));
    await vi.waitFor(() => expect(inDialog('sets-import-submit')?.hasAttribute('disabled')).toBe(false));

    const submit = inDialog('sets-import-submit')!;
    expect(submit.textContent).toContain('Import 1 reading set');
    submit.click();
    await vi.waitFor(() => expect(requests).toHaveLength(2));
    await settle();
    expect(formOf(requests[1])).toEqual({});
    expect(wrapper.emitted('imported')?.[0]).toEqual([answer]);
  });
});
