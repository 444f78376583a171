// The export buttons: each fetches the server's file with the token and saves it under the given name and format.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { exportEventAudit } from '../../../src/api/exports';
import AppExportButtons from '../../../src/components/AppExportButtons.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { captureDownloads, resetClientState, scriptFetch, settle, storeToken } from '../helpers';

describe('AppExportButtons', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    resetClientState();
  });

  it('fetches the audit export as CSV then as Excel with the token and saves each under its name', async () => {
    storeToken('t0ken');
    const { fileName, blobs } = captureDownloads();
    const { requests } = scriptFetch({ 'GET /api/events/7/audit/export': { status: 200, body: 'a,b' } });
    const wrapper = mount(AppExportButtons, {
      props: { fetchFile: (f: 'xlsx' | 'csv') => exportEventAudit(7, f), fileName: 'gapsight-event-7-audit' },
      global: { plugins: [[Quasar, quasarOptions]] },
    });
    await wrapper.get('[data-test="export-csv"]').trigger('click');
    await settle();
    await wrapper.get('[data-test="export-xlsx"]').trigger('click');
    await settle();
    expect(requests.map((r) => r.url)).toEqual(['/api/events/7/audit/export?format=csv', '/api/events/7/audit/export?format=xlsx']);
    expect(requests[0].headers.authorization).toBe('Bearer t0ken');
    expect(blobs).toHaveLength(2);
    expect([fileName(0), fileName(1)]).toEqual(['gapsight-event-7-audit.csv', 'gapsight-event-7-audit.xlsx']);
  });

  it('disables both buttons when told to', () => {
    const wrapper = mount(AppExportButtons, {
      props: { fetchFile: () => Promise.resolve(new Blob()), fileName: 'x', disable: true },
      global: { plugins: [[Quasar, quasarOptions]] },
    });
    expect(wrapper.get('[data-test="export-csv"]').attributes('disabled')).toBeDefined();
    expect(wrapper.get('[data-test="export-xlsx"]').attributes('disabled')).toBeDefined();
  });
});
