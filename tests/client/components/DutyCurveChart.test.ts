// The duty curve on screen: the cumulative duty beside the chart with its units, and the table view of the shots and
// the curve points (the chart itself needs a width, which jsdom does not give: the numbers are what is checked here).
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import DutyCurveChart from '../../../src/components/charts/DutyCurveChart.vue';
import { dutyCurveSeries } from '../../../shared/charts/duty-curve';
import type { Fault, Unit } from '../../../shared/schemas/case';
import { ratedCurrentA } from '../../../shared/screening/through-fault';

// references.md "Through-fault duty": Z_t 0.08, Z_s 0.02 → I_sc 10 pu, K 200; 7 pu for 0.5 s → I²t 24.5 = 12.25 % of K;
// allowed time at 7 pu 4.08 s.
const unit: Unit = { serial: 'T-IV', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 8, systemImpedancePercent: 2 };
const kA = (pu: number) => (pu * ratedCurrentA(unit.ratedKVA, unit.lvKV, 3)) / 1000;
const fault = (at: string, pu: number, s: number): Fault => ({ occurredAt: at, type: 'three-phase', side: 'lv', shots: [{ currentKA: kA(pu), durationS: s }] });

function render() {
  const curve = dutyCurveSeries({ unit, fault: fault('2026-11-28T03:12:00Z', 7, 0.5), priorFaults: [fault('2025-06-01T10:00:00Z', 4, 1)] });
  return mount(DutyCurveChart, { props: { curve }, global: { plugins: [Quasar] } });
}

describe('DutyCurveChart', () => {
  it('shows the cumulative duty with units beside the chart', () => {
    const w = render();
    const summary = w.get('[data-test="duty-curve-summary"]').text();
    // computed: 24.5 + 4²·1 = 40.5 per-unit² · s = 20.25 % of K 200
    expect(summary).toContain('40.5 per-unit² · s');
    expect(w.get('[data-test="duty-curve-cumulative-percent"]').text()).toBe('20.3 %');
    expect(summary).toContain('24.5 per-unit² · s (12.3 % of K)');
    expect(summary).toContain('200 per-unit² · s');
    expect(summary).toContain('10 × rated');
    expect(summary).toContain('5 × rated');
  });

  it('has a table view of the shots and the curve points, opened by a button that says so', async () => {
    const w = render();
    const toggle = w.get('[data-test="duty-curve-table-toggle"]');
    expect(toggle.attributes('aria-expanded')).toBe('false');
    await toggle.trigger('click');
    expect(toggle.attributes('aria-expanded')).toBe('true');
    const rows = w.get('[data-test="duty-curve-table"]').findAll('tbody tr').map((r) => r.findAll('th, td').map((c) => c.text()));
    expect(rows[0]).toEqual(['This fault, 2026-11-28', '7', '0.5', '24.5', '4.08 s']);
    expect(rows[1]).toEqual(['Earlier fault, 2025-06-01', '4', '1', '16', '110 s']);
    // Hand computed: thermal curve at 4 pu, log–log between 3 → 300 s and 4.75 → 60 s (references.md points):
    // f = (log 4 − log 3)/(log 4.75 − log 3) = 0.626; log t = log 300 + 0.626·(log 60 − log 300) = 2.0395 → 109.5 s.
    expect(rows).toContainEqual(['Thermal curve', '25', '2']);
    expect(rows).toContainEqual(['Mechanical segment: I²t = K = 200', '5', '8']);
  });
});
