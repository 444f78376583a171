// The sweep and dissipation-over-frequency evidence of a screening, on the example cases (examples/cases/sweeps.json,
// rev2-phase-comparison.json) screened by the engine: the case is fetched once, one overlay per sweep or A–C pair with
// a table of ρ, R and class per band that equals the engine's compareTraces, the DF chart only with DF at several
// frequencies, and nothing fetched when the result has neither.
import { readFileSync } from 'node:fs';
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import ScreeningSweepCharts from '../../../src/components/screening/ScreeningSweepCharts.vue';
import { parseCase, type GapsightCase } from '../../../shared/schemas/case';
import { criteriaV2 } from '../../../shared/screening/criteria-sets';
import { screenCase } from '../../../shared/screening/index';
import { compareTraces } from '../../../shared/screening/sweep';
import { storedScreening } from '../pages/fixtures';

const getScreenedCase = vi.fn();
const getCriteria = vi.fn();
vi.mock('../../../src/api/screenings', () => ({ getScreenedCase: (...a: unknown[]) => getScreenedCase(...a) }));
vi.mock('../../../src/api/criteria', () => ({ getCriteria: (...a: unknown[]) => getCriteria(...a) }));
vi.mock('vue3-apexcharts', async () => {
  const { defineComponent, h } = await import('vue');
  return { default: defineComponent({ setup: () => () => h('div', { 'data-test': 'apex-stub' }) }) };
});

function example(name: string): GapsightCase {
  const parsed = parseCase(JSON.parse(readFileSync(`examples/cases/${name}.json`, 'utf8')));
  if (!parsed.ok) throw new Error(`${name} does not parse`);
  return parsed.value;
}

function render(c: GapsightCase) {
  const result = screenCase(c, criteriaV2);
  const screening = storedScreening({ id: 77, criteriaVersion: 2, result });
  getScreenedCase.mockResolvedValue({ screeningId: 77, eventId: 11, criteriaVersion: 2, computedAt: '2026-12-01T09:00:00.000Z', case: c });
  getCriteria.mockResolvedValue({ version: 2, status: 'published', thresholds: criteriaV2 });
  return mount(ScreeningSweepCharts, { props: { screening }, global: { plugins: [Quasar] } });
}

const rowsOf = (table: ReturnType<ReturnType<typeof render>['get']>) =>
  table.findAll('tbody tr').map((r) => r.findAll('th, td').map((c) => c.text().replace(/\s+/g, ' ')));

// Invented DF (%) at five frequencies for one configuration.
const DF: [number, number][] = [
  [15, 0.41],
  [30, 0.34],
  [50, 0.31],
  [100, 0.3],
  [400, 0.34],
];

describe('ScreeningSweepCharts', () => {
  beforeEach(() => {
    getScreenedCase.mockReset();
    getCriteria.mockReset();
  });

  it('fetches the case once and draws one overlay per sweep, its table holding the engine’s R per band', async () => {
    const c = example('sweeps');
    const w = render(c);
    await flushPromises();
    expect(getScreenedCase).toHaveBeenCalledTimes(1);
    expect(getScreenedCase).toHaveBeenCalledWith(77);
    expect(getCriteria).toHaveBeenCalledWith(2);
    const overlays = w.findAll('[data-test="sweep-overlay"]');
    expect(overlays).toHaveLength(c.sweeps!.length);
    const s = c.sweeps!.find((x) => x.label === 'HV-A-open')!;
    const engine = compareTraces(s.baseline!, s.postFault, criteriaV2);
    const first = overlays.find((o) => o.attributes('data-sweep') === 'HV-A-open')!;
    expect(first.text()).toContain('HV winding, phase A, open circuit (HV-A-open): post-fault against baseline');
    const rows = rowsOf(first.get('[data-test="sweep-overlay-table"]'));
    expect(rows.map((r) => r[0])).toEqual(['Low band (1 kHz – 100 kHz)', 'Mid band (100 kHz – 600 kHz)', 'High band (600 kHz – 1 MHz)', 'All bands']);
    expect(rows.slice(0, 3).map((r) => r[2])).toEqual([engine.rLF, engine.rMF, engine.rHF].map((r) => r!.toFixed(3)));
    expect(rows[0][2]).toBe('0.223'); // R_LF 0.2229 in examples/cases/sweeps.result.json
    expect(rows[0][3]).toBe('Severe deformation');
    expect(rows[3][3]).toBe('Severe deformation');
    expect(w.find('[data-test="sweep-criteria-note"]').exists()).toBe(false);
    expect(w.find('[data-test="df-frequency"]').exists()).toBe(false);
  });

  it('shows the table on request, with the button saying whether it is open', async () => {
    const w = render(example('sweeps'));
    await flushPromises();
    const toggle = w.get('[data-test="sweep-overlay-table-toggle"]');
    expect(toggle.attributes('aria-expanded')).toBe('false');
    await toggle.trigger('click');
    expect(toggle.attributes('aria-expanded')).toBe('true');
    expect(w.get(`#${toggle.attributes('aria-controls')}`).find('[data-test="sweep-overlay-table"]').exists()).toBe(true);
  });

  it('draws the A–C pair of a winding without baseline traces, the low band not judged', async () => {
    const w = render(example('rev2-phase-comparison'));
    await flushPromises();
    const pair = w.findAll('[data-test="sweep-overlay"]').find((o) => o.attributes('data-sweep') === 'hv.AC')!;
    expect(pair.text()).toContain('HV winding, open circuit: phase A against phase C (no baseline trace)');
    const rows = rowsOf(pair.get('[data-test="sweep-overlay-table"]'));
    expect(rows[0].slice(1, 4)).toEqual(['—', '—', 'not judged']);
    expect(rows[1][2]).toBe('4.886'); // sweep.hv.AC.rMF 4.8861 in examples/cases/rev2-phase-comparison.result.json
  });

  it('draws dissipation over frequency when the case has it at several frequencies, with its table', async () => {
    const c = example('sweeps');
    const w = render({ ...c, postFault: { ...c.postFault, dissipationByFrequency: { CH: DF, CL: [[60, 0.3]] } } });
    await flushPromises();
    const charts = w.findAll('[data-test="df-frequency"]');
    expect(charts).toHaveLength(1);
    const rows = rowsOf(charts[0].get('[data-test="df-frequency-table"]'));
    expect(rows.map((r) => r[0])).toEqual(['15', '30', '50', '100', '400']);
    expect(rows.map((r) => r[1])).toEqual(['0.41', '0.34', '0.31', '0.3', '0.34']);
    expect(charts[0].text()).toMatch(/R² = 0\.\d{4}/);
  });

  it('fetches nothing when the result has neither sweeps nor DF over frequency', async () => {
    const c = example('sweeps');
    const w = render({ ...c, sweeps: undefined });
    await flushPromises();
    expect(getScreenedCase).not.toHaveBeenCalled();
    expect(w.find('[data-test="screening-sweep-charts"]').exists()).toBe(false);
  });
});
