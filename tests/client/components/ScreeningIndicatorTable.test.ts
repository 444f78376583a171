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
  const row = wrapper.findAll('[data-test="indicator-row"]').find((r) => r.attributes('data-key') === key);
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
    expect(wrapper.findAll('thead th').map((th) => th.text())).toContain('Compared');
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

describe('ScreeningIndicatorTable — compact', () => {
  it('names every indicator in words (no code names), flagged rows first, all rows without paging', () => {
    const wrapper = render();
    const rows = wrapper.findAll('[data-test="indicator-row"]');
    expect(rows).toHaveLength(indicators.length);
    expect(rows.map((r) => r.attributes('data-level'))).toEqual(['investigate', 'investigate', 'watch', 'watch', 'watch', 'watch', 'ok', 'ok']);
    expect(rows[0].get('[data-test="indicator-label"]').text()).toBe('CHL capacitance shift vs baseline');
    expect(rowOf(wrapper, 'reactance.A.shiftPercent').get('[data-test="indicator-label"]').text()).toBe('Phase A reactance shift vs baseline');
    const text = wrapper.get('[data-test="indicator-table"]').text();
    for (const i of indicators) expect(text).not.toContain(i.key);
    expect(wrapper.find('.q-table__bottom').exists()).toBe(false);
  });

  it('shows the rule, source and method of a row on demand, and of every row with "Show rule and source"', async () => {
    const wrapper = render();
    const details = (key: string) => rowOf(wrapper, key).get('[data-test="indicator-details"]');
    expect(details('reactance.A.shiftPercent').isVisible()).toBe(false);

    await rowOf(wrapper, 'reactance.A.shiftPercent').get('[data-test="indicator-details-toggle"]').trigger('click');
    expect(details('reactance.A.shiftPercent').isVisible()).toBe(true);
    expect(details('reactance.A.shiftPercent').text()).toContain('Rule: rule');
    expect(details('reactance.A.shiftPercent').text()).toContain('Source: source');
    expect(details('reactance.A.shiftPercent').text()).toContain('Method: Leakage reactance');
    expect(details('capacitance.CL.shiftPercent').isVisible()).toBe(false);

    await wrapper.get('[data-test="indicator-all-details"]').trigger('click');
    expect(wrapper.findAll('[data-test="indicator-details"]').every((d) => d.isVisible())).toBe(true);
  });
});
