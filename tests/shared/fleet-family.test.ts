// A design family compared on one quantity: the worked values of references.md, and the same numbers as the engine's
// sister indicators for a case built from a family.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { caseSisterComparisons, compareFamily, familyQuantities, familyQuantity, memberQuantities, outliersFirst, type FamilyMember } from '../../shared/fleet/family.js';
import { parseCase } from '../../shared/schemas/case.js';
import { criteriaV2, screenCase, sisterIndicators, sisterQuantities } from '../../shared/screening/index.js';

const UNIT = { hvKV: 132, ratedKVA: 40000 };
// The computed sample of references.md "Outliers among sister units" (worked from the published formula of Iglewicz &
// Hoaglin 1993; not a sample the NIST/SEMATECH e-Handbook prints), as the CHL capacitance of six units.
const SAMPLE = [8.02, 8.05, 7.98, 8.01, 8.04, 8.6];
const sampleFamily = (): FamilyMember[] => SAMPLE.map((v, i) => ({ unitId: i + 1, serial: `U${i + 1}`, values: { capacitancePF: { CHL: v } }, unit: UNIT }));

describe('compareFamily', () => {
  it('gives median 8.03, MAD 0.02 and M(8.60) = 19.22 for the sample of references.md, and flags that unit alone', () => {
    const f = compareFamily(sampleFamily(), 'capacitance.CHL', criteriaV2);
    expect(f.median).toBeCloseTo(8.03, 12); // references.md
    expect(f.mad).toBeCloseTo(0.02, 12); // references.md
    const outlier = f.items.find((i) => i.serial === 'U6')!;
    expect(outlier.modifiedZ).toBeCloseTo(19.22, 2); // references.md: M = 0.6745·(8.60 − 8.03)/0.02
    expect(outlier.outlier).toBe(true); // |M| > 3.5 (references.md)
    // U1 8.02: M = 0.6745·(8.02 − 8.03)/0.02 = −0.33725 (hand computation with the same formula)
    expect(f.items[0].modifiedZ).toBeCloseTo(-0.33725, 9);
    expect(f.items.filter((i) => i.outlier).map((i) => i.serial)).toEqual(['U6']);
    // deviation from the median: 100·(8.60 − 8.03)/8.03 = 7.0984 % (hand computation)
    expect(outlier.deviationFromMedianPercent).toBeCloseTo(7.0984, 3);
    expect(f.limit).toBe(3.5);
    expect(f.constant).toBe(0.6745);
    expect(f.note).toBeNull();
  });

  it('gives no modified z when a unit would have fewer sisters than the criteria require, and says why', () => {
    const f = compareFamily(sampleFamily().slice(0, 5), 'capacitance.CHL', criteriaV2); // 4 sisters < minSistersModifiedZ 5
    expect(f.items.every((i) => i.modifiedZ === null && !i.outlier)).toBe(true);
    expect(f.note).toMatch(/at least 5 sisters/);
    expect(f.median).toBeCloseTo(8.02, 12); // median of the first five sample values (hand computation)
  });

  it('leaves out units that lack the value and refuses a name that is not a family quantity', () => {
    const members = sampleFamily();
    members.push({ serial: 'U7', values: { capacitancePF: { CH: 3000 } }, unit: UNIT });
    const f = compareFamily(members, 'capacitance.CHL', criteriaV2);
    expect(f.items.map((i) => i.serial)).toEqual(['U1', 'U2', 'U3', 'U4', 'U5', 'U6']);
    expect(() => compareFamily(members, 'gas.H2', criteriaV2)).toThrow(/not a family quantity/);
    expect(familyQuantity('capacitance.CHL')).toMatchObject({ label: 'CHL capacitance', unit: 'pF' });
    expect(familyQuantity('reactance.A')).toMatchObject({ label: 'Phase A leakage reactance', unit: '%' });
    expect(familyQuantity('capacitance')).toBeNull();
  });

  it('lists capacitance configurations, then reactance phases, and puts outliers first', () => {
    const members: FamilyMember[] = [
      { serial: 'A', values: { reactance: { B: { percent: 10 } }, capacitancePF: { CL: 1 } }, unit: UNIT },
      { serial: 'B', values: { reactance: { A: { percent: 10 } }, capacitancePF: { CH: 1 } }, unit: UNIT },
    ];
    expect(familyQuantities(members).map((q) => q.name)).toEqual(['capacitance.CH', 'capacitance.CL', 'reactance.A', 'reactance.B']);
    const sorted = outliersFirst(compareFamily(sampleFamily(), 'capacitance.CHL', criteriaV2).items);
    expect(sorted[0].serial).toBe('U6');
  });

  it("gives %X per phase as the engine's sisterQuantities does (volts/amps through reactancePercent)", () => {
    const values = { reactance: { A: { volts: 2000, amps: 40, watts: 5000 }, B: { percent: 10.4 } } };
    const c = parseCase(JSON.parse(readFileSync('examples/demo/recent-event.case.json', 'utf8')));
    if (!c.ok) throw new Error('example case does not parse');
    const engine = sisterQuantities({ ...c.value, postFault: values, sisters: [] });
    const ours = memberQuantities(values, c.value.unit);
    expect(engine.map((q) => [q.name, q.value])).toEqual([...ours.entries()]);
  });
});

describe('caseSisterComparisons on a case built from a family', () => {
  // examples/demo/recent-event.case.json: the case export of the seeded demo family's recent event (eight sister units
  // of one 40 MVA 132/33 kV design), and its screening.
  const parsed = parseCase(JSON.parse(readFileSync('examples/demo/recent-event.case.json', 'utf8')));
  if (!parsed.ok) throw new Error('example case does not parse');
  const c = parsed.value;

  it("gives this unit the engine's sisters.capacitance.CHL.modifiedZ value, and so for every sister quantity", () => {
    const comparisons = caseSisterComparisons(c, criteriaV2);
    const engine = new Map(sisterIndicators(c, criteriaV2).map((i) => [i.key, i]));
    const chl = comparisons.find((f) => f.quantity.name === 'capacitance.CHL')!;
    const mine = chl.items.find((i) => i.isThisUnit)!;
    expect(mine.serial).toBe(c.unit.serial);
    expect(mine.modifiedZ).toBe(engine.get('sisters.capacitance.CHL.modifiedZ')!.value);
    expect(chl.items).toHaveLength(c.sisters!.length + 1);
    for (const f of comparisons) {
      const key = `sisters.${f.quantity.name}.modifiedZ`;
      expect(f.items.find((i) => i.isThisUnit)!.modifiedZ, key).toBe(engine.get(key)?.value);
    }
    // and the stored screening of that case says the same
    const stored = screenCase(c).indicators.find((i) => i.key === 'sisters.capacitance.CHL.modifiedZ')!;
    expect(mine.modifiedZ).toBe(stored.value);
    expect(mine.outlier).toBe(stored.level !== 'ok');
  });

  it('is empty for a case without sisters', () => {
    expect(caseSisterComparisons({ ...c, sisters: undefined }, criteriaV2)).toEqual([]);
  });
});
