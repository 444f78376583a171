// The design family page: nameplate, the family's median and spread, every unit in a table with outliers first, the
// flagged row, the unit the reader came from, and the quantity asked for in the request. The answer is hand-built from
// the computed sample of references.md (median 8.03, MAD 0.02, M(8.60) = 19.22), scaled to pF.
import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { DesignDetail, DesignSisters } from '../../../src/api/designs';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest } from '../helpers';
import { design40 } from './fixtures';

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
const textOf = (el: { text: () => string }) => el.text().replace(/\s+/g, ' ');

const detail: DesignDetail = {
  ...design40,
  units: [1, 2, 3, 4, 5, 6].map((id) => ({ id, serial: `U${id}`, position: 'T1', siteId: 1, siteName: 'Harrow Cross', year: 2010, lastRecommendation: null })),
};
// M = 0.6745·(x − 8.03)/0.02 for each value (hand computation); deviation 100·(x − 8.03)/8.03.
const VALUES = [8.02, 8.05, 7.98, 8.01, 8.04, 8.6];
const sisters = (quantity: string): DesignSisters => ({
  designId: 2,
  quantity,
  label: quantity === 'reactance.A' ? 'Phase A leakage reactance' : 'CHL capacitance',
  unit: quantity === 'reactance.A' ? '%' : 'pF',
  quantities: [
    { name: 'capacitance.CHL', label: 'CHL capacitance', unit: 'pF' },
    { name: 'reactance.A', label: 'Phase A leakage reactance', unit: '%' },
  ],
  items: VALUES.map((v, i) => ({
    unitId: i + 1,
    serial: `U${i + 1}`,
    value: v,
    takenAt: '2025-06-01T10:00:00.000Z',
    modifiedZ: (0.6745 * (v - 8.03)) / 0.02,
    deviationFromMedianPercent: (100 * (v - 8.03)) / 8.03,
    outlier: i === 5,
  })),
  median: 8.03,
  mad: 0.02,
  madFloored: false,
  constant: 0.6745,
  limit: 3.5,
  criteriaVersion: 2,
  note: null,
});

function script() {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/designs/2': { body: detail },
    'GET /api/designs/2/sisters': (r: RecordedRequest) => ({ body: sisters(new URL(r.url, 'http://x').searchParams.get('quantity') ?? 'capacitance.CHL') }),
  });
}

describe('DesignFamilyPage (/designs/:id)', () => {
  afterEach(resetClientState);

  it('lists every unit, the outlier first and flagged in words, with value, deviation and modified z to 2 decimals', async () => {
    script();
    const { wrapper } = await mountApp('/designs/2?unitId=3');
    await settle();
    expect(wrapper.get('[data-test="design-reference"]').text()).toBe(design40.reference);
    const rows = wrapper.findAll('[data-test="family-row"]');
    expect(rows).toHaveLength(6);
    const cells = rows.map((r) => r.findAll('th, td').map((c) => c.text().replace(/\s+/g, ' ')));
    // U6 8.60: M = 0.6745·0.57/0.02 = 19.22, deviation 7.10 %; then the others by serial
    expect(cells[0].slice(0, 5)).toEqual(['U6', '8.6 pF', '2025-06-01', '+7.10 %', '19.22']);
    expect(cells[0][5]).toMatch(/Outlier$/); // after the icon
    expect(cells.slice(1).map((c) => c[0])).toEqual(['U1', 'U2', 'U3 (this unit)', 'U4', 'U5']);
    // U3 7.98: M = 0.6745·(−0.05)/0.02 = −1.69, deviation −0.62 %
    expect(cells[3]).toEqual(['U3 (this unit)', '7.98 pF', '2025-06-01', '-0.62 %', '-1.69', 'Within the family']);
    const flagged = wrapper.findAll('[data-test="family-outlier"]');
    expect(flagged).toHaveLength(1);
    expect(rows[0].find('[data-test="family-outlier"]').exists()).toBe(true);
    expect(rows[0].get('[data-test="family-unit-link"]').attributes('href')).toBe('/units/6');
    expect(textOf(wrapper.get('[data-test="family-median"]'))).toBe('8.03 pF');
    expect(textOf(wrapper.get('[data-test="family-mad"]'))).toBe('0.02 pF');
    expect(wrapper.get('[data-test="family-outlier-count"]').text()).toBe('1 of 6 units');
    expect(wrapper.get('[data-test="family-nameplate"]').text()).toContain('132 / 33 kV');
  });

  it('draws the strip plot with every unit, this unit and the outlier in series of their own', async () => {
    script();
    const { wrapper } = await mountApp('/designs/2?unitId=3');
    await settle();
    const strip = wrapper.get('[data-test="sister-strip"]');
    // happy-dom gives no width, so the chart waits; the caption states the band (8.03 ± 3.5·0.02/0.6745 = 7.9262…8.1338)
    expect(strip.text()).toContain('7.9262 pF to 8.1338 pF');
  });

  it('asks for the quantity in the address and shows it', async () => {
    const requests = script();
    const { wrapper } = await mountApp('/designs/2?quantity=reactance.A');
    await settle();
    expect(requests.requests.some((r) => r.url.includes('/api/designs/2/sisters?quantity=reactance.A'))).toBe(true);
    expect(textOf(wrapper.get('[data-test="family-median"]'))).toBe('8.03 %');
  });
});
