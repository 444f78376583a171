import { describe, expect, it } from 'vitest';
import { unitToCase } from '../../../shared/readings/unit-case';

describe('unitToCase', () => {
  it('takes the nameplate from the unit and the vector group, windings and required capacitances from its design', () => {
    expect(
      unitToCase({
        serial: 'KVP-HX-T2',
        phases: 3,
        ratedKVA: 40000,
        hvKV: 132,
        lvKV: 33,
        impedancePercent: 12.5,
        systemImpedancePercent: 0.4,
        conductor: 'Cu',
        design: { vectorGroup: 'Dyn11', windings: 'two-winding', requiredCapacitance: ['CH', 'CL', 'CHL'] },
      }),
    ).toEqual({
      serial: 'KVP-HX-T2',
      phases: 3,
      ratedKVA: 40000,
      hvKV: 132,
      lvKV: 33,
      impedancePercent: 12.5,
      systemImpedancePercent: 0.4,
      windings: 'two-winding',
      vectorGroup: 'Dyn11',
      conductor: 'Cu',
      requiredCapacitance: ['CH', 'CL', 'CHL'],
    });
  });

  it('leaves out what the record does not have or what is not a case value (no design, an unknown windings word, no capacitances)', () => {
    const bare = { serial: 'S1', phases: 1 as const, ratedKVA: 500, hvKV: 11, lvKV: 0.4, impedancePercent: 4 };
    expect(unitToCase(bare)).toEqual(bare);
    expect(unitToCase({ ...bare, conductor: 'steel', design: { vectorGroup: '', windings: 'five-winding', requiredCapacitance: [] } })).toEqual(bare);
  });
});
