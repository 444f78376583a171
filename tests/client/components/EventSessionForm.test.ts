// The post-fault session form: every field of a case reading set can be entered (with the pre-fault oil sample and its
// sampling time, bushings row by row), and readings are checked for plausibility as they are typed — against the
// unit's case (baseline, previous, sisters), the nameplate ratio from the vector group, or the other values typed.
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { quasarOptions } from '../../../src/quasar-options';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventSessionForm from '../../../src/components/event/EventSessionForm.vue';
import type { GapsightCase } from '../../../shared/schemas/case';
import { resetClientState, scriptFetch, settle, type ScriptedResponse } from '../helpers';

// The demo family: 40 MVA 132/33 kV YNd1 (invented values, shaped like the case format's example).
const unit = { phases: 3 as const, hvKV: 132, lvKV: 33, ratedKVA: 40000, vectorGroup: 'YNd1' };

const referenceCase: GapsightCase = {
  format: 'gapsight-case/1',
  unit: { serial: 'KVP-HX-T2', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5, vectorGroup: 'YNd1' },
  baseline: {
    takenAt: '2019-05-02',
    capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 },
    reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } },
    bushings: { H1: { c1PF: 420 } },
  },
  previous: { takenAt: '2024-06-20', capacitancePF: { CH: 3124 }, bushings: { H2: { c1PF: 415, c2PF: 3100 } } },
};

function render(props: Record<string, unknown> = {}) {
  return mount(EventSessionForm, {
    props: {
      eventId: 11,
      timeZone: 'Europe/London',
      configurations: ['CH', 'CL', 'CHL'],
      unit,
      faultAt: '2026-07-01T03:12:00.000Z',
      referenceCase,
      referenceState: 'ready',
      ...props,
    },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

async function fill(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  await wrapper.get(`input[data-test="${testId}"]`).setValue(value);
  await settle();
}

const warningOf = (wrapper: VueWrapper, testId: string) => wrapper.find(`[data-test="${testId}-warning"]`);
const fieldOf = (wrapper: VueWrapper, testId: string) => wrapper.get(`input[data-test="${testId}"]`).element.closest('.q-field')!;

function created(): ScriptedResponse {
  return { status: 201, body: { id: 32, eventStatus: 'testing' } };
}

describe('EventSessionForm', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('takes every field of a reading set and posts them under the API’s names, with the pre-fault sample and its time', async () => {
    const { requests } = scriptFetch({ 'POST /api/events/11/sessions': created() });
    const wrapper = render();

    await fill(wrapper, 'session-takenAt', '2026-07-02T09:30');
    await fill(wrapper, 'session-topOilC', '33');
    await fill(wrapper, 'session-hoursDeEnergised', '6');
    await wrapper.get('[data-test="session-demagnetised"]').trigger('click');
    await fill(wrapper, 'session-capacitancePF.CH', '3131');
    await fill(wrapper, 'session-dissipationPercent.CH', '0.30');
    await fill(wrapper, 'session-reactance.A.percent', '11.65');
    await fill(wrapper, 'session-excitationKV', '10');
    for (const [p, v] of [['A', '21.4'], ['B', '15.2'], ['C', '22.0']]) await fill(wrapper, `session-excitationCurrentMA.${p}`, v);
    for (const [p, v] of [['A', '0.412'], ['B', '0.409'], ['C', '0.415']]) await fill(wrapper, `session-windingResistanceOhm.${p}`, v);
    await fill(wrapper, 'session-windingTemperatureC', '29');
    for (const p of ['A', 'B', 'C']) await fill(wrapper, `session-turnsRatio.${p}`, '2.3095');
    for (const [g, v] of [['H2', '35'], ['CH4', '12'], ['C2H6', '4'], ['C2H4', '6'], ['C2H2', '0.5'], ['CO', '310'], ['CO2', '2400']]) {
      await fill(wrapper, `session-dissolvedGasPPM.${g}`, v);
    }
    await fill(wrapper, 'session-preFaultGas.takenAt', '2026-03-10T10:00');
    await fill(wrapper, 'session-preFaultGas.dissolvedGasPPM.H2', '20');
    await fill(wrapper, 'session-preFaultGas.dissolvedGasPPM.C2H2', '0');
    await wrapper.get('[data-test="add-bushing"]').trigger('click');
    await settle();
    await fill(wrapper, 'bushing-0-terminal', 'H1');
    await fill(wrapper, 'bushing-0-c1PF', '421');
    await fill(wrapper, 'bushing-0-c1DissipationPercent', '0.35');
    await fill(wrapper, 'bushing-0-c2PF', '3050');
    await fill(wrapper, 'bushing-0-c2DissipationPercent', '0.6');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));

    expect(requests.find((r) => r.url === '/api/events/11/sessions')!.body).toEqual({
      // 09:30 British Summer Time is 08:30 UTC.
      takenAt: '2026-07-02T08:30:00.000Z',
      topOilC: 33,
      hoursDeEnergised: 6,
      demagnetised: true,
      capacitancePF: { CH: 3131 },
      dissipationPercent: { CH: 0.3 },
      reactance: { A: { percent: 11.65 } },
      excitationKV: 10,
      excitationCurrentMA: { A: 21.4, B: 15.2, C: 22 },
      windingResistanceOhm: { A: 0.412, B: 0.409, C: 0.415 },
      windingTemperatureC: 29,
      turnsRatio: { A: 2.3095, B: 2.3095, C: 2.3095 },
      dissolvedGasPPM: { H2: 35, CH4: 12, C2H6: 4, C2H4: 6, C2H2: 0.5, CO: 310, CO2: 2400 },
      bushings: { H1: { c1PF: 421, c1DissipationPercent: 0.35, c2PF: 3050, c2DissipationPercent: 0.6 } },
      // 10:00 Greenwich Mean Time in March is 10:00 UTC.
      preFaultGas: { takenAt: '2026-03-10T10:00:00.000Z', dissolvedGasPPM: { H2: 20, C2H2: 0 } },
    });
    expect(wrapper.emitted('created')).toHaveLength(1);
  });

  it('explains what “demagnetised” means next to the box', () => {
    const wrapper = render();
    expect(wrapper.get('[data-test="session-demagnetised-hint"]').text()).toBe(
      'core demagnetised before excitation and sweeps, or they were taken before any DC test',
    );
  });

  it('warns as typed when a capacitance looks like nF or is implausible against the baseline, and says nothing for a plausible one', async () => {
    const wrapper = render();
    expect(wrapper.get('[data-test="session-references"]').text()).toContain('2019-05-02 baseline');

    // 3.131 against the 3120 pF baseline: 1/996 of it — typed in nF.
    await fill(wrapper, 'session-capacitancePF.CH', '3.131');
    expect(warningOf(wrapper, 'session-capacitancePF.CH').text()).toContain('this looks like nF');
    expect(warningOf(wrapper, 'session-capacitancePF.CH').text()).toContain('3120 pF, 2019-05-02 baseline');
    // 15 000 against 9870: 1.52 × — beyond 1.5 ×.
    await fill(wrapper, 'session-capacitancePF.CL', '15000');
    expect(warningOf(wrapper, 'session-capacitancePF.CL').text()).toContain('implausible against the reference — check the unit of measure and the connection');
    // 3400 against 5210: 0.65 × — below 1/1.5 = 0.667 ×.
    await fill(wrapper, 'session-capacitancePF.CHL', '3400');
    expect(warningOf(wrapper, 'session-capacitancePF.CHL').text()).toContain('implausible against the reference');
    // A real shift of +3.7 % is a finding for the engine, not a typing error.
    await fill(wrapper, 'session-capacitancePF.CHL', '5405');
    expect(warningOf(wrapper, 'session-capacitancePF.CHL').exists()).toBe(false);
    await fill(wrapper, 'session-capacitancePF.CH', '3131');
    expect(warningOf(wrapper, 'session-capacitancePF.CH').exists()).toBe(false);
    // A warning is not an error: the field is not marked invalid.
    expect(fieldOf(wrapper, 'session-capacitancePF.CL').classList.contains('q-field--error')).toBe(false);
  });

  it('checks reactance %X against the baseline and the turns ratio against the nameplate ratio of the vector group', async () => {
    const wrapper = render();

    // 1.162 against 11.62 %: a tenth.
    await fill(wrapper, 'session-reactance.A.percent', '1.162');
    expect(warningOf(wrapper, 'session-reactance.A.percent').text()).toContain('implausible against the reference');
    expect(warningOf(wrapper, 'session-reactance.A.percent').text()).toContain('11.62 %, 2019-05-02 baseline');
    await fill(wrapper, 'session-reactance.B.percent', '11.70');
    expect(warningOf(wrapper, 'session-reactance.B.percent').exists()).toBe(false);

    // YNd1: expected winding ratio 132/(√3·33) = 2.3094. The line-voltage ratio 4.0 is 73 % off.
    await fill(wrapper, 'session-turnsRatio.A', '4.0');
    const warning = warningOf(wrapper, 'session-turnsRatio.A').text();
    expect(warning).toContain('implausible against the reference');
    expect(warning).toContain('reference 2.309, nameplate ratio of YNd1');
    expect(warning).toContain('more than 10 % off');
    // 2.10 is 9.1 % off: a real (if alarming) reading, left to the engine.
    await fill(wrapper, 'session-turnsRatio.B', '2.10');
    expect(warningOf(wrapper, 'session-turnsRatio.B').exists()).toBe(false);
    // 2.05 is 11.2 % off.
    await fill(wrapper, 'session-turnsRatio.C', '2.05');
    expect(warningOf(wrapper, 'session-turnsRatio.C').exists()).toBe(true);
  });

  it('with no reference reachable, compares the values typed with each other', async () => {
    const wrapper = render({ referenceCase: null, referenceState: 'error', unit: { ...unit, vectorGroup: null } });
    expect(wrapper.get('[data-test="session-references"]').text()).toContain('could not be loaded');

    await fill(wrapper, 'session-reactance.A.percent', '11.6');
    await fill(wrapper, 'session-reactance.B.percent', '11.58');
    expect(warningOf(wrapper, 'session-reactance.B.percent').exists()).toBe(false);
    // 17.5 against the median 11.59 of the others: 1.51 ×.
    await fill(wrapper, 'session-reactance.C.percent', '17.5');
    expect(warningOf(wrapper, 'session-reactance.C.percent').text()).toContain('implausible against the reference — check the unit of measure and the connection (reference 11.59 %, the other phases typed)');

    await fill(wrapper, 'session-capacitancePF.CL', '9870');
    await fill(wrapper, 'session-capacitancePF.CHL', '5210');
    expect(warningOf(wrapper, 'session-capacitancePF.CHL').exists()).toBe(false);
    await fill(wrapper, 'session-capacitancePF.CH', '3.12');
    expect(warningOf(wrapper, 'session-capacitancePF.CH').text()).toContain('this looks like nF');

    // No vector group and no case: the ratios are compared with each other (2.31 vs 2.6: 12.6 % off).
    await fill(wrapper, 'session-turnsRatio.A', '2.31');
    await fill(wrapper, 'session-turnsRatio.B', '2.31');
    expect(warningOf(wrapper, 'session-turnsRatio.B').exists()).toBe(false);
    await fill(wrapper, 'session-turnsRatio.C', '2.6');
    expect(warningOf(wrapper, 'session-turnsRatio.C').text()).toContain('the other phases typed');
  });

  it('adds and removes bushing rows, checks each C1 against that terminal’s reference, and wants a label and a C1', async () => {
    const { requests } = scriptFetch({ 'POST /api/events/11/sessions': created() });
    const wrapper = render();
    expect(wrapper.findAll('[data-test="bushing-row"]')).toHaveLength(0);

    await wrapper.get('[data-test="add-bushing"]').trigger('click');
    await settle();
    await wrapper.get('[data-test="add-bushing"]').trigger('click');
    await settle();
    expect(wrapper.findAll('[data-test="bushing-row"]')).toHaveLength(2);
    expect(fieldOf(wrapper, 'bushing-0-c1PF').textContent).toContain('pF');
    expect(fieldOf(wrapper, 'bushing-0-c1DissipationPercent').textContent).toContain('%');

    await fill(wrapper, 'bushing-0-terminal', 'H1');
    // 0.42 against H1's 420 pF baseline: typed in nF.
    await fill(wrapper, 'bushing-0-c1PF', '0.42');
    expect(warningOf(wrapper, 'bushing-0-c1PF').text()).toContain('this looks like nF');
    expect(warningOf(wrapper, 'bushing-0-c1PF').text()).toContain('420 pF, 2019-05-02 baseline');
    await fill(wrapper, 'bushing-0-c1PF', '430');
    expect(warningOf(wrapper, 'bushing-0-c1PF').exists()).toBe(false);

    // H2 has only a previous test (415 pF C1, 3100 pF C2); its C2 typed as 31 000 is 10 × too large.
    await fill(wrapper, 'bushing-1-terminal', 'H2');
    await fill(wrapper, 'bushing-1-c2PF', '31000');
    expect(warningOf(wrapper, 'bushing-1-c2PF').text()).toContain('3100 pF, 2024-06-20 previous test');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await settle();
    expect(fieldOf(wrapper, 'bushing-1-c1PF').textContent).toContain('required: the C1 capacitance');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);

    await wrapper.get('[data-test="remove-bushing-1"]').trigger('click');
    await settle();
    expect(wrapper.findAll('[data-test="bushing-row"]')).toHaveLength(1);
    await wrapper.get('[data-test="add-bushing"]').trigger('click');
    await settle();
    await fill(wrapper, 'bushing-1-c1PF', '418');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await settle();
    expect(wrapper.get('input[data-test="bushing-1-terminal"]').element.closest('.q-field')!.textContent).toContain('the terminal label');
    await fill(wrapper, 'bushing-1-terminal', 'H1');
    expect(wrapper.get('input[data-test="bushing-1-terminal"]').element.closest('.q-field')!.textContent).toContain('terminal H1 is listed twice');
    await fill(wrapper, 'bushing-1-terminal', 'H3');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect((requests[0].body as { bushings: unknown }).bushings).toEqual({ H1: { c1PF: 430 }, H3: { c1PF: 418 } });
  });

  it('wants the pre-fault sample’s time, before the fault, when its gases are given', async () => {
    const { requests } = scriptFetch({ 'POST /api/events/11/sessions': created() });
    const wrapper = render();

    await fill(wrapper, 'session-preFaultGas.dissolvedGasPPM.C2H2', '0.2');
    expect(fieldOf(wrapper, 'session-preFaultGas.takenAt').textContent).toContain('required: when was the pre-fault sample taken?');
    // 05:00 BST on 1 July is after the fault (03:12 UTC = 04:12 BST).
    await fill(wrapper, 'session-preFaultGas.takenAt', '2026-07-01T05:00');
    expect(fieldOf(wrapper, 'session-preFaultGas.takenAt').textContent).toContain('must be before the fault (2026-07-01 04:12 +01:00 Europe/London)');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await flushPromises();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);

    await fill(wrapper, 'session-preFaultGas.takenAt', '2026-06-30T09:00');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect((requests[0].body as { preFaultGas: unknown }).preFaultGas).toEqual({ takenAt: '2026-06-30T08:00:00.000Z', dissolvedGasPPM: { C2H2: 0.2 } });
  });

  it('shows the server’s field errors beside the fields they name, a bushing by its terminal', async () => {
    scriptFetch({
      'POST /api/events/11/sessions': {
        status: 400,
        body: {
          error: {
            code: 'invalid_input',
            message: 'Some fields are invalid.',
            fields: { 'bushings.H1.c1PF': 'above the test set’s range', 'preFaultGas.takenAt': 'must be before the fault' },
          },
        },
      },
    });
    const wrapper = render();

    await wrapper.get('[data-test="add-bushing"]').trigger('click');
    await settle();
    await fill(wrapper, 'bushing-0-terminal', 'H1');
    await fill(wrapper, 'bushing-0-c1PF', '430');
    await fill(wrapper, 'session-preFaultGas.takenAt', '2026-06-30T09:00');
    await fill(wrapper, 'session-preFaultGas.dissolvedGasPPM.H2', '20');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.find('[data-test="session-form-error"]').exists()).toBe(true));

    expect(wrapper.get('[data-test="session-form-error"]').text()).toContain('Some fields are invalid.');
    expect(fieldOf(wrapper, 'bushing-0-c1PF').textContent).toContain('above the test set’s range');
    expect(fieldOf(wrapper, 'session-preFaultGas.takenAt').textContent).toContain('must be before the fault');
  });

  it('names a decimal comma in any reading field', async () => {
    const wrapper = render();
    await fill(wrapper, 'session-windingResistanceOhm.A', '0,412');
    expect(fieldOf(wrapper, 'session-windingResistanceOhm.A').textContent).toContain('decimal comma');
    await fill(wrapper, 'session-dissolvedGasPPM.C2H2', '-1');
    expect(fieldOf(wrapper, 'session-dissolvedGasPPM.C2H2').classList.contains('q-field--error')).toBe(true);
  });

  it('enters a factory, commissioning or routine set of the unit: kind required, reference mark, no separate pre-fault sample', async () => {
    const { requests } = scriptFetch({ 'POST /api/units/7/reading-sets': { status: 201, body: { id: 90, kind: 'routine' } } });
    const wrapper = render({ eventId: null, unitId: 7, faultAt: null });
    expect(wrapper.find('[data-test="session-pre-fault-gas"]').exists()).toBe(false);
    await fill(wrapper, 'session-takenAt', '2026-05-04T10:00');
    await fill(wrapper, 'session-capacitancePF.CH', '3121');
    await fill(wrapper, 'session-dissolvedGasPPM.C2H2', '0.2');
    await wrapper.get('form').trigger('submit');
    await settle();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
    expect(wrapper.get('[data-test="set-kind-error"]').text()).toContain('required: factory, commissioning or routine');

    await wrapper.get('[data-test="set-kind-routine"]').trigger('click');
    await wrapper.get('[data-test="set-reference"]').trigger('click');
    await settle();
    await wrapper.get('form').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests[0].url).toBe('/api/units/7/reading-sets');
    expect(requests[0].body).toEqual({
      takenAt: '2026-05-04T09:00:00.000Z', // 10:00 British Summer Time
      kind: 'routine',
      isReference: true,
      capacitancePF: { CH: 3121 },
      dissolvedGasPPM: { C2H2: 0.2 },
    });
    expect(wrapper.emitted('created')).toHaveLength(1);
  });
});
