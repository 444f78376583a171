// Unit trends on screen: the table view of the picked quantity group, values and change against the baseline, and
// the bands of the criteria set in words (the chart itself needs a width, which happy-dom does not give: the numbers
// are what is checked here). Values are invented; expected numbers are hand computed beside them.
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import UnitTrendsChart from '../../../src/components/charts/UnitTrendsChart.vue';
import { criteriaV2 } from '../../../shared/screening/criteria-sets';
import type { TrendReadingSet } from '../../../shared/charts/unit-trends';

// A plain stand-in, not vi.fn: here a rejection returned by a vi.fn failed the test even though the component caught it.
const calls: unknown[][] = [];
let answer: () => Promise<unknown> = async () => null;
const getActiveCriteria = {
  mockResolvedValue: (v: unknown) => (answer = async () => v),
  mockImplementation: (f: () => Promise<unknown>) => (answer = f),
  mockReset: () => {
    calls.length = 0;
    answer = async () => null;
  },
};
vi.mock('../../../src/api/criteria', () => ({
  getActiveCriteria: (...a: unknown[]) => {
    calls.push(a);
    return answer();
  },
}));

const SETS: TrendReadingSet[] = [
  { id: 1, kind: 'factory', isReference: false, takenAt: '2019-05-02T08:00:00.000Z', temperatureC: 20, values: { capacitancePF: { CHL: 5000 }, dissipationPercent: { CHL: 0.3 } } },
  { id: 2, kind: 'routine', isReference: false, takenAt: '2024-06-20T09:00:00.000Z', temperatureC: 30, values: { capacitancePF: { CHL: 5125 }, dissipationPercent: { CHL: 0.5 } } },
];
const UNIT = { hvKV: 115, ratedKVA: 20000, conductor: 'Cu' };

function render() {
  return mount(UnitTrendsChart, {
    props: { unit: UNIT, readingSets: SETS, events: [{ id: 7, occurredAt: '2024-06-01T03:00:00.000Z', type: 'phase-to-ground' }], timeZone: 'UTC' },
    global: { plugins: [Quasar] },
  });
}
const rows = (w: ReturnType<typeof render>) => w.get('[data-test="unit-trends-table"]').findAll('tbody tr').map((r) => r.findAll('th, td').map((c) => c.text()));
const toChange = async (w: ReturnType<typeof render>) => {
  await w.get('[data-test="unit-trends-mode"]').findAll('button').find((b) => b.text().startsWith('Change'))!.trigger('click');
};

describe('UnitTrendsChart', () => {
  beforeEach(() => getActiveCriteria.mockReset());

  it('shows capacitance values in a table that a button opens, with the baseline named and the faults listed', async () => {
    getActiveCriteria.mockResolvedValue({ version: 2, status: 'published', thresholds: criteriaV2 });
    const w = render();
    await flushPromises();
    const toggle = w.get('[data-test="unit-trends-table-toggle"]');
    expect(toggle.attributes('aria-expanded')).toBe('false');
    await toggle.trigger('click');
    expect(toggle.attributes('aria-expanded')).toBe('true');
    expect(w.get('[data-test="unit-trends-table"] caption').text()).toBe('Capacitance: Capacitance (pF)');
    expect(rows(w)).toEqual([
      ['2019-05-02 · Factory', '5000', 'CHL'],
      ['2024-06-20 · Routine', '5125', '—'],
    ]);
    expect(w.get('[data-test="unit-trends-faults"]').text()).toBe('Fault events: 2024-06-01 (phase-to-ground)');
    expect(w.get('[data-test="unit-trends-criteria"]').text()).toBe('Corrections and bands: criteria set 2.');
  });

  it('switches to the change against the baseline with the bands of the criteria set in words', async () => {
    getActiveCriteria.mockResolvedValue({ version: 2, status: 'published', thresholds: criteriaV2 });
    const w = render();
    await flushPromises();
    await toChange(w);
    // 100·(5125 − 5000)/5000 = +2.5 %
    expect(rows(w)).toEqual([
      ['2019-05-02 · Factory', '0 %', 'CHL'],
      ['2024-06-20 · Routine', '+2.5 %', '—'],
    ]);
    expect(w.get('[data-test="unit-trends-caption"]').text()).toContain(
      'Bands: Watch from 2 %, Investigate from 3 %, Critical from 5 %, the same below zero (a fall counts as much as a rise).',
    );
  });

  it('uses the newest published set: its bands and its PF temperature table', async () => {
    // An invented set 3: capacitance bands 1 / 4 %, and a flat temperature table (factor 1 everywhere).
    const v3 = {
      ...criteriaV2,
      version: 3,
      capacitance: { ...criteriaV2.capacitance, shiftBands: [{ from: 1, level: 'watch' }, { from: 4, level: 'critical' }] },
      powerFactor: { ...criteriaV2.powerFactor, temperatureFactors: [[0, 1], [80, 1]] },
    };
    getActiveCriteria.mockResolvedValue({ version: 3, status: 'published', thresholds: v3 });
    const w = render();
    await flushPromises();
    await toChange(w);
    expect(w.get('[data-test="unit-trends-caption"]').text()).toContain('Bands: Watch from 1 %, Critical from 4 %');
    expect(w.get('[data-test="unit-trends-criteria"]').text()).toBe('Corrections and bands: criteria set 3.');
    await w.get('[data-test="unit-trends-mode"]').findAll('button').find((b) => b.text() === 'Values')!.trigger('click');
    await w.get('[data-test="unit-trends-table-toggle"]').trigger('click');
    // Pick the power-factor group through the component's model (the q-select menu is not rendered in happy-dom).
    (w.vm as unknown as { $: { setupState: { picked: string } } }).$.setupState.picked = 'powerFactor';
    await flushPromises();
    // Factor 1: PF20 = 100·DF/√(1 + DF²): 0.3 % → 0.29999865 %, 0.5 % → 0.49999375 % (5 significant digits)
    expect(rows(w)).toEqual([
      ['2019-05-02 · Factory', '0.3', 'CHL'],
      ['2024-06-20 · Routine', '0.49999', '—'],
    ]);
  });

  it('falls back to the built-in newest set when the published sets cannot be read', async () => {
    getActiveCriteria.mockImplementation(async () => {
      throw new Error('offline');
    });
    const w = render();
    await flushPromises();
    expect(w.get('[data-test="unit-trends-criteria"]').text()).toBe(
      'Corrections and bands: criteria set 2 (built in: the published sets could not be read).',
    );
  });
});
