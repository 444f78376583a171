import { describe, expect, it } from 'vitest';
import { buildManagerMail, escapeHtml } from '../../../server/reports/manager-mail.js';
import { CAUTIONS } from '../../../shared/screening/verdict.js';
import { exampleCaseReport, internalFaultReport, recentEventReport } from './report-fixtures.js';

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
    const words = '9.0 × rated, 89 % of the design force (IEEE category IV), the 2nd such fault since 2024';
    expect(m.text).toContain(words);
    expect(m.html).toContain(escapeHtml(words));
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
    expect(m.text).toContain('Fault: 2026-11-28 03:12 Europe/London (UTC+00:00)');
    expect(m.text).toContain('Post-fault tests: 2026-11-29 12:12 Europe/London (UTC+00:00)');
    const summer = internalFaultReport(); // 2026-08-17T05:02:00Z
    expect(buildManagerMail(summer).text).toContain('Fault: 2026-08-17 06:02 Europe/London (UTC+01:00)');
    const sydney = { ...recentEventReport(), site: { name: 'Harrow Cross', timeZone: 'Australia/Sydney' } };
    expect(buildManagerMail(sydney).text).toContain('Fault: 2026-11-28 14:12 Australia/Sydney (UTC+11:00)');
  });

  it('names the tests done and outstanding in words', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toMatch(/Done: capacitance \(CH, CL, CHL\);.*leakage reactance \(A, B, C\);.*dissolved gases/);
    expect(m.text).toContain('frequency-response sweep (4 traces: HV-A-open, HV-B-open, HV-B-short, HV-C-open)');
    expect(m.text).toContain('Outstanding: none');

    const d = recentEventReport();
    d.result = { ...d.result, missing: ['sweep', 'dissolvedGasPPM'], unreliable: ['reactance.B'] };
    const text = buildManagerMail(d).text;
    expect(text).toContain('Outstanding: sweep (missing); dissolved gases (missing); reactance phase B (unreliable: repeat)');
  });

  it('says where independent methods agree (flagged indicators by method) and repeats the corroboration reason', () => {
    const m = buildManagerMail(recentEventReport());
    expect(m.text).toContain('- capacitance: CHL capacitance shift vs baseline +3.42 % (INVESTIGATE); CHL capacitance shift vs previous test +3.16 % (INVESTIGATE)');
    expect(m.text).toContain('Only one independent method flags (capacitance)');

    const corroborated = buildManagerMail(exampleCaseReport('no-go-readings'));
    expect(corroborated.subject).toMatch(/^\[Gapsight\] NO-GO — KVP-MB-T2 \(Millbrook\): Independent methods agree/);
    expect(corroborated.text).toContain('Independent methods agree (capacitance, reactance, gas): level raised from investigate to critical');
    expect(corroborated.text).toContain('- leakage reactance: Phase B reactance shift vs baseline +2.3 % (INVESTIGATE)');
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
    expect(tap).toContain('reactance phase B: unreliable — treated as missing; repeat the test.');
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
    expect(d.result.cautions).toEqual([...CAUTIONS]);
    for (const c of d.result.cautions) {
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
