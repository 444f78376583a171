// The verdict banner reads the same headline as the PDF and the manager's mail (shared/screening/headline.ts).
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { describe, expect, it } from 'vitest';
import ScreeningVerdictBanner from '../../../src/components/screening/ScreeningVerdictBanner.vue';
import { screeningHeadline } from '../../../shared/screening/headline';
import { screeningResult, storedScreening } from '../pages/fixtures';

function banner(inService: boolean, reasons: string[]) {
  const screening = storedScreening({ recommendation: 'no-go', result: screeningResult({ recommendation: 'no-go', overallLevel: 'critical', reasons }) });
  const unit = { serial: 'KVP-HX-T2', position: 'T2' };
  const wrapper = mount(ScreeningVerdictBanner, {
    props: { screening, zone: { timeZone: 'Europe/London', locale: 'en-GB' }, computedBy: 'Theo Tester', unit, siteName: 'Harrow Cross', inService },
    global: { plugins: [Quasar] },
  });
  return { wrapper, expected: screeningHeadline({ result: screening.result, unit, siteName: 'Harrow Cross', inService }) };
}

describe('verdict banner', () => {
  it('shows the headline and the decisive reason the PDF and the mail print, protections in words', () => {
    const { wrapper, expected } = banner(false, ['Internal protection operated (differential, buchholz-trip): do not re-energise before internal inspection.']);
    expect(wrapper.get('[data-test="verdict-headline"]').text()).toBe(expected.title);
    expect(expected.title).toBe('NO-GO — KVP-HX-T2 (Harrow Cross, T2)');
    expect(wrapper.get('[data-test="verdict-reason"]').text()).toBe(expected.reason);
    expect(wrapper.text()).toContain('Buchholz trip');
    expect(wrapper.text()).not.toContain('buchholz-trip');
  });

  it('says "take out of service for tests" for a unit that stayed in service, as the PDF does', () => {
    const { wrapper } = banner(true, ['Reactance phase A shifted beyond the critical band.']);
    expect(wrapper.get('[data-test="verdict-headline"]').text()).toBe('NO-GO, take out of service for tests — KVP-HX-T2 (Harrow Cross, T2)');
  });

  it("writes the computed time in the site's date format", () => {
    const { wrapper } = banner(false, ['x']);
    expect(wrapper.get('[data-test="verdict-meta"]').text()).toMatch(/\d{2}\/\d{2}\/\d{4}, \d{2}:\d{2} [+−]\d{2}:\d{2} Europe\/London/);
  });
});
