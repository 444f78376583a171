// Duty figures as stored by the engine: the winding current with its factor and basis (and the reason when the line
// current had to stand in), a thermal-region fault as time against the allowed time, results of rules revision 1.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import EventDutyFigures from '../../../src/components/event/EventDutyFigures.vue';
import type { ThroughFault } from '../../../shared/schemas/result';
import { screeningResult } from '../pages/fixtures';

// The case-format worked example: 40 MVA, 10.5 %, category IV, 6.3 kA on the LV side (9.0023 × rated line).
const highDuty: ThroughFault = {
  ...screeningResult().throughFault!,
  windingCurrentFactor: 1,
  currentBasis: 'line-converted',
  thermalDurationPercent: null,
};

// 3.0 × rated (IEEE C57.109 thermal curve point 3 × rated, 300 s), shots of 0.5 s + 0.4 s: 0.9/300 = 0.3 %.
const thermal: ThroughFault = {
  ...highDuty,
  currentPerUnit: 3,
  forceRatioPercent: 9.92,
  highDuty: false,
  i2t: 8.1,
  eventDutyPercent: 4.47,
  cumulativeI2t: 8.1,
  cumulativeDutyPercent: 4.47,
  shotsAboveSegment: 0,
  thermalDurationPercent: 0.3,
};

function render(duty: ThroughFault | null, extra: Record<string, unknown> = {}) {
  return mount(EventDutyFigures, { props: { duty, ...extra }, global: { plugins: [Quasar] } });
}

describe('EventDutyFigures', () => {
  it('shows the winding current with its factor and basis (revision 2), and the high-duty I²t against K', () => {
    const wrapper = render({ ...highDuty, currentPerUnit: 10.395, windingCurrentFactor: 2 / Math.sqrt(3) });

    expect(wrapper.get('[data-test="duty-per-unit"]').text()).toBe('10.4 × rated');
    expect(wrapper.text()).toContain('Largest shot, winding current');
    const winding = wrapper.get('[data-test="duty-winding"]').text();
    expect(winding).toContain('1.155 × line current');
    // 10.395 / 1.1547 = 9.0 × rated line
    expect(winding).toContain('(line 9.0 × rated)');
    expect(wrapper.get('[data-test="duty-current-basis"]').text()).toBe('converted from the line current by the vector group');
    expect(wrapper.find('[data-test="duty-winding-reason"]').exists()).toBe(false);
    expect(wrapper.get('[data-test="duty-i2t"]').text()).toContain('8.7 % of K');
    expect(wrapper.find('[data-test="duty-thermal"]').exists()).toBe(false);
  });

  it('gives the engine’s reason when the line current stands in for the winding current', () => {
    const reason = 'ground fault measured at delta terminals: the winding current is not fixed by the line current: the line current is used as the winding current — enter the winding current or attach the relay record';
    const wrapper = render({ ...highDuty, windingCurrentFactor: null, currentBasis: 'line-assumed' }, { windingReason: reason });

    expect(wrapper.text()).toContain('Largest shot (line current, used as winding)');
    expect(wrapper.get('[data-test="duty-winding"]').text()).toContain('factor unknown');
    expect(wrapper.get('[data-test="duty-current-basis"]').text()).toContain('line current used as the winding current');
    expect(wrapper.get('[data-test="duty-winding-reason"]').text()).toBe(reason);
  });

  it('tells a thermal-region fault as time against the allowed time, never as a percentage of K', () => {
    const wrapper = render(thermal);

    const text = wrapper.get('[data-test="duty-thermal"]').text();
    expect(text).toContain('0.9 s of 300 s allowed');
    expect(text).toContain('(0.3 %)');
    expect(wrapper.get('[data-test="duty-i2t"]').text()).not.toContain('% of K');
    expect(wrapper.get('[data-test="duty-i2t"]').text()).not.toContain('4.5');
    expect(wrapper.get('[data-test="duty-beyond"]').text()).toContain('thermal curve: duration against allowed time');
  });

  it('shows a result of rules revision 1 without inventing a winding current or a thermal time', () => {
    const { windingCurrentFactor: _f, currentBasis: _b, thermalDurationPercent: _t, ...old } = thermal;
    const wrapper = render(old);

    expect(wrapper.text()).toContain('Largest shot');
    expect(wrapper.text()).not.toContain('winding current');
    expect(wrapper.find('[data-test="duty-winding"]').exists()).toBe(false);
    expect(wrapper.get('[data-test="duty-thermal"]').text()).toContain('not computed (result of rules revision 1)');
    expect(wrapper.get('[data-test="duty-i2t"]').text()).not.toContain('% of K');
  });

  it('flags a current above the design maximum with an icon and words instead of a force figure', () => {
    // 30 × rated against a 9.52 × rated maximum: (30/9.52)² = 992 % would be meaningless.
    const wrapper = render({ ...highDuty, currentPerUnit: 30, forceRatioPercent: 992.25 });

    expect(wrapper.get('[data-test="duty-force"]').text()).toContain('over 100 %');
    expect(wrapper.get('[data-test="duty-force"]').text()).not.toContain('992');
    expect(wrapper.get('[data-test="duty-force"] .q-icon').text()).toBe('warning');
    expect(wrapper.get('[data-test="duty-over-maximum"]').text()).toContain('above the design maximum of 9.5 × rated');
  });

  it('draws the duty curve of a stored event from its duty inputs, and none on the live form', async () => {
    const dutyCase = {
      unit: { serial: 'T1', phases: 3 as const, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5 },
      fault: { occurredAt: '2026-07-01T03:12:00Z', type: 'three-phase' as const, side: 'lv' as const, transformerTripped: true, protectionOperated: ['overcurrent' as const], shots: [{ currentKA: 6.3, durationS: 0.12 }] },
      priorFaults: [],
    };
    const stored = render(highDuty, { dutyCase });
    expect(stored.find('[data-test="duty-curve-slot"]').exists()).toBe(true);
    const live = render(highDuty, { dutyCase, live: true });
    expect(live.find('[data-test="duty-curve-slot"]').exists()).toBe(false);
    const without = render(highDuty);
    expect(without.find('[data-test="duty-curve-slot"]').exists()).toBe(false);
  });
});
