import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../src/api/auth';
import type { EventDetail } from '../../../src/api/events';
import { captureDownloads, healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type ScriptedResponse } from '../helpers';
import { eventDetail, unitDetail } from './fixtures';

enableAutoUnmount(afterEach);

// The event file is a lazy route with many components: transform it once before the tests, so that the first test's
// time is its own (a cold worker on a busy machine can take seconds).
beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

type Script = Parameters<typeof scriptFetch>[0];

function signedInAs(roles: Role[], event: EventDetail = eventDetail(), extra: Script = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles }) },
    'GET /api/health': { body: healthy },
    'GET /api/events/11': { body: event },
    ...extra,
  });
}

// Put a file into a QFile (or any file input) the way a user's pick does: the input's files, then its change event.
async function pickFile(wrapper: VueWrapper, testId: string, file: File): Promise<void> {
  const holder = wrapper.get(`[data-test="${testId}"]`).element;
  const input = (holder instanceof HTMLInputElement ? holder : holder.querySelector('input[type="file"]')) as HTMLInputElement;
  Object.defineProperty(input, 'files', { value: [file], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
}

const csv = (name: string, text: string) => new File([text], name, { type: 'text/csv' });

describe('EventFilePage (/events/:id)', () => {
  afterEach(resetClientState);

  it('shows the unit, site with its time zone, the status as icon and word, and the fault with the server’s duty figures', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/events/11');

    expect(wrapper.get('[data-test="event-title"]').text()).toContain('KVP-HX-T2');
    expect(wrapper.get('[data-test="event-title"]').text()).toContain('2026-07-01 04:12 +01:00 Europe/London');
    expect(wrapper.get('[data-test="event-site"]').text()).toContain('Harrow Cross (Europe/London)');
    const status = wrapper.get('[data-test="status-chip"]');
    expect(status.attributes('data-status')).toBe('testing');
    expect(status.text()).toContain('Testing');
    const fault = wrapper.get('[data-test="fault-data"]').text();
    expect(fault).toContain('Three-phase');
    expect(fault).toContain('LV side (33 kV)');
    expect(fault).toContain('Overcurrent');
    expect(wrapper.get('[data-test="shots"]').text()).toContain('6.1 kA');
    expect(wrapper.get('[data-test="duty-per-unit"]').text()).toBe('9.0 × rated');
  });

  it('says where the fault was and what the currents are (rules revision 2), and how it reads an event logged before them', async () => {
    signedInAs(['engineer'], eventDetail({ location: 'hv', currentIs: 'winding' }));
    const logged = await mountApp('/events/11');
    expect(logged.wrapper.get('[data-test="fault-location"]').text()).toBe('HV side');
    expect(logged.wrapper.get('[data-test="fault-current-is"]').text()).toBe('Winding currents');
    logged.wrapper.unmount();
    resetClientState();

    signedInAs(['engineer'], eventDetail());
    const older = await mountApp('/events/11');
    expect(older.wrapper.get('[data-test="fault-location"]').text()).toContain('LV side (taken as the measured side)');
    expect(older.wrapper.get('[data-test="fault-current-is"]').text()).toContain('not stated: taken as line currents');
  });

  it('renders the post-fault sessions with their conditions and values, and the attached relay records', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/events/11');

    const sessions = wrapper.findAll('[data-test="session"]');
    expect(sessions).toHaveLength(1);
    expect(sessions[0].text()).toContain('2026-07-02 09:30 +01:00 Europe/London');
    expect(sessions[0].text()).toContain('top oil 33.0 °C');
    expect(sessions[0].text()).toContain('by Ruth Okafor');
    // Named by its time on the site's clock and its tester, not by its database id.
    expect(sessions[0].get('h3').text()).toBe('Tests of 2 Jul 2026 09:30 by Ruth Okafor');
    const values = sessions[0].findAll('[data-test="value-row"]').map((r) => r.text());
    expect(values).toContain('CapacitanceCHL5405pF');
    expect(values).toContain('Dissipation factorCH0.3%');

    const attachments = wrapper.findAll('[data-test="attachment"]');
    expect(attachments).toHaveLength(1);
    expect(attachments[0].text()).toContain('HX-T2-feeder4.cfg');
    expect(attachments[0].text()).toContain('COMTRADE configuration (.cfg) · 2 kB');
  });

  it('says what to do next when the event is not screened yet, with the cautions beside it', async () => {
    signedInAs(['manager']);
    const { wrapper } = await mountApp('/events/11');

    const section = wrapper.get('[data-test="screenings"]');
    expect(section.get('[data-test="not-screened"]').text()).toContain('No screening yet');
    expect(section.get('[data-test="next-step"]').text()).toContain('The test engineer is expected to finish the post-fault readings and run the screening');
    expect(section.find('[data-test="verdict-banner"]').exists()).toBe(false);
    expect(section.find('[data-test="recommendation-badge"]').exists()).toBe(false);
    expect(section.get('[data-test="cautions"]').text()).toContain('decision support for qualified staff');
  });

  it('shows the newest decisive screening in the banner and earlier or comparison runs in the history with badges', async () => {
    const result = { format: 'gapsight-result/1', recommendation: 'conditional', reasons: ['CHL capacitance shifted +3.74 %'], missing: [], unreliable: [], followUps: [], cautions: [], throughFault: null, indicators: [] };
    const event = eventDetail({
      status: 'screened',
      screenings: [
        { id: 2, recommendation: 'no-go', criteriaVersion: 2, comparison: true, computedById: 7, computedAt: '2026-07-03T10:00:00.000Z', result: { ...result, recommendation: 'no-go' } as never },
        { id: 1, recommendation: 'conditional', criteriaVersion: 1, comparison: false, computedById: 7, computedAt: '2026-07-03T09:00:00.000Z', result: result as never },
        { id: 0, recommendation: 'go', criteriaVersion: 1, comparison: false, computedById: 7, computedAt: '2026-07-02T09:00:00.000Z', result: { ...result, recommendation: 'go' } as never },
      ],
    });
    signedInAs(['manager'], event);
    const { wrapper } = await mountApp('/events/11');

    const banner = wrapper.get('[data-test="verdict-banner"]');
    expect(banner.attributes('data-recommendation')).toBe('conditional');
    expect(banner.text()).toContain('CHL capacitance shifted +3.74 %');
    const rows = wrapper.findAll('[data-test="screening-row"]');
    expect(rows.map((r) => r.get('[data-test="recommendation-badge"]').attributes('data-recommendation'))).toEqual(['no-go', 'go']);
    expect(rows[0].text()).toContain('(comparison)');
    expect(rows[1].text()).toContain('(superseded)');
    expect(wrapper.get('[data-test="screenings"] [data-test="cautions"]').text()).toContain('qualified staff');
  });

  it('lists every row error of a bad readings CSV before anything is uploaded, and uploads nothing', async () => {
    const { requests } = signedInAs(['tester'], eventDetail(), { 'POST /api/sessions/31/imports': { body: { imported: 0, rows: [] } } });
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="import-31"]').trigger('click');
    // The import form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-file"]').exists()).toBe(true));
    await settle();
    await pickFile(
      wrapper,
      'import-file',
      csv(
        'bad.csv',
        'quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\ncapacitance,CL,,"9990,5",pF\ninductance,CHL,,5405,pF\nreactance,,,11.6,%\n',
      ),
    );

    const errors = wrapper.findAll('[data-test="import-error"]').map((e) => e.text());
    expect(errors).toHaveLength(3);
    expect(errors[0]).toBe('Row 3, value: decimal comma: use a point (3.14)');
    // The list of known quantities is the shared parser's (it grows with the case format).
    expect(errors[1]).toMatch(/^Row 4, quantity: unknown quantity 'inductance': use one of capacitance, dissipation, reactance, /);
    expect(errors[2]).toBe('Row 5, phase: required for reactance: A, B or C');
    expect(wrapper.get('[data-test="import-errors"]').text()).toContain('nothing was uploaded');
    expect(wrapper.find('[data-test="import-upload"]').exists()).toBe(false);
    expect(requests.some((r) => r.url.startsWith('/api/sessions/'))).toBe(false);
  });

  it('maps another column layout onto the canonical header, previews the rows and uploads the canonical CSV as a file', async () => {
    const { requests } = signedInAs(['tester'], eventDetail(), {
      'POST /api/sessions/31/imports': { body: { imported: 2, rows: [] } },
    });
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="import-31"]').trigger('click');
    // The import form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('[data-test="import-file"]').exists()).toBe(true));
    await settle();
    await pickFile(wrapper, 'import-file', csv('testset-export.csv', 'Test,Insulation,Ph,Reading,UOM\ncapacitance,CH,,3131,pF\nreactance,,B,11.60,%\n'));

    expect(wrapper.find('[data-test="import-mapping"]').exists()).toBe(true);
    expect(requests.some((r) => r.url.startsWith('/api/sessions/'))).toBe(false);
    await wrapper.get('[data-test="apply-mapping"]').trigger('click');
    await settle();

    const preview = wrapper.findAll('[data-test="preview-row"]').map((r) => r.text());
    expect(preview).toEqual(['capacitanceCH3131pF', 'reactanceB11.6%']);
    await wrapper.get('[data-test="import-upload"]').trigger('click');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.url === '/api/sessions/31/imports')).toBe(true));

    const upload = requests.find((r) => r.url === '/api/sessions/31/imports')!;
    expect(upload.body).toBeInstanceOf(FormData);
    expect(upload.headers['content-type']).toBeUndefined();
    const sent = (upload.body as FormData).get('file') as File;
    expect(sent.name).toBe('testset-export.csv');
    expect(await sent.text()).toBe('quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\nreactance,,B,11.60,%\n');
  });

  it('opens a new session for a tester and posts its conditions and readings', async () => {
    const { requests } = signedInAs(['tester'], eventDetail(), {
      'POST /api/events/11/sessions': { status: 201, body: { id: 32, eventStatus: 'testing' } },
    });
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.find('[data-test="attachment-upload"]').exists()).toBe(false);

    await wrapper.get('[data-test="new-session"]').trigger('click');
    // The session form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('input[data-test="session-takenAt"]').exists()).toBe(true));
    await settle();
    const fill = async (id: string, value: string) => {
      await wrapper.get(`input[data-test="${id}"]`).setValue(value);
    };
    await fill('session-takenAt', '2026-07-02T09:30');
    await fill('session-topOilC', '33');
    await fill('session-bottomOilC', '29');
    await fill('session-capacitancePF.CH', '3131');
    await fill('session-dissipationPercent.CH', '0.30');
    await fill('session-reactance.B.percent', '11.60');
    await fill('session-tap', '9b');
    await settle();
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.url === '/api/events/11/sessions')).toBe(true));

    expect(requests.find((r) => r.url === '/api/events/11/sessions')?.body).toEqual({
      takenAt: '2026-07-02T08:30:00.000Z',
      topOilC: 33,
      bottomOilC: 29,
      capacitancePF: { CH: 3131 },
      dissipationPercent: { CH: 0.3 },
      reactance: { B: { percent: 11.6 } },
      tapPosition: '9b',
    });
  });

  it('shows a session’s revision-2 values: bushings, winding temperature, hours de-energised, demagnetised', async () => {
    const event = eventDetail();
    event.sessions[0].values = {
      takenAt: '2026-07-02',
      hoursDeEnergised: 6,
      demagnetised: true,
      windingTemperatureC: 29,
      bushings: { H1: { c1PF: 421, c1DissipationPercent: 0.35, c2PF: 3050 } },
    };
    signedInAs(['engineer'], event);
    const { wrapper } = await mountApp('/events/11');

    const session = wrapper.get('[data-test="session"]');
    expect(session.text()).toContain('6 h de-energised');
    expect(session.get('[data-test="session-demagnetised-flag"]').text()).toContain('core demagnetised');
    const values = session.findAll('[data-test="value-row"]').map((r) => r.text());
    expect(values).toEqual(expect.arrayContaining(['Bushing C1H1421pF', 'Bushing C1 dissipation factorH10.35%', 'Bushing C2H13050pF', 'Winding temperature29°C']));
  });

  it('checks the session form against the event’s case (its baseline) once the form opens', async () => {
    const caseDoc = {
      format: 'gapsight-case/1',
      unit: { serial: 'KVP-HX-T2', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5, vectorGroup: 'YNd1' },
      baseline: { takenAt: '2019-05-02', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 } },
    };
    const { requests } = signedInAs(['tester'], eventDetail(), { 'GET /api/events/11/case': { body: caseDoc } });
    const { wrapper } = await mountApp('/events/11');
    // Not fetched before it is needed.
    expect(requests.some((r) => r.url === '/api/events/11/case')).toBe(false);

    await wrapper.get('[data-test="new-session"]').trigger('click');
    // The session form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('input[data-test="session-takenAt"]').exists()).toBe(true));
    await settle();
    expect(requests.filter((r) => r.url === '/api/events/11/case')).toHaveLength(1);
    expect(wrapper.get('[data-test="session-references"]').text()).toContain('2019-05-02 baseline');
    await wrapper.get('input[data-test="session-capacitancePF.CL"]').setValue('9.87');
    await settle();
    expect(wrapper.get('[data-test="session-capacitancePF.CL-warning"]').text()).toContain('this looks like nF');
  });

  it('marks a stored post-fault sweep that has no baseline trace to compare with', async () => {
    const sweep = (id: number, label: string) => ({
      id, readingSetId: 31, label, testType: 'open-circuit' as const, terminals: null, winding: 'hv' as const, phase: label.includes('-A-') ? ('A' as const) : ('B' as const),
      tapPosition: '9b', baselineTapPosition: null, demagnetised: null, pointCount: 1000, minHz: 1000, maxHz: 1000000, sha256: 'ab'.repeat(32), fileName: null, createdAt: '2026-07-02T10:00:00.000Z',
    });
    const event = eventDetail();
    event.sessions[0].sweeps = [sweep(81, 'HV-A-open'), sweep(82, 'HV-B-open')];
    const caseDoc = {
      format: 'gapsight-case/1',
      unit: { serial: 'KVP-HX-T2', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5 },
      sweeps: [
        { label: 'HV-A-open', testType: 'open-circuit', baseline: [[1000, -42.1]], postFault: [[1000, -42.3]] },
        { label: 'HV-B-open', testType: 'open-circuit', postFault: [[1000, -42.3]] },
      ],
    };
    signedInAs(['engineer'], event, { 'GET /api/events/11/case': { body: caseDoc } });
    const { wrapper } = await mountApp('/events/11');

    const traces = wrapper.findAll('[data-test="session-sweep"]');
    expect(traces).toHaveLength(2);
    expect(traces[0].text()).toContain('HV phase A');
    expect(traces[0].find('[data-test="sweep-no-baseline"]').exists()).toBe(false);
    expect(traces[1].get('[data-test="sweep-no-baseline"]').text()).toContain('no baseline trace to compare with');
  });

  it('tells the sweep form which baseline traces the unit has (from the unit file, before the fault)', async () => {
    const unit = unitDetail();
    unit.readingSets[1].sweeps = [
      { id: 70, readingSetId: 20, label: 'HV-A-open', testType: 'open-circuit', terminals: null, winding: null, phase: null, tapPosition: '9b', baselineTapPosition: null, demagnetised: null, pointCount: 1000, minHz: 1000, maxHz: 1000000, sha256: 'cd'.repeat(32), fileName: null, createdAt: '2019-05-02T12:00:00.000Z' },
    ];
    signedInAs(['tester'], eventDetail(), { 'GET /api/units/3': { body: unit } });
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="sweep-31"]').trigger('click');
    // The sweep form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('input[data-test="sweep-label"]').exists()).toBe(true));
    await settle();
    expect(wrapper.get('[data-test="sweep-baseline-labels"]').text()).toContain('HV-A-open');
    await wrapper.get('input[data-test="sweep-label"]').setValue('HV-B-open');
    await settle();
    expect(wrapper.get('[data-test="sweep-no-baseline-warning"]').text()).toContain('no baseline trace to compare with');
  });

  it('shows a range error in the session form as the value is typed, and posts nothing', async () => {
    const { requests } = signedInAs(['tester']);
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="new-session"]').trigger('click');
    // The session form loads when first opened.
    await vi.waitFor(() => expect(wrapper.find('input[data-test="session-takenAt"]').exists()).toBe(true));
    await settle();
    await wrapper.get('input[data-test="session-humidityPercent"]').setValue('140');
    await settle();
    const field = wrapper.get('input[data-test="session-humidityPercent"]').element.closest('.q-field')!;
    expect(field.classList.contains('q-field--error')).toBe(true);
    expect(field.textContent).toContain('%');
    await wrapper.get('[data-test="session-form"]').trigger('submit');
    await settle();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('uploads a relay record for a protection engineer and shows a 415 refusal as the server words it', async () => {
    const message = 'the .cfg file is not a COMTRADE configuration: it is not text';
    const refusal: ScriptedResponse = { status: 415, body: { error: { code: 'unsupported_file_type', message, fields: { file: message } } } };
    const { requests } = signedInAs(['protection'], eventDetail(), { 'POST /api/events/11/attachments': refusal });
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.find('[data-test="new-session"]').exists()).toBe(false);

    await pickFile(wrapper, 'attachment-file', new File(['MZ\u0000'], 'fault.cfg', { type: 'application/octet-stream' }));
    await wrapper.get('[data-test="attachment-upload"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.find('[data-test="attachment-error"]').exists()).toBe(true));

    expect(wrapper.get('[data-test="attachment-error"]').text()).toBe(message);
    const upload = requests.find((r) => r.url === '/api/events/11/attachments')!;
    expect(((upload.body as FormData).get('file') as File).name).toBe('fault.cfg');
  });

  it('says how large a relay record may be when the server answers 413', async () => {
    signedInAs(['admin'], eventDetail(), {
      'POST /api/events/11/attachments': { status: 413, body: { error: { code: 'file_too_large', message: 'File too large' } } },
    });
    const { wrapper } = await mountApp('/events/11');

    await pickFile(wrapper, 'attachment-file', new File(['x'], 'big.dat'));
    await wrapper.get('[data-test="attachment-upload"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.find('[data-test="attachment-error"]').exists()).toBe(true));
    expect(wrapper.get('[data-test="attachment-error"]').text()).toContain('12 MB at most');
  });

  it('downloads the case file as JSON from GET /api/events/:id/case', async () => {
    const caseDoc = { format: 'gapsight-case/1', unit: { serial: 'KVP-HX-T2' } };
    signedInAs(['engineer'], eventDetail(), { 'GET /api/events/11/case': { body: caseDoc } });
    const { blobs, fileName } = captureDownloads();
    const { wrapper } = await mountApp('/events/11');

    await wrapper.get('[data-test="case-file"]').trigger('click');
    await vi.waitFor(() => expect(blobs).toHaveLength(1));

    expect(JSON.parse(await blobs[0].text())).toEqual(caseDoc);
    expect(fileName()).toBe('gapsight-case-event-11.json');
  });

  it('keeps the audit trail (when, and what happened in words) in an expansion item', async () => {
    signedInAs(['engineer']);
    const { wrapper } = await mountApp('/events/11');

    const audit = wrapper.get('[data-test="audit"]');
    expect(audit.text()).toContain('Audit trail');
    await audit.get('.q-item').trigger('click');
    await settle();
    const row = wrapper.get('[data-test="audit-row"]').text();
    expect(row).toContain('2026-07-01 05:00');
    expect(row).toContain('Dara Whitcombe logged the fault of 1 Jul 2026 05:00.');
    expect(audit.text()).toContain('1 entry');
  });
});
