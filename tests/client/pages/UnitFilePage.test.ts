import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../src/api/auth';
import type { UnitDetail } from '../../../src/api/units';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { unitDetail } from './fixtures';

// The chart library draws on SVG APIs happy-dom lacks: stand in a component that shows the series it was given.
vi.mock('vue3-apexcharts', async () => {
  const { defineComponent, h } = await import('vue');
  return {
    default: defineComponent({
      props: { series: { type: Array, default: () => [] } },
      setup: (props) => () => h('div', { 'data-test': 'apex-stub', 'data-series': JSON.stringify(props.series) }),
    }),
  };
});

enableAutoUnmount(afterEach);

function signedInAs(roles: Role[], unit: UnitDetail | { status: number; body: unknown } = unitDetail()) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles }) },
    'GET /api/health': { body: healthy },
    'GET /api/units/3': 'status' in unit ? unit : { body: unit },
  });
}

describe('UnitFilePage (/units/:id)', () => {
  afterEach(resetClientState);

  it('shows the nameplate with numbers and their units, the site with its time zone and a link to the sister units', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/units/3');

    expect(wrapper.get('[data-test="unit-serial"]').text()).toBe('KVP-HX-T2');
    expect(wrapper.get('[data-test="unit-site"]').text()).toBe('Harrow Cross (Europe/London)');
    const nameplate = wrapper.get('[data-test="nameplate"]');
    const figures = nameplate.findAll('dd.gs-num').map((dd) => dd.text().replace(/\s+/g, ' '));
    expect(figures).toContain('40 MVA');
    expect(figures).toContain('132 kV');
    expect(figures).toContain('33 kV');
    expect(figures).toContain('10.5 %');
    expect(wrapper.get('[data-test="design-link"]').attributes('href')).toBe('/units?designId=2');
  });

  it('shows the cautions beside the unit’s last recommendation, and none when the unit has no recommendation', async () => {
    signedInAs(['engineer']);
    const withRecommendation = await mountApp('/units/3');
    expect(withRecommendation.wrapper.get('[data-test="recommendation-badge"]').attributes('data-recommendation')).toBe('conditional');
    expect(withRecommendation.wrapper.get('[data-test="cautions"]').text()).toContain('decision support for qualified staff');
    withRecommendation.wrapper.unmount();
    resetClientState();

    signedInAs(['engineer'], unitDetail({ lastRecommendation: null }));
    const without = await mountApp('/units/3');
    expect(without.wrapper.find('[data-test="cautions"]').exists()).toBe(false);
  });

  it('lists the reading sets with kind, time, temperature, tap and instrument, and shows the values on demand', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/units/3');

    const rows = wrapper.findAll('[data-test="reading-set-row"]');
    expect(rows).toHaveLength(2);
    expect(rows[0].text()).toContain('Routine');
    expect(rows[0].text()).toContain('2024-06-20 10:00 +01:00 Europe/London');
    expect(rows[0].text()).toContain('24.0 °C');
    expect(rows[0].text()).toContain('9b');
    expect(rows[0].text()).toContain('Invented CP-100 · S-118');
    expect(wrapper.find('[data-test="reading-set-values"]').exists()).toBe(false);

    await rows[1].get('[data-test="toggle-values"]').trigger('click');
    await settle();
    const values = wrapper.get('[data-test="reading-set-values"]').findAll('[data-test="value-row"]').map((r) => r.text());
    expect(values).toContain('CapacitanceCHL5210pF');
    expect(values).toContain('Dissipation factorCL0.31%');
    expect(values).toContain('Leakage reactanceB11.58%');
  });

  it('lists the unit’s events newest first with status and duty summary', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/units/3');

    const events = wrapper.findAll('[data-test="unit-event-row"]');
    expect(events).toHaveLength(2);
    expect(events[0].text()).toContain('2026-07-01 04:12');
    expect(events[0].get('[data-test="status-chip"]').text()).toContain('Screened');
    expect(events[0].text()).toContain('9.0');
    expect(events[0].text()).toContain('89.3 %');
    expect(events[1].text()).toContain('2024-02-11 18:40 +00:00');
    expect(events[1].get('[data-test="status-chip"]').text()).toContain('Released');
  });

  it('shows the trends of the unit (capacitance first) with a table of the same numbers, oldest first', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/units/3');
    await wrapper.get('[data-test="unit-trends-table-toggle"]').trigger('click');
    const rows = wrapper.get('[data-test="unit-trends-table"]').findAll('tbody tr').map((r) => r.findAll('th, td').map((c) => c.text()));
    expect(rows).toEqual([
      ['2019-05-02 · Factory', '3120', '5210', '9870', 'CH, CHL, CL'],
      ['2024-06-20 · Routine', '3124', '5222', '9881', '—'],
    ]);
  });

  it('says what to do when the unit has no baseline', async () => {
    const withoutBaseline = unitDetail();
    withoutBaseline.readingSets = withoutBaseline.readingSets.filter((s) => s.kind !== 'factory');
    signedInAs(['engineer'], withoutBaseline);
    const { wrapper } = await mountApp('/units/3');

    expect(wrapper.get('[data-test="no-baseline"] p').text()).toBe(
      'No baseline yet — add the factory test results or let sister units stand in.',
    );
    const change = wrapper.get('[data-test="unit-trends-mode"]').findAll('button').find((b) => b.text().startsWith('Change'))!;
    await change.trigger('click');
    expect(wrapper.get('[data-test="unit-trends"]').text()).toContain('No baseline to compare with: CH, CHL, CL');
  });

  it('shows no baseline note when a factory set exists', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/units/3');

    expect(wrapper.find('[data-test="no-baseline"]').exists()).toBe(false);
  });

  it('offers "Log a fault on this unit" to protection engineers only, pre-selecting the unit', async () => {
    signedInAs(['protection']);
    const protection = await mountApp('/units/3');
    expect(protection.wrapper.get('[data-test="log-fault"]').attributes('href')).toBe('/events/new?unitId=3');
    protection.wrapper.unmount();

    signedInAs(['tester']);
    const tester = await mountApp('/units/3');
    expect(tester.wrapper.find('[data-test="log-fault"]').exists()).toBe(false);
  });

  it('says there is no such unit on a 404', async () => {
    signedInAs(['engineer'], { status: 404, body: { error: { code: 'not_found', message: 'Unit not found.' } } });
    const { wrapper } = await mountApp('/units/3');

    expect(wrapper.get('[data-test="unit-error"]').text()).toContain('There is no unit with this number.');
  });

  it('lets a tester add a reading set of the unit (engineers only read), checked against the unit’s own baseline', async () => {
    signedInAs(['engineer']);
    const reader = await mountApp('/units/3');
    expect(reader.wrapper.find('[data-test="add-reading-set"]').exists()).toBe(false);
    reader.wrapper.unmount();
    resetClientState();

    signedInAs(['tester']);
    const { wrapper } = await mountApp('/units/3');
    await wrapper.get('[data-test="add-reading-set"]').trigger('click');
    // The reading set form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('[data-test="set-kind"]').exists()).toBe(true));
    await settle();
    expect(wrapper.find('[data-test="set-kind"]').exists()).toBe(true);
    expect(wrapper.find('[data-test="session-pre-fault-gas"]').exists()).toBe(false);
    expect(wrapper.get('[data-test="session-references"]').text()).toMatch(/checked as you type against/);
  });

  it('lets a tester remove a sweep trace of a set after confirming, then reads the unit again (engineers see no remove)', async () => {
    const trace = { id: 70, readingSetId: 21, label: 'HV-A-open', testType: 'open-circuit' as const, terminals: null, winding: null, phase: null, tapPosition: '9b', baselineTapPosition: null, demagnetised: null, pointCount: 1000, minHz: 1000, maxHz: 1000000, sha256: 'cd'.repeat(32), fileName: null, createdAt: '2019-05-02T12:00:00.000Z' };
    const base = unitDetail();
    const withTrace = { ...base, readingSets: base.readingSets.map((set) => (set.id === 21 ? { ...set, sweeps: [trace] } : set)) };

    signedInAs(['engineer'], withTrace);
    const reader = await mountApp('/units/3');
    expect(reader.wrapper.find('[data-test="sweep-remove"]').exists()).toBe(false);
    reader.wrapper.unmount();
    resetClientState();

    storeToken('valid');
    const removed = { id: 70, readingSetId: 21, removed: true, staleEventIds: [], note: null };
    const { requests } = scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['tester'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/units/3': { body: withTrace },
      'DELETE /api/sweeps/70': { body: removed },
    });
    const { wrapper } = await mountApp('/units/3');
    await wrapper.get('[data-test="sweep-remove"]').trigger('click');
    await settle();
    const confirm = [...document.body.querySelectorAll('button')].find((b) => b.textContent?.includes('Remove the trace'));
    expect(confirm?.textContent).toContain('Remove the trace');
    confirm!.click();
    await vi.waitFor(() => expect(requests.map((r) => `${r.method} ${r.url}`)).toContain('DELETE /api/sweeps/70'));
    await vi.waitFor(() => expect(requests.filter((r) => r.url === '/api/units/3').length).toBeGreaterThanOrEqual(2));
  });
});
