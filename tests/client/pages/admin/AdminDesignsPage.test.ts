import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { DesignListItem } from '../../../../src/api/designs';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest, type ScriptedResponse, typeInDocument } from '../../helpers';
import { design40 } from '../fixtures';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../../src/pages/admin/AdminDesignsPage.vue'), 60_000);

// An invented design family (the page tests' 40 MVA design, under another maker).
const family: DesignListItem = { ...design40, id: 4, maker: 'Northfold Works', unitCount: 8 };

function signedInAsAdmin(script: Record<string, ScriptedResponse | ((r: RecordedRequest) => ScriptedResponse)> = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id: 1, roles: ['admin'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/designs': { body: [family] },
    ...script,
  });
}

const fieldOf = (testId: string) => document.body.querySelector(`[data-test="${testId}"]`)!.closest('.q-field')!.textContent ?? '';

async function submit(): Promise<void> {
  document.body.querySelector('[data-test="design-form"]')!.dispatchEvent(new Event('submit'));
  await settle();
}

async function fillNewFamily(): Promise<void> {
  await typeInDocument('design-reference', 'QL-60-132');
  await typeInDocument('design-maker', 'Eastmere Transformers');
  await typeInDocument('design-vector-group', 'YNyn0d1');
  await typeInDocument('design-hv-kv', '132');
  await typeInDocument('design-lv-kv', '33');
  await typeInDocument('design-tv-kv', '11');
  await typeInDocument('design-impedance', '12.5');
  await typeInDocument('design-impedance-base', '60000');
  await typeInDocument('design-stage-kva-0', '36000');
  (document.body.querySelector('[data-test="design-stage-add"]') as HTMLElement).click();
  await settle();
  await typeInDocument('design-stage-name-1', 'ONAF');
  await typeInDocument('design-stage-kva-1', '60000');
  await typeInDocument('design-required-capacitance', 'CH, CL; CT CHL');
}

describe('AdminDesignsPage (/admin/designs)', () => {
  afterEach(resetClientState);

  it('lists the design families with their nameplate and number of units', async () => {
    signedInAsAdmin();
    const { wrapper } = await mountApp('/admin/designs');
    const row = wrapper.get('[data-test="design-row-4"]').text();
    expect(row).toContain('KV-40-132');
    expect(row).toContain('Two-winding · YNd1 · three-phase');
    expect(row).toContain('132 / 33');
    expect(row).toContain('ONAN 24000, ONAF 40000');
    expect(row).toContain('10.5 % on 40000');
    expect(row).toContain('CH, CL, CHL');
  });

  it('adds a design family with every field, cooling stages and required capacitance configurations, as numbers', async () => {
    const { requests } = signedInAsAdmin({ 'POST /api/designs': (r) => ({ status: 201, body: { ...(r.body as object), id: 5 } }) });
    const { wrapper } = await mountApp('/admin/designs');
    await wrapper.get('[data-test="design-add"]').trigger('click');
    await settle();
    await fillNewFamily();
    await typeInDocument('design-notes', 'Bought 2019');
    await submit();
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true), { timeout: 5000 });

    expect(requests.find((r) => r.method === 'POST')!.body).toEqual({
      reference: 'QL-60-132',
      maker: 'Eastmere Transformers',
      windings: 'two-winding',
      vectorGroup: 'YNyn0d1',
      phases: 3,
      hvKV: 132,
      lvKV: 33,
      tvKV: 11,
      coolingStages: [
        { stage: 'ONAN', kVA: 36000 },
        { stage: 'ONAF', kVA: 60000 },
      ],
      impedancePercent: 12.5,
      impedanceBaseKVA: 60000,
      conductor: 'Cu',
      requiredCapacitance: ['CH', 'CL', 'CT', 'CHL'],
      notes: 'Bought 2019',
    });
    await vi.waitFor(() => expect(document.body.querySelector('[data-test="design-dialog"]')).toBeNull(), { timeout: 5000 });
    // The list is loaded again.
    expect(requests.filter((r) => r.method === 'GET' && r.url === '/api/designs')).toHaveLength(2);
  });

  it('names a decimal comma and a missing voltage on their fields and sends nothing', async () => {
    const { requests } = signedInAsAdmin();
    const { wrapper } = await mountApp('/admin/designs');
    await wrapper.get('[data-test="design-add"]').trigger('click');
    await settle();
    await fillNewFamily();
    await typeInDocument('design-impedance', '12,5');
    await typeInDocument('design-lv-kv', '');
    await submit();

    expect(fieldOf('design-impedance')).toContain('decimal comma: use a point (3.14)');
    expect(fieldOf('design-lv-kv')).toContain('required');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('shows the server’s field errors on the cooling stage they name', async () => {
    signedInAsAdmin({
      'POST /api/designs': { status: 400, body: { error: { code: 'invalid_input', message: 'Some fields are not valid.', fields: { 'coolingStages.1.kVA': 'too large for this family' } } } },
    });
    const { wrapper } = await mountApp('/admin/designs');
    await wrapper.get('[data-test="design-add"]').trigger('click');
    await settle();
    await fillNewFamily();
    await submit();
    await vi.waitFor(() => expect(document.body.querySelector('[data-test="design-form-error"]')).not.toBeNull(), { timeout: 5000 });

    expect(fieldOf('design-stage-kva-1')).toContain('too large for this family');
    expect(fieldOf('design-stage-kva-0')).not.toContain('too large');
  });

  it('changes a family: the form starts from its values and PATCHes them', async () => {
    const { requests } = signedInAsAdmin({ 'PATCH /api/designs/4': (r) => ({ body: { ...family, ...(r.body as object) } }) });
    const { wrapper } = await mountApp('/admin/designs');
    await wrapper.get('[data-test="design-edit-4"]').trigger('click');
    await settle();
    expect(document.body.querySelector<HTMLInputElement>('input[data-test="design-stage-kva-1"]')!.value).toBe('40000');
    await typeInDocument('design-impedance', '10.8');
    await submit();
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true), { timeout: 5000 });

    const body = requests.find((r) => r.method === 'PATCH')!.body as Record<string, unknown>;
    expect(body.impedancePercent).toBe(10.8);
    expect(body.coolingStages).toEqual(family.coolingStages);
    expect(body.requiredCapacitance).toEqual(['CH', 'CL', 'CHL']);
    expect(body).not.toHaveProperty('unitCount');
  });
});
