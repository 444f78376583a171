import { In } from 'typeorm';
import { it } from 'vitest';
import { screenCase, criteriaV1 } from '../../../shared/screening/index.js';
import { seedDemo } from '../../../server/db/seed/demo-seed.js';
import { buildEventCase } from '../../../server/features/events/case-export.service.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Screening } from '../../../server/features/screenings/screening.entity.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { openTestEnv } from '../../helpers/db.js';
it('debug', async () => {
  const env = await openTestEnv();
  const q0 = await env.db.query("SHOW GLOBAL STATUS LIKE 'Questions'");
  const t0 = Date.now();
  console.log('seeded', await seedDemo(env.db), Date.now() - t0, 'ms');
  const q1 = await env.db.query("SHOW GLOBAL STATUS LIKE 'Questions'");
  console.log('queries', q1[0].Value - q0[0].Value);
  const { seedScenario } = await import('../../../server/db/seed/demo-scenario.js');
  for (let k = 0; k < 2; k++) {
    const t1 = Date.now();
    await env.db.transaction(async (m) => {
      const { User } = await import('../../../server/features/users/user.entity.js');
      const u = await m.getRepository(User).findOneByOrFail({ email: 'admin@kestrel-valley.example' });
      await m.query('DELETE FROM site WHERE 1=0');
      const t2 = Date.now();
      try { await seedScenario(m, { admin: u.id, protection: u.id, tester: u.id, manager: u.id, engineer: u.id }, new Date()); } catch (e) { console.log('expected dup', String(e).slice(0, 80), Date.now() - t2); }
    }).catch(() => {});
    console.log('again', Date.now() - t1);
  }
  const units = await env.db.getRepository(Unit).find({ where: { serial: In(['KVP-HX-T2', 'KVP-MB-T1']) } });
  const evs = await env.db.getRepository(FaultEvent).find({ where: { unitId: In(units.map((u) => u.id)) }, order: { occurredAt: 'ASC' } });
  for (const e of evs) {
    console.log('EVENT', e.id, e.unitId, e.occurredAt.toISOString(), e.status, e.createdAt.toISOString(), e.updatedAt.toISOString());
    const ss = await env.db.getRepository(Screening).find({ where: { eventId: e.id } });
    for (const s of ss) {
      const r = s.result as any;
      console.log('  SCREENING', s.recommendation, s.computedAt.toISOString(), JSON.stringify(r.reasons, null, 1), r.missing, r.followUps);
      console.log('   ', r.indicators.filter((i: any) => i.level !== 'ok').map((i: any) => `${i.key}=${typeof i.value === 'number' ? i.value.toFixed(3) : i.value}:${i.level}`).join('\n    '));
      console.log('   tf', JSON.stringify(r.throughFault));
    }
    if (e.status === 'testing') {
      const c = await buildEventCase(env.db.manager, e.id);
      const r = screenCase(c, criteriaV1);
      console.log('  LIVE', r.recommendation, JSON.stringify(r.reasons, null, 1), r.missing, r.followUps);
      console.log('   ', r.indicators.filter((i: any) => i.level !== 'ok').map((i: any) => `${i.key}=${typeof i.value === 'number' ? i.value.toFixed(3) : i.value}:${i.level}`).join('\n    '));
      console.log('   ', r.indicators.filter((i: any) => /reactance|excitation|resistance|ratio|gas|powerFactor|sweep.*(class|rLF|rMF|rHF)/.test(i.key)).map((i: any) => `${i.key}=${typeof i.value === 'number' ? i.value.toFixed(3) : i.value}:${i.level}`).join('\n    '));
      console.log('   tf', JSON.stringify(r.throughFault));
      console.log(JSON.stringify(c).length, 'case bytes');
    }
    const au = await env.db.getRepository(AuditEntry).find({ where: { entity: 'fault_event', entityId: String(e.id) }, order: { id: 'ASC' } });
    console.log('  AUDIT', au.map((a) => `${a.at.toISOString()} ${a.userId} ${JSON.stringify(a.after).slice(0, 40)} ${a.note ?? ''}`).join('\n   '));
  }
  await env.db.destroy();
});
