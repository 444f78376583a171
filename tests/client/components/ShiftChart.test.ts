// The shift chart on screen: its table view with values, levels in words and the thresholds of the screening's
// criteria set (the chart needs a width, which happy-dom does not give). Indicators are hand-built; thresholds are
// criteria set 2's numbers.
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import ShiftChart from '../../../src/components/charts/ShiftChart.vue';
import { criteriaV2 } from '../../../shared/screening/criteria-sets';
import type { Indicator } from '../../../shared/schemas/result';

// A plain stand-in, not vi.fn: here a rejection returned by a vi.fn failed the test even though the component caught it.
const calls: unknown[][] = [];
let answer: () => Promise<unknown> = async () => null;
const getCriteria = {
  mockResolvedValue: (v: unknown) => (answer = async () => v),
  mockImplementation: (f: () => Promise<unknown>) => (answer = f),
  mockReset: () => {
    calls.length = 0;
    answer = async () => null;
  },
};
vi.mock('../../../src/api/criteria', () => ({
  getCriteria: (...a: unknown[]) => {
    calls.push(a);
    return answer();
  },
}));

const base = { rule: 'r', source: 's', method: 'capacitance' } as const;
const INDICATORS: Indicator[] = [
  { ...base, key: 'capacitance.CHL.shiftPercent', value: -3.4, level: 'investigate', basis: 'change', reference: '2019-05-02 baseline' },
  { ...base, key: 'powerFactor.CHL.pf20Percent', value: 0.5, level: 'ok', basis: 'state' },
  { ...base, key: 'reactance.A.shiftPercent', value: 1.2, level: 'watch', basis: 'change', method: 'reactance' },
  { ...base, key: 'gas.C2H2.risePPM', value: 3, level: 'investigate', basis: 'change', method: 'gas' },
];

function render(version = 2) {
  return mount(ShiftChart, { props: { indicators: INDICATORS, criteriaVersion: version, ratedKva: 20000 }, global: { plugins: [Quasar] } });
}
const rows = (w: ReturnType<typeof render>) => w.get('[data-test="shift-chart-table"]').findAll('tbody tr').map((r) => r.findAll('th, td').map((c) => c.text()));

describe('ShiftChart', () => {
  beforeEach(() => getCriteria.mockReset());

  it('lists every shift with its value, level in words and thresholds, reading the screening’s criteria set', async () => {
    getCriteria.mockResolvedValue({ version: 2, status: 'published', thresholds: criteriaV2 });
    const w = render();
    await flushPromises();
    expect(calls).toEqual([[2, expect.anything()]]);
    const toggle = w.get('[data-test="shift-chart-table-toggle"]');
    await toggle.trigger('click');
    expect(toggle.attributes('aria-expanded')).toBe('true');
    expect(rows(w)).toEqual([
      ['CHL capacitance shift vs baseline', '-3.4 %', 'Investigate', 'Watch from |value| 2 %, Investigate from 3 %, Critical from 5 %', 'against own baseline: 2019-05-02 baseline', '—'],
      // 20 MVA: IEC category II, L = 2 % → 0.5 / 1 / 1.5 × L = 1 / 2 / 3 %
      ['Phase A reactance shift vs baseline', '+1.2 %', 'Watch', 'Watch from |value| 1 %, Investigate from 2 %, Critical from 3 %', 'against own baseline', 'multiples of L = 2 % (IEC category II)'],
      ['Acetylene (C2H2) rise', '+3 ppm', 'Investigate', 'Investigate from +1 ppm, Critical from +5 ppm', 'against own baseline', '—'],
    ]);
  });

  it('shows the bars without thresholds, and says so, when the set is neither readable nor built in', async () => {
    getCriteria.mockImplementation(async () => {
      throw new Error('offline');
    });
    const w = render(7);
    await flushPromises();
    expect(w.get('[data-test="shift-chart-no-criteria"]').text()).toContain('Criteria set 7 could not be read');
    expect(rows(w)[0].slice(0, 4)).toEqual(['CHL capacitance shift vs baseline', '-3.4 %', 'Investigate', 'no thresholds']);
  });

  it('shows nothing when the screening has no shift', async () => {
    getCriteria.mockResolvedValue({ version: 2, status: 'published', thresholds: criteriaV2 });
    const w = mount(ShiftChart, { props: { indicators: [INDICATORS[1]], criteriaVersion: 2 }, global: { plugins: [Quasar] } });
    await flushPromises();
    expect(w.find('[data-test="shift-chart"]').exists()).toBe(false);
  });
});
