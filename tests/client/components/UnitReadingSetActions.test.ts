// A tester's actions on a unit's reading set: mark it as the reference (the server's answer passed on), open its
// correction or a baseline sweep upload; the correction form and the sweep upload sent to the unit's routes.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar, QSelect } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventSessionCorrectForm from '../../../src/components/event/EventSessionCorrectForm.vue';
import EventSweepUpload from '../../../src/components/event/EventSweepUpload.vue';
import UnitReadingSetActions from '../../../src/components/unit/UnitReadingSetActions.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { unitDetail } from '../pages/fixtures';
import { resetClientState, scriptFetch, settle } from '../helpers';

const [routine, factory] = unitDetail().readingSets;
const plugins = { global: { plugins: [[Quasar, quasarOptions]] as never }, attachTo: document.body };

const actions = (set = routine) => mount(UnitReadingSetActions, { props: { set }, ...plugins });

describe('UnitReadingSetActions', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('marks the set as the reference and passes the answer on', async () => {
    const answer = { ...routine, isReference: true, unmarkedIds: [19], staleEventIds: [], note: null };
    const { requests } = scriptFetch({ 'POST /api/reading-sets/21/reference': { body: answer } });
    const wrapper = actions();
    await wrapper.get('[data-test="set-mark-reference"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.emitted('marked')).toHaveLength(1));
    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['POST /api/reading-sets/21/reference']);
    expect(wrapper.emitted('marked')![0]).toEqual([answer]);
  });

  it('does not emit marked when the server refuses', async () => {
    scriptFetch({ 'POST /api/reading-sets/21/reference': { status: 403, body: { error: { code: 'forbidden', message: 'Not allowed.' } } } });
    const wrapper = actions();
    await wrapper.get('[data-test="set-mark-reference"]').trigger('click');
    await settle();
    await settle();
    expect(wrapper.emitted('marked')).toBeUndefined();
  });

  it('offers no "Mark as reference" on the reference set, and no action on a post-fault session', () => {
    const reference = actions({ ...factory, isReference: true });
    expect(reference.find('[data-test="set-mark-reference"]').exists()).toBe(false);
    expect(reference.find('[data-test="set-correct"]').exists()).toBe(true);
    const session = actions({ ...routine, kind: 'post-fault', eventId: 11 });
    expect(session.find('[data-test="set-correct"]').exists()).toBe(false);
    expect(session.find('[data-test="set-add-sweep"]').exists()).toBe(false);
  });

  it('asks for the correction form and the sweep upload', async () => {
    const wrapper = actions();
    await wrapper.get('[data-test="set-correct"]').trigger('click');
    await wrapper.get('[data-test="set-add-sweep"]').trigger('click');
    expect(wrapper.emitted('correct')).toHaveLength(1);
    expect(wrapper.emitted('sweep')).toHaveLength(1);
  });
});

describe('correcting a unit reading set', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('sends only the changed fields to PATCH /api/reading-sets/:id', async () => {
    const { requests } = scriptFetch({ 'PATCH /api/reading-sets/21': { body: { ...routine, humidityPercent: 40, staleEventIds: [], note: null } } });
    const wrapper: VueWrapper = mount(EventSessionCorrectForm, { props: { session: routine, zone: 'Europe/London', configurations: ['CH', 'CL', 'CHL'], unitSet: true }, ...plugins });
    expect(wrapper.text()).toMatch(/Correct the reading set of \d{4}-\d{2}-\d{2} \d{2}:\d{2}/);
    await wrapper.get('input[data-test="session-correct-humidityPercent"]').setValue('40');
    await wrapper.get('input[data-test="session-correct-capacitance-CHL"]').setValue('5230');
    await wrapper.get('[data-test="session-correct-form-21"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.emitted('saved')).toHaveLength(1));
    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['PATCH /api/reading-sets/21']);
    expect(requests[0].body).toEqual({ humidityPercent: 40, capacitancePF: { CH: 3124, CL: 9881, CHL: 5230 } });
  });

  it('shows the server\'s "record a new set instead" when a decided screening used the set', async () => {
    scriptFetch({ 'PATCH /api/reading-sets/20': { status: 409, body: { error: { code: 'invalid_status', message: 'A decided screening used this reading set: its values never change. Record a new set instead.' } } } });
    const wrapper = mount(EventSessionCorrectForm, { props: { session: factory, zone: 'Europe/London', configurations: ['CH', 'CL', 'CHL'], unitSet: true }, ...plugins });
    await wrapper.get('input[data-test="session-correct-ambientC"]').setValue('12');
    await wrapper.get('[data-test="session-correct-form-20"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.get('[data-test="session-correct-error"]').text()).toMatch(/Record a new set instead/));
    expect(wrapper.emitted('saved')).toBeUndefined();
  });
});

describe('a baseline sweep on a unit reading set', () => {
  afterEach(() => {
    resetClientState();
    document.body.innerHTML = '';
  });

  it('uploads to the unit with the reading set and without a baseline tap field', async () => {
    const { requests } = scriptFetch({ 'POST /api/units/3/sweeps': { status: 201, body: { id: 4, label: 'HV-A-open' } } });
    const wrapper = mount(EventSweepUpload, { props: { unitTarget: { unitId: 3, readingSetId: 20 } }, ...plugins });
    expect(wrapper.find('[data-test="sweep-baseline-tap"]').exists()).toBe(false);
    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-A-open');
    wrapper.findAllComponents(QSelect)[0].vm.$emit('update:modelValue', 'open-circuit');
    await settle();
    const input = wrapper.get('input[type="file"]').element as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [new File(['frequencyHz,magnitudeDb\n1000,-42.1\n2000,-45.0\n'], 'hv-a-open.csv', { type: 'text/csv' })], configurable: true, writable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
    await wrapper.get('[data-test="sweep-upload"]').trigger('submit');
    await vi.waitFor(() => expect(wrapper.emitted('uploaded')).toHaveLength(1));
    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['POST /api/units/3/sweeps']);
    const form = requests[0].body as FormData;
    expect(Object.fromEntries([...form.entries()].filter(([k]) => k !== 'file'))).toEqual({ label: 'HV-A-open', testType: 'open-circuit', readingSetId: '20' });
  });
});
