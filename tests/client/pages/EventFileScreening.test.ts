// The event file's screening panel: verdict banner, reasons, missing/unreliable items, indicator table, report,
// running a screening (and a comparison run), refusals in words.
import { enableAutoUnmount } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../src/api/auth';
import type { EventDetail } from '../../../src/api/events';
import { captureDownloads, healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { eventDetail, screenedEvent, screeningResult, storedScreening } from './fixtures';
import { ICON_SVGS } from '../../../src/icons';

// Which icon a q-icon draws (inline SVG, no ligature word): its SVG paths, named back through src/icons.ts.
const iconOf = (el: Element) => {
  const drawn = [...el.querySelectorAll('path')].map((p) => p.getAttribute('d')).join('&&');
  return Object.keys(ICON_SVGS).find((name) => ICON_SVGS[name].split('&&').map((p) => p.split('@@')[0]).join('&&') === drawn);
};

enableAutoUnmount(afterEach);

// The event file is a lazy route with many components: transform it once before the tests, so that the first test's
// time is its own (a cold worker on a busy machine can take seconds).
beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

type Script = Parameters<typeof scriptFetch>[0];

function signedInAs(roles: Role[], event: EventDetail | (() => EventDetail), extra: Script = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles }) },
    'GET /api/health': { body: healthy },
    'GET /api/events/11': () => ({ body: typeof event === 'function' ? event() : event }),
    ...extra,
  });
}

describe('EventFilePage — screening panel', () => {
  afterEach(resetClientState);

  it('shows the verdict first: the recommendation word with its icon, the first reason as the one-line reason, when, by whom and the criteria version', async () => {
    signedInAs(['manager'], screenedEvent());
    const { wrapper } = await mountApp('/events/11');

    const banner = wrapper.get('[data-test="verdict-banner"]');
    expect(banner.attributes('data-recommendation')).toBe('conditional');
    expect(banner.get('[data-test="verdict-word"]').text()).toContain('Conditional');
    expect(iconOf(banner.get('.q-icon').element)).toBe('warning');
    expect(banner.get('[data-test="verdict-reason"]').text()).toBe('CHL capacitance shifted +3.74 % against the 2019-05-02 baseline (investigate from 3 %)');
    const meta = banner.get('[data-test="verdict-meta"]').text();
    expect(meta).toContain('2026-07-03 10:00 +01:00 Europe/London');
    expect(meta).toContain('by Ruth Okafor');
    // A result stored without engineRevision was computed with rules revision 1.
    expect(meta).toContain('criteria set 1 · rules revision 1');
    // The banner comes before the evidence.
    const html = wrapper.html();
    expect(html.indexOf('verdict-banner')).toBeGreaterThan(-1);
    expect(html.indexOf('verdict-banner')).toBeLessThan(html.indexOf('indicator-table'));
  });

  it('lists the reasons, names missing and unreliable quantities in words, and shows the proposed follow-ups and the cautions', async () => {
    signedInAs(['tester'], screenedEvent());
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.findAll('[data-test="reason"]').map((r) => r.text())).toEqual([
      'CHL capacitance shifted +3.74 % against the 2019-05-02 baseline (investigate from 3 %)',
      'CL capacitance shifted +1.22 % against the 2019-05-02 baseline',
    ]);
    expect(wrapper.get('[data-test="missing-item"]').text()).toContain('Missing: reactance phase B');
    expect(wrapper.get('[data-test="unreliable-item"]').text()).toContain('Unreliable — repeat the test: CL capacitance');
    expect(wrapper.get('[data-test="proposed-follow-ups"]').text()).toContain('Frequency-response sweep at the next outage');
    expect(wrapper.get('[data-test="screening-panel"] [data-test="cautions"]').text()).toContain('qualified staff');
    // The duty once, with the fault; the verdict says the largest shot in one line.
    expect(wrapper.findAll('[data-test="duty-per-unit"]')).toHaveLength(1);
    expect(wrapper.get('[data-test="fault-section"] [data-test="duty-per-unit"]').text()).toBe('9.0 × rated');
    expect(wrapper.get('[data-test="verdict-duty"]').text()).toContain('Largest shot 9.0 × rated, 89 % of design force, high duty');
    // The cautions only beside the verdict.
    expect(wrapper.findAll('[data-test="cautions"]')).toHaveLength(1);
  });

  it('lists every indicator with its value, level word, rule, source and method — rows at watch or above first; a null value shows its note', async () => {
    signedInAs(['engineer'], screenedEvent());
    const { wrapper } = await mountApp('/events/11');

    const rows = wrapper.findAll('[data-test="indicator-row"]');
    expect(rows.map((r) => r.attributes('data-level'))).toEqual(['investigate', 'watch', 'ok', 'ok']);
    const chl = rows[0];
    expect(chl.get('[data-test="indicator-label"]').text()).toBe('CHL capacitance shift vs baseline');
    expect(chl.text()).not.toContain('capacitance.CHL.shiftPercent');
    expect(chl.text()).toContain('3.743 %');
    expect(chl.get('[data-test="level-badge"]').text()).toContain('Investigate');
    // Rule, source and method on demand (in the page, folded).
    expect(chl.text()).toContain('|shift| ≥ 3 %');
    expect(chl.text()).toContain('utility practice (from memory)');
    expect(chl.get('[data-test="indicator-details"]').text()).toContain('Method: Capacitance');
    expect(rows[1].get('[data-test="level-badge"]').text()).toContain('Watch');
    expect(rows[1].text()).toContain('slight');
    expect(rows.map((r) => r.get('.app-level-badge__word').text())).toEqual(['Investigate', 'Watch', 'OK', 'OK']);
    const nullRow = rows.find((r) => r.attributes('data-key') === 'powerFactor.CH.pf20Percent')!;
    expect(nullRow.get('[data-test="indicator-label"]').text()).toBe('CH power factor at 20 °C');
    expect(nullRow.get('[data-test="indicator-note"]').text()).toContain('temperature outside the 10–70 °C table');
    const okRow = rows.find((r) => r.attributes('data-key') === 'capacitance.CH.shiftPercent')!;
    expect(okRow.text()).toContain('0.3526 %');
  });

  it('names the criteria set and rules revision of every stored screening: the banner, the history and the decision panel', async () => {
    const rev2 = storedScreening({ id: 63, criteriaVersion: 2, result: screeningResult({ engineRevision: 2, criteriaVersion: 2 }) });
    const old = storedScreening({ id: 61, criteriaVersion: 1, computedAt: '2026-07-02T09:00:00.000Z' });
    const comparison = storedScreening({ id: 64, criteriaVersion: 3, comparison: true, result: screeningResult({ engineRevision: 2, criteriaVersion: 3 }) });
    signedInAs(['manager'], screenedEvent({ screenings: [comparison, rev2, old] }));
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="verdict-rules"]').text()).toBe('criteria set 2 · rules revision 2');
    expect(wrapper.findAll('[data-test="screening-row-rules"]').map((r) => r.text())).toEqual([
      'criteria set 3 · rules revision 2',
      'criteria set 1 · rules revision 1',
    ]);
    expect(wrapper.get('[data-test="decision-rules"]').text()).toContain('criteria set 2 · rules revision 2');
  });

  it('shows the basis of each indicator, low-confidence marks, all five cautions and the duty with its winding current', async () => {
    const result = screeningResult({
      engineRevision: 2,
      throughFault: { ...screeningResult().throughFault!, windingCurrentFactor: null, currentBasis: 'line-assumed', thermalDurationPercent: null },
      indicators: [
        { key: 'capacitance.CHL.shiftPercent', value: 3.74, level: 'investigate', rule: '|shift| ≥ 3 %', source: 'utility practice (from memory)', method: 'capacitance', basis: 'change', reference: '2019-05-02 baseline' },
        { key: 'resistance.A.changePercent', value: 2.6, level: 'watch', rule: '|change| > 2 %', source: 'IEEE C57.152 (from memory)', method: 'resistance', basis: 'change', lowConfidence: true, note: 'winding temperature unknown' },
      ],
    });
    // A phase-to-ground fault measured at the delta LV terminals of the YNd1 unit: no winding-current factor.
    const event = screenedEvent({ type: 'phase-to-ground', screenings: [storedScreening({ criteriaVersion: 2, result })] });
    event.throughFault = { ...event.throughFault!, windingCurrentFactor: null, currentBasis: 'line-assumed' };
    signedInAs(['engineer'], event);
    const { wrapper } = await mountApp('/events/11');

    const rows = wrapper.findAll('[data-test="indicator-row"]');
    expect(rows.map((r) => r.get('[data-test="indicator-basis-text"]').text())).toEqual(['against own baseline', 'against own baseline']);
    expect(rows[1].get('[data-test="indicator-low-confidence"]').text()).toContain('Low confidence: winding temperature unknown');
    // Compact beside the verdict: the first caution shown, all five behind "All cautions".
    const cautions = wrapper.get('[data-test="screening-panel"] [data-test="cautions"]').findAll('li');
    expect(cautions).toHaveLength(5);
    expect(cautions.map((c) => c.isVisible())).toEqual([true, false, false, false, false]);
    await wrapper.get('[data-test="cautions-all"]').trigger('click');
    expect(cautions.every((c) => c.isVisible())).toBe(true);
    const fault = wrapper.get('[data-test="fault-section"]');
    expect(fault.get('[data-test="duty-winding-reason"]').text()).toContain('ground fault measured at delta terminals');
  });

  it('shows only watch-and-above rows when asked', async () => {
    signedInAs(['engineer'], screenedEvent());
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="indicator-flagged-only"]').trigger('click');
    await settle();
    expect(wrapper.findAll('[data-test="indicator-row"]').map((r) => r.attributes('data-level'))).toEqual(['investigate', 'watch']);
  });

  it('runs a screening for a tester: posts to the event and re-renders with the stored verdict', async () => {
    let screened = false;
    const { requests } = signedInAs(['tester'], () => (screened ? screenedEvent() : eventDetail()), {
      'POST /api/events/11/screenings': () => {
        screened = true;
        return { status: 201, body: { id: 61, result: screeningResult(), criteriaVersion: 1, comparison: false } };
      },
    });
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.find('[data-test="verdict-banner"]').exists()).toBe(false);

    await wrapper.get('[data-test="run-screening"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.find('[data-test="verdict-banner"]').exists()).toBe(true));

    const post = requests.find((r) => r.method === 'POST' && r.url === '/api/events/11/screenings')!;
    expect(post.body).toEqual({});
    expect(requests.filter((r) => r.method === 'GET' && r.url === '/api/events/11')).toHaveLength(2);
    expect(wrapper.get('[data-test="verdict-word"]').text()).toContain('Conditional');
    expect(wrapper.get('[data-test="status-chip"]').attributes('data-status')).toBe('screened');
    expect(wrapper.get('[data-test="run-screening"]').text()).toContain('Run screening again');
  });

  it('says plainly why a screening run was refused (409) and keeps the page as it was', async () => {
    signedInAs(['manager'], eventDetail(), {
      'POST /api/events/11/screenings': {
        status: 409,
        body: { error: { code: 'invalid_status', message: 'The event has no post-fault readings to screen.' } },
      },
    });
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="run-screening"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.find('[data-test="run-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="run-error"]').text()).toContain('The screening cannot run now: The event has no post-fault readings to screen.');
    expect(wrapper.find('[data-test="not-screened"]').exists()).toBe(true);
  });

  it('offers Run screening only while the status allows it and only to the roles that may run one', async () => {
    signedInAs(['tester'], eventDetail({ status: 'logged', sessions: [] }));
    const logged = await mountApp('/events/11');
    expect(logged.wrapper.find('[data-test="run-screening"]').exists()).toBe(false);
    expect(logged.wrapper.get('[data-test="run-unavailable"]').text()).toContain('once a post-fault session exists');
    logged.wrapper.unmount();
    resetClientState();

    signedInAs(['protection'], eventDetail());
    const protection = await mountApp('/events/11');
    expect(protection.wrapper.find('[data-test="run-controls"]').exists()).toBe(false);
    protection.wrapper.unmount();
    resetClientState();

    signedInAs(['admin'], screenedEvent());
    const admin = await mountApp('/events/11');
    expect(admin.wrapper.find('[data-test="run-screening"]').exists()).toBe(true);
    expect(admin.wrapper.find('[data-test="comparison-toggle-form"]').exists()).toBe(false);
  });

  it('lets an asset engineer run a comparison under another criteria version', async () => {
    const { requests } = signedInAs(['engineer'], screenedEvent(), {
      'POST /api/events/11/screenings': { status: 201, body: { id: 62, result: screeningResult({ recommendation: 'no-go' }), criteriaVersion: 2, comparison: true } },
    });
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="comparison-toggle-form"]').trigger('click');
    await settle();
    await wrapper.get('input[data-test="comparison-version"]').setValue('2');
    await wrapper.get('[data-test="run-comparison"]').trigger('click');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.url === '/api/events/11/screenings')).toBe(true));

    expect(requests.find((r) => r.url === '/api/events/11/screenings')!.body).toEqual({ criteriaVersion: 2, comparison: true });
  });

  it('downloads the report PDF of the screening through the authenticated download', async () => {
    const { requests } = signedInAs(['manager'], screenedEvent(), {
      'GET /api/screenings/61/report.pdf': { body: '%PDF-1.7' },
    });
    const { blobs, fileName } = captureDownloads();
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="report-pdf"]').trigger('click');
    await vi.waitFor(() => expect(blobs).toHaveLength(1));

    const get = requests.find((r) => r.url === '/api/screenings/61/report.pdf')!;
    expect(get.headers.authorization).toBe('Bearer valid');
    expect(fileName()).toBe('gapsight-screening-61.pdf');
  });

  it('keeps the empty state when only comparison runs exist, and lists them', async () => {
    signedInAs(['engineer'], eventDetail({ screenings: [storedScreening({ id: 70, comparison: true, criteriaVersion: 2 })] }));
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="not-screened"]').text()).toContain('Only comparison runs are stored so far');
    expect(wrapper.findAll('[data-test="screening-row"]')).toHaveLength(1);
  });
});
