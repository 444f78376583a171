// The indicator table says what each indicator compares (its basis, in words) and marks low-confidence items with an
// icon, a word and the note — never colour alone.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import ScreeningIndicatorTable from '../../../src/components/screening/ScreeningIndicatorTable.vue';
import type { Indicator } from '../../../shared/schemas/result';

const base = { rule: 'rule', source: 'source' } as const;

const indicators: Indicator[] = [
  { ...base, key: 'capacitance.CHL.shiftPercent', value: 3.74, level: 'investigate', method: 'capacitance', basis: 'change', reference: '2019-05-02 baseline' },
  { ...base, key: 'capacitance.CHL.shiftFromPreviousPercent', value: 3.5, level: 'investigate', method: 'capacitance', basis: 'change', reference: '2024-06-20 previous test' },
  { ...base, key: 'sisters.capacitance.CHL.modifiedZ', value: 4.1, level: 'watch', method: 'sisters', basis: 'state' },
  { ...base, key: 'reactance.A.shiftPercent', value: 1.2, level: 'watch', method: 'reactance', basis: 'sisters', note: "sisters' median as reference" },
  { ...base, key: 'sweep.hv.AC.class', value: 'slight', level: 'watch', method: 'sweep', basis: 'phase-comparison' },
  { ...base, key: 'duty.eventDutyPercent', value: 8.7, level: 'ok', method: 'duty', basis: 'duty' },
  {
    ...base,
    key: 'powerFactor.CH.riseFromBaselinePercent',
    value: 120,
    level: 'watch',
    method: 'power-factor',
    basis: 'change',
    lowConfidence: true,
    note: 'temperature correction uncertain',
  },
  // A result stored before rules revision 2 has no basis.
  { ...base, key: 'capacitance.CL.shiftPercent', value: 0.4, level: 'ok', method: 'capacitance' },
];

function render(list: Indicator[] = indicators) {
  return mount(ScreeningIndicatorTable, { props: { indicators: list }, global: { plugins: [Quasar] }, attachTo: document.body });
}

function rowOf(wrapper: ReturnType<typeof render>, key: string) {
  const row = wrapper.findAll('[data-test="indicator-row"]').find((r) => r.get('.indicators__key').text() === key);
  if (!row) throw new Error(`no row ${key}`);
  return row;
}

describe('ScreeningIndicatorTable — basis and low confidence', () => {
  it('says in words what each indicator compares', () => {
    const wrapper = render();
    const basis = (key: string) => rowOf(wrapper, key).get('[data-test="indicator-basis-text"]').text();

    expect(basis('capacitance.CHL.shiftPercent')).toBe('against own baseline');
    expect(basis('capacitance.CHL.shiftFromPreviousPercent')).toBe('against own previous test');
    expect(basis('reactance.A.shiftPercent')).toBe('against sister units');
    expect(basis('sweep.hv.AC.class')).toBe('phase A vs C');
    expect(basis('sisters.capacitance.CHL.modifiedZ')).toBe('state (absolute value)');
    expect(basis('duty.eventDutyPercent')).toBe('duty');
    expect(basis('capacitance.CL.shiftPercent')).toBe('—');
    expect(wrapper.findAll('thead th').map((th) => th.text().replace('arrow_upward', ''))).toContain('Compared');
  });

  it('marks a low-confidence item with an icon, the words "Low confidence" and its note; other rows carry no mark', () => {
    const wrapper = render();

    const marks = wrapper.findAll('[data-test="indicator-low-confidence"]');
    expect(marks).toHaveLength(1);
    const row = rowOf(wrapper, 'powerFactor.CH.riseFromBaselinePercent');
    const mark = row.get('[data-test="indicator-low-confidence"]');
    expect(mark.text()).toContain('Low confidence');
    expect(mark.text()).toContain('temperature correction uncertain');
    expect(mark.get('.q-icon').text()).toBe('help_outline');
    // The level is still shown as icon and word.
    expect(row.get('[data-test="level-badge"]').text()).toContain('Watch');
    expect(rowOf(wrapper, 'reactance.A.shiftPercent').find('[data-test="indicator-low-confidence"]').exists()).toBe(false);
  });
});
