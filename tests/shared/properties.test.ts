// Property tests of the shift indicators (fast-check).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { GapsightCase } from '../../shared/schemas/case.js';
import { screenCase } from '../../shared/screening/index.js';
import { cleanCase, edit } from './case-builder.js';

const value = (c: GapsightCase, key: string) => screenCase(c).indicators.find((i) => i.key === key)!.value as number;
const readings = fc.record({
  base: fc.double({ min: 100, max: 20000, noNaN: true }),
  post: fc.double({ min: 100, max: 20000, noNaN: true }),
  baseX: fc.double({ min: 3, max: 20, noNaN: true }),
  postX: fc.double({ min: 3, max: 20, noNaN: true }),
});
const build = (r: { base: number; post: number; baseX: number; postX: number }) =>
  edit(cleanCase(), (d) => {
    d.baseline!.capacitancePF!.CHL = r.base;
    d.postFault!.capacitancePF!.CHL = r.post;
    d.baseline!.reactance!.A = { percent: r.baseX };
    d.postFault!.reactance!.A = { percent: r.postX };
  });

describe('shift properties', () => {
  it('gives any capacitance and reactance shift as 100·(post − baseline)/baseline (case-format.md, indicator table)', () => {
    fc.assert(
      fc.property(readings, (r) => {
        const c = build(r);
        expect(value(c, 'capacitance.CHL.shiftPercent')).toBeCloseTo((100 * (r.post - r.base)) / r.base, 6);
        expect(value(c, 'reactance.A.shiftPercent')).toBeCloseTo((100 * (r.postX - r.baseX)) / r.baseX, 6);
      }),
    );
  });

  it('leaves every shift unchanged when every reading of both sets is scaled by one factor', () => {
    fc.assert(
      fc.property(readings, fc.double({ min: 0.01, max: 100, noNaN: true }), (r, k) => {
        const plain = build(r);
        const scaled = build({ base: r.base * k, post: r.post * k, baseX: r.baseX * k, postX: r.postX * k });
        for (const key of ['capacitance.CHL.shiftPercent', 'reactance.A.shiftPercent']) {
          const a = value(plain, key);
          const b = value(scaled, key);
          expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(a)));
        }
      }),
    );
  });

  it('flips the sign of a shift when baseline and post-fault are swapped', () => {
    fc.assert(
      fc.property(readings, (r) => {
        const forward = value(build(r), 'capacitance.CHL.shiftPercent');
        const back = value(build({ base: r.post, post: r.base, baseX: r.postX, postX: r.baseX }), 'capacitance.CHL.shiftPercent');
        if (forward === 0) expect(back).toBe(0);
        else expect(Math.sign(back)).toBe(-Math.sign(forward));
      }),
    );
  });

  it('gives, for small shifts, a swapped shift equal to minus the shift to first order', () => {
    fc.assert(
      fc.property(fc.double({ min: 100, max: 20000, noNaN: true }), fc.double({ min: -0.01, max: 0.01, noNaN: true }), (base, rel) => {
        const post = base * (1 + rel);
        const forward = value(build({ base, post, baseX: 10, postX: 10 }), 'capacitance.CHL.shiftPercent');
        const back = value(build({ base: post, post: base, baseX: 10, postX: 10 }), 'capacitance.CHL.shiftPercent');
        expect(Math.abs(forward + back)).toBeLessThanOrEqual(Math.abs(forward) * 0.011 + 1e-12);
      }),
    );
  });
});
