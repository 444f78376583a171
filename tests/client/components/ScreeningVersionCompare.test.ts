// The current screening beside a comparison run: each recommendation, criteria set and rules revision, overall level,
// and only the indicators judged differently (hand-built results: CHL +3.74 % investigate under one set, watch under
// the other; CL the same in both).
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it } from 'vitest';
import ScreeningVersionCompare from '../../../src/components/screening/ScreeningVersionCompare.vue';
import { quasarOptions } from '../../../src/quasar-options';
import type { Indicator } from '../../../shared/schemas/result';
import { screeningResult, storedScreening } from '../pages/fixtures';
import { resetClientState, settle } from '../helpers';

const ind = (key: string, value: number, level: Indicator['level']): Indicator => ({ key, value, level, rule: 'bands', source: 'criteria set', method: 'capacitance' });

const current = storedScreening({
  id: 61,
  criteriaVersion: 3,
  result: screeningResult({
    recommendation: 'go',
    overallLevel: 'watch',
    engineRevision: 2,
    indicators: [ind('capacitance.CHL.shiftPercent', 3.743, 'watch'), ind('capacitance.CL.shiftPercent', 1.22, 'ok')],
  }),
});
const other = storedScreening({
  id: 62,
  comparison: true,
  criteriaVersion: 2,
  computedAt: '2026-07-03T10:00:00.000Z',
  result: screeningResult({
    recommendation: 'conditional',
    overallLevel: 'investigate',
    engineRevision: 2,
    indicators: [ind('capacitance.CHL.shiftPercent', 3.743, 'investigate'), ind('capacitance.CL.shiftPercent', 1.22, 'ok')],
  }),
});

function render(screenings = [other]) {
  return mount(ScreeningVersionCompare, {
    props: { current, screenings, zone: 'UTC' },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

describe('ScreeningVersionCompare', () => {
  afterEach(resetClientState);

  it('shows both recommendations, their criteria sets and levels side by side, and the one indicator judged differently', async () => {
    const wrapper = render();
    await wrapper.get('[data-test="version-compare-toggle"]').trigger('click');
    await settle();

    const [left, right] = wrapper.findAll('.version-compare__col');
    expect(left.text()).toContain('Current screening');
    expect(left.text()).toContain('Go');
    expect(left.get('[data-test="version-compare-rules"]').text()).toBe('criteria set 3 · rules revision 2');
    expect(left.text()).toContain('Watch');
    expect(right.text()).toContain('Comparison run');
    expect(right.text()).toContain('Conditional');
    expect(right.get('[data-test="version-compare-rules"]').text()).toBe('criteria set 2 · rules revision 2');
    expect(right.text()).toContain('Investigate');

    const rows = wrapper.findAll('[data-test="version-compare-row"]');
    expect(rows).toHaveLength(1);
    expect(rows[0].text()).toContain('CHL capacitance shift vs baseline');
    expect(rows[0].text()).toMatch(/Watch.*3\.743 %.*Investigate.*3\.743 %/);
    expect(wrapper.get('[data-test="version-compare-summary"]').text()).toContain('different recommendations');
  });

  it('shows nothing without a comparison run', () => {
    const wrapper = render([]);
    expect(wrapper.find('[data-test="version-compare"]').exists()).toBe(false);
  });
});
