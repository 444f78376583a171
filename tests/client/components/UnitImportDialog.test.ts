// The units import dialog: a picked file is read by the server in a dry run (columns, rows, problems shown in words);
// a re-mapped column is read again with the mapping; a clean file is imported with the same mapping.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar, QSelect } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import UnitImportDialog from '../../../src/components/unit/UnitImportDialog.vue';
import { quasarOptions } from '../../../src/quasar-options';
import type { UnitImportPreview } from '../../../src/api/units-io';
import { UNIT_SHEET_FIELDS } from '../../../shared/imports/units-sheet-fields';
import { acceptAttribute, UPLOAD_TYPES } from '../../../shared/uploads/file-types';
import { allInBody, formFieldsOf, inBody, pickFileInBody, resetClientState, scriptFetch, settle } from '../helpers';

const noColumns = Object.fromEntries(UNIT_SHEET_FIELDS.map((f) => [f, null])) as UnitImportPreview['columns'];
const noCells = Object.fromEntries(UNIT_SHEET_FIELDS.map((f) => [f, ''])) as UnitImportPreview['rows'][number]['cells'];

function preview(over: Partial<UnitImportPreview>): UnitImportPreview {
  return {
    dryRun: true,
    imported: 0,
    sheet: 'Units',
    headerRow: 3,
    headers: ['Serial', 'Site', 'Design', 'HV', 'Primary'],
    columns: { ...noColumns, serial: 'Serial', site: 'Site', design: 'Design', hvKV: 'HV' },
    total: 2,
    good: 1,
    rows: [
      { row: 4, ok: true, cells: { ...noCells, serial: 'T-1', site: 'Harrow Cross', design: 'GT-40', hvKV: '132' } },
      { row: 5, ok: false, cells: { ...noCells, serial: 'T-2', site: 'Harrow Cross', design: 'GT-40', hvKV: '132,5' } },
    ],
    fields: { 'row 5.hvKV': 'decimal comma: use a point (3.14)' },
    ...over,
  };
}

function render(): VueWrapper {
  return mount(UnitImportDialog, { props: { modelValue: true }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
}

const inDialog = inBody;
const allInDialog = allInBody;
const pickFile = pickFileInBody;
const formOf = formFieldsOf;

describe('UnitImportDialog', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('reads the file in a dry run, lists the problems in words and does not offer the import', async () => {
    const { requests } = scriptFetch({ 'POST /api/units/import': { body: preview({}) } });
    render();
    await pickFile(new File(['x'], 'register.xlsx'));
    await vi.waitFor(() => expect(inDialog('unit-import-problems')).not.toBeNull());

    expect(requests.map(formOf)).toEqual([{ dryRun: 'true' }]);
    expect(allInDialog('unit-import-problem').map((e) => e.textContent?.trim())).toEqual(['Row 5, HV (kV): decimal comma: use a point (3.14)']);
    expect(allInDialog('unit-import-row')).toHaveLength(2);
    expect(inDialog('unit-import-submit')?.hasAttribute('disabled')).toBe(true);
  });

  it('reads again with the mapping when a column is changed, then imports with it', async () => {
    let dryRuns = 0;
    const { requests } = scriptFetch({
      'POST /api/units/import': (r) => {
        const form = r.body as FormData;
        if (form.get('dryRun') === 'true') {
          dryRuns += 1;
          return dryRuns === 1
            ? { body: preview({}) }
            : { body: preview({ columns: { ...noColumns, serial: 'Serial', site: 'Site', design: 'Design', hvKV: 'Primary' }, good: 2, fields: {} }) };
        }
        return { status: 201, body: { imported: 2, rows: [] } };
      },
    });
    const wrapper = render();
    await pickFile(new File(['x'], 'register.xlsx'));
    await vi.waitFor(() => expect(inDialog('unit-import-problems')).not.toBeNull());

    const hv = wrapper.findAllComponents(QSelect).find((c) => c.props('label') === 'HV (kV)');
    hv!.vm.$emit('update:modelValue', 'Primary');
    await vi.waitFor(() => expect(requests).toHaveLength(2));
    await settle();
    const mapping = JSON.parse(String(formOf(requests[1]).mapping));
    expect(mapping).toMatchObject({ serial: 'Serial', site: 'Site', design: 'Design', hvKV: 'Primary', position: '' });
    expect(inDialog('unit-import-problems')).toBeNull();

    const submit = inDialog('unit-import-submit')!;
    expect(submit.textContent).toContain('Import 2 units');
    submit.click();
    await vi.waitFor(() => expect(requests).toHaveLength(3));
    await settle();
    expect(formOf(requests[2]).dryRun).toBeUndefined();
    expect(JSON.parse(String(formOf(requests[2]).mapping))).toEqual(mapping);
    expect(wrapper.emitted('imported')?.[0]).toEqual([{ imported: 2, rows: [] }]);
  });

  it('says the file is too large on a 413', async () => {
    scriptFetch({ 'POST /api/units/import': { status: 413, body: { error: { code: 'file_too_large', message: 'The file is larger than the upload limit.' } } } });
    render();
    await pickFile(new File(['x'], 'big.csv'));
    await vi.waitFor(() => expect(inDialog('unit-import-read-error')?.textContent).toContain('4 MB at most'));
  });

  it('filters the picker by the spreadsheet types and names an old .xls at once, sending nothing', async () => {
    const { requests } = scriptFetch({});
    render();
    await settle();
    expect((document.body.querySelector('input[type="file"]') as HTMLInputElement).accept).toBe(acceptAttribute(UPLOAD_TYPES.spreadsheet));
    expect(inDialog('unit-import')?.textContent).toContain('Excel (.xlsx), CSV (.csv) or text (.txt); 4 MB at most');
    await pickFile(new File(['x'], 'fleet.xls', { type: 'application/vnd.ms-excel' }));
    await vi.waitFor(() => expect(inDialog('unit-import-read-error')).not.toBeNull());
    expect(inDialog('unit-import-read-error')?.textContent?.trim()).toBe('fleet.xls is not a spreadsheet: pick an Excel (.xlsx), CSV (.csv) or text (.txt) file.');
    expect(requests).toHaveLength(0);
  });

  it('shows the server’s refusal as it words it, with the field messages it does not already say', async () => {
    scriptFetch({
      'POST /api/units/import': {
        status: 400,
        body: { error: { code: 'invalid_file', message: 'The workbook cannot be read.', fields: { file: 'the workbook cannot be read (end of central directory not found)' } } },
      },
    });
    render();
    await pickFile(new File(['x'], 'register.xlsx'));
    await vi.waitFor(() => expect(inDialog('unit-import-read-error')).not.toBeNull());
    const shown = inDialog('unit-import-read-error')!;
    expect(shown.querySelector('p')?.textContent).toBe('The workbook cannot be read.');
    expect([...shown.querySelectorAll('li')].map((li) => li.textContent?.trim())).toEqual(['File: the workbook cannot be read (end of central directory not found)']);
  });
});
