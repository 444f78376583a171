// The event's audit trail reads as sentences: who did what, with the outcome and the reason; the count in words.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it } from 'vitest';
import { nextTick } from 'vue';
import type { EventDetail } from '../../../src/api/events';
import EventAuditTrail from '../../../src/components/event/EventAuditTrail.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { auditSentence, type AuditEntryFacts } from '../../../shared/audit-words';
import { resetClientState } from '../helpers';

const people: Record<number, string> = { 2: 'Pat Protection', 4: 'Morgan Manager' };
const ctx = { timeZone: 'Europe/London', person: (id: number) => people[id] };

/** Rows as the server answers them: the stored entry and its sentence. */
function row(id: number, at: string, e: AuditEntryFacts): EventDetail['audit'][number] {
  return { id, at, userId: e.userId, action: e.action, entity: e.entity, entityId: e.entityId, before: e.before ?? null, after: e.after ?? null, highlighted: e.highlighted ?? false, note: e.note ?? null, summary: auditSentence(e, ctx) };
}

const corrected = row(1, '2026-11-28T04:00:00.000Z', {
  userId: 2,
  action: 'update',
  entity: 'fault_event',
  entityId: '4',
  before: { faultedPhases: 'A', protectionOperated: ['differential'] },
  after: { faultedPhases: 'AB', protectionOperated: ['differential', 'buchholz-trip'] },
  note: 'Fault corrected',
});
const signed = row(2, '2026-11-29T12:30:00.000Z', {
  userId: 4,
  action: 'decide',
  entity: 'fault_event',
  entityId: '4',
  highlighted: true,
  note: 'against the go recommendation',
  after: { outcome: 'hold', restrictions: null, reason: 'Gas rising on the last two samples', againstRecommendation: true, recommendation: 'go' },
});

async function render(audit: EventDetail['audit']) {
  const w = mount(EventAuditTrail, {
    props: { eventId: 4, audit, zone: 'Europe/London' },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
  await w.find('.q-expansion-item .q-item').trigger('click');
  await nextTick();
  return w;
}

describe('EventAuditTrail', () => {
  afterEach(() => {
    resetClientState();
  });

  it('counts the entries in words', async () => {
    expect((await render([corrected])).text()).toContain('1 entry');
    resetClientState();
    expect((await render([corrected, signed])).text()).toContain('2 entries');
    resetClientState();
    expect((await render([])).text()).toContain('no entries');
  });

  it('shows each entry as a sentence with the person, the action, the outcome and the reason, without code names', async () => {
    const w = await render([corrected, signed]);
    const rows = w.findAll('[data-test="audit-summary"]').map((c) => c.text());
    expect(rows).toEqual([
      'Pat Protection corrected the fault: faulted phases A → AB; protections operated differential → differential, Buchholz trip.',
      'Morgan Manager signed: hold — reason: “Gas rising on the last two samples” — against the go recommendation.',
    ]);
    const text = w.text();
    for (const code of ['buchholz-trip', 'fault_event', 'faultedPhases', 'protectionOperated', 'update', 'decide']) expect(text).not.toContain(code);
    // The time on the site's clock: 04:00 UTC on 28 Nov is 04:00 in London (GMT).
    expect(w.findAll('[data-test="audit-row"]')[0].text()).toContain('2026-11-28 04:00');
  });

  it('marks a decision against the recommendation once', async () => {
    const w = await render([corrected, signed]);
    const [first, second] = w.findAll('[data-test="audit-row"]');
    expect(first.classes()).not.toContain('audit-trail--highlighted');
    expect(second.classes()).toContain('audit-trail--highlighted');
    expect(second.text().match(/against the/g)).toHaveLength(1);
  });
});
