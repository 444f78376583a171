// The sister comparison of a screening, on the demo family's recent-event case (examples/demo/recent-event.case.json,
// the case export of the seeded family) and its screening by the engine: the overview shows the screening's own
// modified z per quantity, the family table the same numbers as the engine, and nothing but a line without sisters.
import { readFileSync } from 'node:fs';
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import ScreeningSisterComparison from '../../../src/components/screening/ScreeningSisterComparison.vue';
import type { EventDetail, StoredScreening } from '../../../src/api/events';
import { parseCase, type GapsightCase } from '../../../shared/schemas/case';
import { criteriaV2 } from '../../../shared/screening/criteria-sets';
import { screenCase } from '../../../shared/screening/index';
import { eventDetail, storedScreening } from '../pages/fixtures';

const getScreenedCase = vi.fn();
const getCriteria = vi.fn();
vi.mock('../../../src/api/screenings', () => ({ getScreenedCase: (...a: unknown[]) => getScreenedCase(...a) }));
vi.mock('../../../src/api/criteria', () => ({ getCriteria: (...a: unknown[]) => getCriteria(...a) }));
vi.mock('vue3-apexcharts', async () => {
  const { defineComponent, h } = await import('vue');
  return { default: defineComponent({ setup: () => () => h('div', { 'data-test': 'apex-stub' }) }) };
});

const parsed = parseCase(JSON.parse(readFileSync('examples/demo/recent-event.case.json', 'utf8')));
if (!parsed.ok) throw new Error('example case does not parse');
const CASE: GapsightCase = parsed.value;

function render(c: GapsightCase) {
  const result = screenCase(c, criteriaV2);
  const current: StoredScreening = storedScreening({ id: 41, criteriaVersion: 2, result });
  const event: EventDetail = eventDetail();
  getScreenedCase.mockResolvedValue({ screeningId: 41, eventId: event.id, criteriaVersion: 2, computedAt: '2026-12-01T09:00:00.000Z', case: c });
  getCriteria.mockResolvedValue({ version: 2, status: 'published', thresholds: criteriaV2 });
  return { w: mount(ScreeningSisterComparison, { props: { current, event }, global: { plugins: [Quasar] } }), result };
}
const cellsOf = (rows: ReturnType<ReturnType<typeof render>['w']['findAll']>) => rows.map((r) => r.findAll('th, td').map((c) => c.text().replace(/\s+/g, ' ')));

describe('ScreeningSisterComparison', () => {
  beforeEach(() => {
    getScreenedCase.mockReset();
    getCriteria.mockReset();
  });

  it("lists every sister quantity with the screening's modified z and level, reading the screening's case and criteria", async () => {
    const { w, result } = render(CASE);
    await flushPromises();
    expect(getScreenedCase).toHaveBeenCalledWith(41);
    expect(getCriteria).toHaveBeenCalledWith(2, expect.anything());
    const table = w.get('[data-test="sister-comparison-table"]');
    const cells = cellsOf(table.findAll('tbody tr'));
    expect(cells.map((c) => c[0])).toEqual(['CH capacitance', 'CHL capacitance', 'CL capacitance', 'Phase A leakage reactance', 'Phase B leakage reactance', 'Phase C leakage reactance']);
    const chl = cells[1];
    const stored = result.indicators.find((i) => i.key === 'sisters.capacitance.CHL.modifiedZ')!;
    expect(chl[1]).toBe('5387.3 pF'); // the post-fault CHL of the case
    expect(chl[5]).toBe((stored.value as number).toFixed(2)); // 8.57 in examples/demo/recent-event.result.json
    expect(chl[5]).toBe('8.57');
    expect(chl[6]).toBe('Watch'); // capped at the state cap by the engine
  });

  it('shows the quantity where this unit stands furthest from its family: all units, this one marked, the strip plot', async () => {
    const { w } = render(CASE);
    await flushPromises();
    const family = w.get('[data-test="sister-comparison-family"]');
    const cells = cellsOf(family.findAll('tbody tr'));
    expect(cells).toHaveLength(8);
    // CHL: the demo outlier KVP-QL-T1 and this unit (M 8.57) are both outliers, the larger |M| first
    expect(cells.filter((c) => c[4] === 'Outlier').map((c) => c[0])).toEqual(['KVP-QL-T1', 'KVP-HX-T2 (this unit, post-fault)']);
    expect(Number(cells[0][3])).toBeGreaterThan(8.57);
    expect(cells[1][3]).toBe('8.57');
    expect(cells.slice(2).every((c) => c[4] === 'Within the family')).toBe(true);
    expect(w.find('[data-test="sister-strip"]').exists()).toBe(true);
    await w.findAll('[data-test="sister-comparison-pick"]')[3].trigger('click');
    expect(w.get('[data-test="sister-comparison-family"]').text()).toContain('Phase A leakage reactance of each unit');
  });

  it('says so in one line when the case has no sisters', async () => {
    const { w } = render({ ...CASE, sisters: undefined });
    await flushPromises();
    expect(w.get('[data-test="sister-comparison-none"]').text()).toMatch(/No sister unit readings/);
    expect(w.find('[data-test="sister-comparison-table"]').exists()).toBe(false);
  });
});
