// The draft editor: every threshold as an input labelled in words, grouped by section; Save sends the whole set, and the
// server's field errors (named by path) appear under their fields.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import CriteriaDraftEditor from '../../../src/components/criteria/CriteriaDraftEditor.vue';
import type { CriteriaSet } from '../../../src/api/criteria';
import { quasarOptions } from '../../../src/quasar-options';
import { criteriaV2 } from '../../../shared/screening/criteria-sets';
import { resetClientState, scriptFetch, settle } from '../helpers';

const draft: CriteriaSet = {
  id: 3,
  version: 3,
  status: 'draft',
  name: 'Draft from criteria set 2',
  notes: null,
  createdById: 5,
  createdByName: 'Erin Engineer',
  createdAt: '2026-12-01T09:00:00.000Z',
  publishedAt: null,
  thresholds: { ...structuredClone(criteriaV2), version: 3, name: 'Draft from criteria set 2' },
};

function render() {
  return mount(CriteriaDraftEditor, { props: { set: draft }, global: { plugins: [[Quasar, quasarOptions]] }, attachTo: document.body });
}

const field = (path: string) => `[data-path="${path}"]`;

describe('CriteriaDraftEditor', () => {
  afterEach(resetClientState);

  it('labels each threshold in words by section and sends the changed set', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/criteria/3': (r) => ({ body: { ...draft, thresholds: (r.body as { thresholds: unknown }).thresholds } }) });
    const wrapper = render();
    const legends = wrapper.findAll('legend').map((l) => l.text());
    expect(legends).toContain('Winding capacitance');
    const input = wrapper.get(`${field('capacitance.shiftBands[1].from')} input`);
    expect(wrapper.get(field('capacitance.shiftBands[1].from')).text()).toContain('Shift bands › band 2 › starts at');
    await input.setValue('4');
    await wrapper.get('[data-test="criteria-draft-editor"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    const body = requests.find((r) => r.method === 'PATCH')!.body as { thresholds: typeof criteriaV2 };
    expect(body.thresholds.capacitance.shiftBands[1]).toEqual({ from: 4, level: 'investigate' });
    expect(body.thresholds.capacitance.shiftBands[0]).toEqual(criteriaV2.capacitance.shiftBands[0]);
  });

  it('shows the server\'s error under the field it names', async () => {
    scriptFetch({
      'PATCH /api/criteria/3': {
        status: 400,
        body: { error: { code: 'invalid_input', message: 'Some thresholds are invalid.', fields: { 'thresholds.capacitance.shiftBands[1].from': 'Invalid input: expected number, received string' } } },
      },
    });
    const wrapper = render();
    await wrapper.get(`${field('capacitance.shiftBands[1].from')} input`).setValue('three');
    await wrapper.get('[data-test="criteria-draft-editor"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.find('[data-test="criteria-save-error"]').exists()).toBe(true));
    await settle();
    expect(wrapper.get(field('capacitance.shiftBands[1].from')).text()).toContain('expected number');
    expect(wrapper.get(field('capacitance.shiftBands[0].from')).text()).not.toContain('expected number');
  });
});
