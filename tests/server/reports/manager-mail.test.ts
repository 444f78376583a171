import { describe, expect, it } from 'vitest';
import { buildManagerMail, escapeHtml } from '../../../server/reports/manager-mail.js';
import { buildDecisionMail } from '../../../server/reports/decision-mail.js';
import { CAUTIONS } from '../../../shared/screening/verdict.js';
import { screeningHeadline } from '../../../shared/screening/headline.js';
import {
  deltaMeasuredReport,
  doubtsReport,
  dutyOnlyGoReport,
  exampleCaseReport,
  inServiceNoGoReport,
  internalFaultReport,
  lineAssumedReport,
  recentEventReport,
  storedRevision1InServiceReport,
  storedRevision1Report,
  thermalRegionReport,
} from './report-fixtures.js';

const count = (text: string, part: string) => text.split(part).length - 1;

describe("manager's e-mail (buildManagerMail)", () => {
  it('puts the recommendation in capitals, the unit, the site and the first decisive reason (trimmed) in the subject', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.subject).toBe('[Gapsight] CONDITIONAL — KVP-HX-T2 (Harrow Cross): CHL capacitance shifted +3.42 %…');
    expect(m.subject).not.toMatch(/[\r\n]/);
  });

  it('starts the body with the verdict and its one-line reason, in text and in HTML', () => {
    const m = buildManagerMail(recentEventReport());
    const firstLines = m.text.split('\n').slice(0, 3).join('\n');
    expect(firstLines).toContain('CONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)');
    expect(firstLines).toContain('Why: CHL capacitance shifted +3.42 % against the 2009-03-18 baseline (investigate from 3 %)');
    expect(m.html).toContain('CONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)');
    expect(m.html.indexOf('CONDITIONAL')).toBeLessThan(m.html.indexOf('Protection'));
  });

  it('says the fault in plain words with the right numbers: 9.0 × rated, 89 % of the design force, category, the 2nd such fault since 2024', () => {
    const m = buildManagerMail(recentEventReport());
    // Revision 1 stored the line current, revision 2 the winding current (a three-phase fault: factor 1, the same number).
    const words = /9\.0 × rated (line|winding) current, 89 % of the design force \(IEEE category IV\), the 2nd such fault since 2024/;
    expect(m.text).toMatch(words);
    expect(m.html).toMatch(words);
    expect(m.text).toContain('2 shots: 6.3 kA for 0.12 s, 6.1 kA for 0.08 s');
    expect(m.text).toMatch(/cumulative 12 % \(Gapsight tally/);
  });

  it('says whether a transformer protection operated, and that overcurrent is not an internal protection', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toContain('Protection operated: overcurrent — no internal protection');
    expect(m.text.toLowerCase()).not.toContain('internal fault suspected');
  });

  it('shows the times in ISO form with the site time zone and its offset (winter and summer)', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toContain('Fault: 2026-11-28 03:12 +00:00 Europe/London');
    expect(m.text).toContain('Post-fault tests: Tests of 29 Nov 2026 12:12 (2026-11-29 12:12 +00:00 Europe/London)');
    const summer = internalFaultReport(); // 2026-08-17T05:02:00Z
    expect(buildManagerMail(summer).text).toContain('Fault: 2026-08-17 06:02 +01:00 Europe/London');
    const sydney = { ...recentEventReport(), site: { name: 'Harrow Cross', timeZone: 'Australia/Sydney' } };
    expect(buildManagerMail(sydney).text).toContain('Fault: 2026-11-28 14:12 +11:00 Australia/Sydney');
  });

  it('names the tests done and outstanding in words', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toMatch(/Done: capacitance \(CH, CL, CHL\);.*leakage reactance \(A, B, C\);.*dissolved gases/);
    expect(m.text).toContain('frequency-response sweep (4 traces: HV-A-open, HV-B-open, HV-B-short, HV-C-open)');
    expect(m.text).toContain('Outstanding: none');

    const d = recentEventReport();
    d.result = { ...d.result, missing: ['sweep', 'dissolvedGasPPM'], unreliable: ['reactance.B'] };
    const text = buildManagerMail(d).text;
    expect(text).toContain('Outstanding: sweep (missing); dissolved gases (missing); reactance phase B (unreliable: repeat the test)');
  });

  it('says where independent methods agree (flagged indicators by method) and repeats the corroboration reason', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toContain('- capacitance: CHL capacitance shift vs baseline +3.42 % (INVESTIGATE); CHL capacitance shift vs previous test +3.16 % (INVESTIGATE)');
    expect(m.text).toContain('Only one independent method flags (capacitance)');

    const corroborated = buildManagerMail(exampleCaseReport('no-go-readings'));
    expect(corroborated.subject).toMatch(/^\[Gapsight\] NO-GO — KVP-MB-T2 \(Millbrook\): Independent methods agree/);
    expect(corroborated.text).toContain('Independent methods agree (capacitance, reactance, gas): level raised from investigate to critical');
    // The example result may be stored under rules revision 1 (no basis) or 2 (basis named).
    expect(corroborated.text).toMatch(/- leakage reactance: Phase B reactance shift vs baseline \+2\.3 % \(INVESTIGATE(, against own baseline)?\)/);
  });

  it('lists the data caveats: baseline age and source, sisters standing in, tap mismatch and unreliable items', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toContain('Baseline from 2009-03-18, 17 years old (factory or commissioning test).');
    const withSource = buildManagerMail({ ...recentEventReport(), baselineSource: 'factory test' });
    expect(withSource.text).toContain('Baseline from 2009-03-18, 17 years old (factory test).');

    const sisters = buildManagerMail(exampleCaseReport('sisters-no-baseline')).text;
    expect(sisters).toContain("No baseline of its own: sister units' median stands in");
    expect(sisters).toContain("Sisters' median stands in as the reference for: CH capacitance shift vs baseline");

    const d = recentEventReport();
    d.case = { ...d.case, postFault: { ...d.case.postFault, tapPosition: '11' } };
    d.result = { ...d.result, unreliable: ['reactance.A', 'reactance.B', 'reactance.C'] };
    const tap = buildManagerMail(d).text;
    expect(tap).toContain('Tap position differs: baseline 9b, post-fault 11');
    expect(tap).toContain('reactance phase B (unreliable: tap mismatch (baseline 9b, post-fault 11): repeat at tap 9b)');
  });

  it('lists every reason, the follow-ups, and a clearly labelled proposal of restrictions for a conditional', () => {
    const d = recentEventReport();
    const m = buildManagerMail(d);
    for (const r of d.result.reasons) expect(m.text).toContain(r);
    for (const f of d.result.followUps) expect(m.text).toContain(f);
    expect(m.text).toContain('PROPOSAL for your decision — not a decision');
    expect(m.text).toMatch(/reduced load/);
    expect(m.text).toMatch(/auto-reclosing blocked/);
  });

  it('carries every caution sentence verbatim (text and HTML), the testers with their e-mails, the link and the PDF line', () => {
    const d = recentEventReport();
    const m = buildManagerMail(d);
    expect(CAUTIONS).toHaveLength(5);
    for (const c of CAUTIONS) {
      expect(m.text).toContain(c);
      expect(m.html).toContain(escapeHtml(c));
    }
    for (const t of d.testers) {
      expect(m.text).toContain(`${t.name} <${t.email}>`);
      expect(m.html).toContain(escapeHtml(`${t.name} <${t.email}>`));
    }
    expect(m.text).toContain('http://localhost:5173/events/318');
    expect(m.html).toContain('href="http://localhost:5173/events/318"');
    expect(m.text).toContain('The PDF screening report is attached.');
    expect(m.html).toContain('The PDF screening report is attached.');
  });

  it('escapes every value in the HTML (a <script> in the unit serial stays text) and loads no external resource', () => {
    const d = recentEventReport();
    d.unit = { ...d.unit, serial: 'KVP-<script>alert(1)</script>' };
    d.site = { ...d.site, name: 'Harrow "Cross" & Co' };
    const m = buildManagerMail(d);
    expect(m.html).not.toContain('<script>');
    expect(m.html).toContain('KVP-&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(m.html).toContain('Harrow &quot;Cross&quot; &amp; Co');
    expect(m.html).not.toMatch(/<(img|link|script|iframe)\b/i);
    expect(m.html).not.toMatch(/src=|url\(/i);
    expect(m.text).toContain('KVP-<script>alert(1)</script>');
  });

  it('a no-go after an internal protection says internal fault suspected, in the subject and the body', () => {
    const d = internalFaultReport();
    const m = buildManagerMail(d);
    expect(m.subject).toBe(
      '[Gapsight] NO-GO — KVP-QL-T1 (Quarry Lane): Internal protection operated (differential, Buchholz trip): internal fault suspected',
    );
    expect(m.text).toContain('Internal fault suspected: internal protection operated (differential, Buchholz trip); the unit tripped.');
    expect(m.html.toLowerCase()).toContain('internal fault suspected');
    expect(m.text).toContain('NO-GO: hold: do not re-energise.');
    expect(m.text).toContain('Investigate as an internal fault (internal inspection) before re-energising');
    // The engine's reasons quote protection codes; the mail says them in words, as the screen does.
    expect(m.text).toContain('Why: Internal protection operated (differential, Buchholz trip): investigate as an internal fault');
    for (const code of ['buchholz-trip', 'buchholz-alarm', 'sudden-pressure', 'pressure-relief', 'restricted-earth-fault']) {
      expect(m.text).not.toContain(code);
      expect(m.html).not.toContain(code);
      expect(m.subject).not.toContain(code);
    }
  });

  it('is pure: the input is not changed and the same input gives the same mail', () => {
    const d = recentEventReport();
    const before = JSON.stringify(d);
    const a = buildManagerMail(d);
    const b = buildManagerMail(d);
    expect(JSON.stringify(d)).toBe(before);
    expect(a).toEqual(b);
  });

  it('marks a comparison run as not the basis of a decision', () => {
    const d = recentEventReport();
    d.screening = { ...d.screening, comparison: true, criteriaVersion: 2 };
    const m = buildManagerMail(d);
    expect(m.subject).toContain('Comparison run, not for decision');
    expect(m.text).toContain('not the basis of a decision');
  });
});

describe("manager's e-mail under rules revision 2", () => {
  it('tells the winding current, the factor and its basis: line current converted by the vector group, factor 1.732', () => {
    const m = buildManagerMail(deltaMeasuredReport());
    // 0.35 kA on the 66 kV side of 12 MVA = 3.33 × rated line current; × √3 (ground fault on the yn side, seen from the delta) = 5.77.
    expect(m.text).toContain('5.8 × rated winding current, 28 % of the design force (IEEE category III), the first such fault on record');
    expect(m.text).toContain('current measured on the HV side, fault on the LV side');
    expect(m.text).toContain('Winding current: line current converted by the vector group, factor 1.732.');
    expect(m.html).toContain(escapeHtml('Winding current: line current converted by the vector group, factor 1.732.'));
  });

  it('says when the current was given as winding current', () => {
    const d = deltaMeasuredReport();
    d.case = { ...d.case, fault: { ...d.case.fault!, currentIs: 'winding' } };
    d.result = { ...d.result, throughFault: { ...d.result.throughFault!, windingCurrentFactor: 1, currentBasis: 'winding' } };
    const text = buildManagerMail(d).text;
    expect(text).toContain('Winding current: given as winding current.');
    expect(text).not.toContain('converted by the vector group');
  });

  it('asks for the winding current or the relay record when it could not be derived (line-assumed)', () => {
    const m = buildManagerMail(lineAssumedReport());
    expect(m.text).toContain('8.3 × rated line current, taken as the winding current, 76 % of the design force');
    expect(m.text).toContain(
      'Winding current: line current used as it is — the winding current could not be derived; enter it or attach the relay record.',
    );
    expect(m.text).not.toContain('× rated winding current,');
  });

  it('tells thermal-region duty as time against the allowed time, never as a share of the mechanical K', () => {
    const m = buildManagerMail(thermalRegionReport());
    // 0.2 s + 0.15 s = 0.35 s; thermalDurationPercent 0.4072 → allowed 0.35 / 0.004072 = 85.9 s.
    expect(m.text).toContain('Thermal region (below the high-duty threshold): 0.35 s of the 85.9 s the curve allows (0.41 %), within the thermal curve');
    expect(m.text).not.toMatch(/of the mechanical limit|Event duty|% of K/);
    expect(m.text).not.toContain('3.3 %'); // eventDutyPercent 3.35 is not told in words
    expect(m.text).toContain('4.3 × rated winding current, 20 % of the design force (IEEE category IV) — below the high-duty threshold of 4.76 × rated');
  });

  it('keeps I²t against K for a high-duty event', () => {
    const text = buildManagerMail(deltaMeasuredReport()).text;
    expect(text).toContain('Event duty 4.4 % of the mechanical limit (I²t 10.3 of K = 236 (× rated)²·s), within the through-fault curve');
    expect(text).not.toContain('Thermal region');
  });

  it('gives the basis of each finding in words and marks low-confidence items with their note', () => {
    const m = buildManagerMail(doubtsReport());
    expect(m.text).toContain('CHL capacitance shift vs baseline +3.42 % (INVESTIGATE, against own baseline)');
    expect(m.text).toContain('CHL capacitance shift vs previous test +3.16 % (INVESTIGATE, against own previous test)');
    expect(m.text).toContain('Phase A turns ratio vs nameplate +0.62 % (WATCH, state (absolute value))');
    expect(m.text).toContain(
      'CHL power factor rise vs baseline +62 % (WATCH, against own baseline) — LOW CONFIDENCE: temperature correction uncertain (insulation 12 °C and 31 °C)',
    );
    expect(m.text).toContain('CHL capacitance modified z among sisters +8.57 (WATCH, state (absolute value))');
    expect(m.html).toContain(escapeHtml('(WATCH, against own baseline) — LOW CONFIDENCE: temperature correction uncertain'));
    expect(m.text).toContain('Basis: against own baseline / previous test = a change of this unit');
  });

  it('does not count state or low-confidence items as independent methods that agree', () => {
    const text = buildManagerMail(doubtsReport()).text;
    // Capacitance is a change; the turns ratio flag is a state (nameplate) item and the PF rise is low-confidence.
    expect(text).toContain('Only one independent method flags (capacitance)');
    expect(text).toContain('State and low-confidence items inform but do not count as agreement.');
    expect(text).not.toContain('Independent methods flag: capacitance, turns ratio');
  });

  it('lists every unreliable item with its repeat instruction (tap mismatch, remanence, implausible value), once', () => {
    const text = buildManagerMail(doubtsReport()).text;
    const outstanding = text.split('\n').find((l) => l.startsWith('Outstanding: '))!;
    expect(outstanding).toContain('reactance phase B (unreliable: tap mismatch (baseline at tap 9b, post-fault at 11): repeat at tap 9b)');
    expect(outstanding).toContain(
      'excitation current (unreliable: all phases moved the same way on a core not demagnetised (residual magnetism likely): demagnetise and repeat; take excitation and sweeps before DC tests)',
    );
    expect(outstanding).toContain('CL capacitance (unreliable: implausible against the reference — check the unit of measure and the connection)');
    expect(outstanding).toContain('sweep HV-B-short (unreliable: tap mismatch (baseline trace 9b, post-fault 11): repeat at tap 9b)');
    // Said once: the indicator notes that carry the same instruction are not repeated among the caveats.
    expect(count(text, 'post-fault at 11): repeat at tap 9b')).toBe(3);
    expect(text).toContain('Tap position differs: baseline 9b, post-fault 11');
  });

  it('names the criteria set and the rules revision the stored screening was computed with', () => {
    expect(buildManagerMail(thermalRegionReport()).text).toMatch(/Screened: .*, criteria set 2, rules revision 2\n/);
    const old = buildManagerMail(storedRevision1Report()).text;
    expect(old).toMatch(/Screened: .*, criteria set 1, rules revision 1 \(stored before rules revision 2\)\n/);
    expect(old).toContain('Stored result from rules revision 1 (criteria set 1, rules revision 1): currents are line currents');
    expect(old).toContain('9.0 × rated line current, 89 % of the design force');
    expect(old).toContain('Current: line current as measured — this result is from rules revision 1');
    expect(old).not.toContain('Basis: against own baseline'); // no basis recorded, so no legend
  });

  it('a unit that stayed in service and gets a no-go: "take out of service for tests", never "do not re-energise"', () => {
    const d = inServiceNoGoReport();
    const m = buildManagerMail(d);
    expect(m.subject).toBe(
      '[Gapsight] NO-GO, take out of service for tests — KVP-MB-T4 (Millbrook): CHL capacitance shifted +5.49 %…',
    );
    expect(m.text.split('\n').slice(0, 2).join('\n')).toContain('NO-GO: take out of service for tests.');
    expect(m.text).toContain('Take out of service for tests; return it to service only when the reasons above are cleared');
    expect(m.text).toContain('the unit stayed in service');
    for (const out of [m.subject, m.text, m.html]) {
      expect(out).not.toMatch(/do not re-?energi[sz]e/i);
      expect(out).not.toMatch(/\bhold\b/i);
    }
    for (const f of d.result.followUps) expect(m.text).toContain(f);
  });

  it('a conditional for a unit in service proposes to keep it in service with restrictions or take it out for tests', () => {
    const d = inServiceNoGoReport();
    d.result = { ...d.result, recommendation: 'conditional', overallLevel: 'investigate' };
    const m = buildManagerMail(d);
    expect(m.subject).toMatch(/^\[Gapsight\] CONDITIONAL \(in service\) — KVP-MB-T4/);
    expect(m.text).toContain('CONDITIONAL: keep in service only with restrictions and the follow-ups below, or take out of service for tests — your decision.');
    expect(m.text).toContain('If you keep the unit in service, keep it with restrictions, for example:');
    expect(m.text).not.toMatch(/re-?energi[sz]ing\.|after re-energising|If you release/);
  });

  it('a duty-only go says it rests on the duty figures alone, with no post-fault tests', () => {
    const m = buildManagerMail(dutyOnlyGoReport());
    expect(m.subject).toMatch(/^\[Gapsight\] GO \(in service\) — KVP-MB-T4 \(Millbrook\): /);
    expect(m.text).toContain('GO: may stay in service (with the follow-ups below) — this go rests on the duty figures alone, with no post-fault tests.');
    expect(m.text).toContain('Done: no post-fault tests yet.');
    expect(m.text).toContain('Outstanding: none required — the unit stayed in service and the fault was below the high-duty threshold (duty-only path).');
    expect(m.text).not.toMatch(/may be re-energised|required set is complete/);
    expect(m.text).toContain('Dissolved-gas sample now (the unit stayed in service)');
  });

  it('an in-service go with a post-fault oil sample does not claim to rest on the duty figures alone', () => {
    const d = dutyOnlyGoReport();
    d.case = { ...d.case, postFault: { takenAt: '2026-11-13', dissolvedGasPPM: { H2: 14, CH4: 7, C2H6: 4, C2H4: 2, C2H2: 0, CO: 190, CO2: 1540 } } };
    // As the engine words it with a post-fault set: "the duty figures and the readings given".
    d.result = {
      ...d.result,
      reasons: [
        'Unit stayed in service and the fault was not high duty (3.5 × rated winding current, 0.18 s of the 176 s the thermal curve allows): the recommendation rests on the duty figures and the readings given; dissolved-gas samples now and again at 24 h',
        'No indicator at watch or above',
      ],
    };
    const m = buildManagerMail(d);
    expect(m.text).toContain('GO: may stay in service (with the follow-ups below).');
    expect(m.text).toContain('Done: dissolved gases (oil sample).');
    for (const out of [m.subject, m.text, m.html]) expect(out).not.toContain('duty figures alone');
  });

  it('an older stored result of a unit in service: follow-ups counted from the event, not from a re-energising', () => {
    const text = buildManagerMail(storedRevision1InServiceReport()).text;
    expect(text).toContain('Dissolved-gas sample 24 h after re-energising'); // the stored follow-up, unchanged
    expect(text).toContain('The unit stayed in service: count these from the event (2026-11-12), not from a later switching — the first oil sample is due now.');
    expect(text).toContain('GO: may stay in service');
    expect(text).not.toContain('may be re-energised');
    // A revision-2 result that counts from the event needs no such note.
    expect(buildManagerMail(dutyOnlyGoReport()).text).not.toContain('count these from the event');
  });

  it('prints all five cautions verbatim, once each, for a stored revision-1 result (three stored) and a revision-2 one', () => {
    expect(storedRevision1Report().result.cautions).toHaveLength(3);
    for (const d of [storedRevision1Report(), thermalRegionReport(), inServiceNoGoReport()]) {
      const m = buildManagerMail(d);
      for (const c of CAUTIONS) {
        expect(count(m.text, c)).toBe(1);
        expect(count(m.html, escapeHtml(c))).toBe(1);
      }
    }
    expect(buildManagerMail(storedRevision1Report()).text).toContain('A go cannot rule out deformation that the tests taken cannot see.');
  });
});

describe('decision e-mail words', () => {
  it("gives the screening's reason with protections in words and keeps the cautions", () => {
    const m = buildDecisionMail(internalFaultReport(), {
      outcome: 'hold',
      restrictions: null,
      reason: 'Internal inspection first',
      againstRecommendation: false,
      signedAt: '2026-08-17T09:00:00.000Z',
      signedBy: { name: 'Morgan Manager', email: 'manager@kestrel-valley.example' },
    });
    expect(m.text).toContain("Screening's reason: Internal protection operated (differential, Buchholz trip): investigate as an internal fault");
    expect(m.text).not.toContain('buchholz-trip');
    for (const c of CAUTIONS) expect(m.text).toContain(c);
  });

  it('heads the mail with the same headline as the verdict banner and the PDF (screeningHeadline), reason included', () => {
    for (const d of [recentEventReport(), internalFaultReport(), inServiceNoGoReport(), dutyOnlyGoReport()]) {
      const h = screeningHeadline({ result: d.result, unit: d.unit, siteName: d.site.name, inService: d.event.transformerTripped === false });
      const m = buildManagerMail(d);
      const [first, , third] = m.text.split('\n');
      expect(first).toBe(h.title);
      expect(third).toBe(`Why: ${h.reason}`);
      expect(m.subject).toContain(`${h.headWord} — ${d.unit.serial} (${d.site.name}): `);
    }
    // The in-service no-go reads as the banner does, not "do not re-energise".
    expect(buildManagerMail(inServiceNoGoReport()).text.split('\n')[0]).toMatch(/^NO-GO, take out of service for tests — /);
  });

  it('names the post-fault session by its time and, with one tester on the event, by who took it', () => {
    const d = { ...recentEventReport(), testers: [{ name: 'Priya Natarajan', email: 'priya.natarajan@kestrel-valley.example' }] };
    expect(buildManagerMail(d).text).toContain('Post-fault tests: Tests of 29 Nov 2026 12:12 by Priya Natarajan (2026-11-29 12:12 +00:00 Europe/London)');
    // Two testers on the event: the mail cannot tell who took this session, so it names none.
    expect(buildManagerMail(recentEventReport()).text).not.toMatch(/Post-fault tests: Tests of [^(]* by /);
  });

  it('says a sweep without a baseline trace is not judged (no baseline trace to compare with), not missing', () => {
    const d = recentEventReport();
    d.result = { ...d.result, missing: ['sweep.hv.B.no-baseline', 'dissolvedGasPPM'], unreliable: [] };
    const text = buildManagerMail(d).text;
    expect(text).toContain('Outstanding: sweep of HV phase B (no baseline trace to compare with), not judged; dissolved gases (missing).');
    expect(text).not.toContain('no-baseline');
  });
});
