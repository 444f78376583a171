import { describe, expect, it } from 'vitest';
import { userPatchSchema } from '../../shared/schemas/auth.js';
import {
  designBodySchema,
  designPatchSchema,
  eventPatchSchema,
  sessionPatchSchema,
  sitePatchSchema,
  unitBodySchema,
  unitPatchSchema,
} from '../../shared/schemas/fleet.js';

// A PATCH body keeps only the fields sent: no create default may appear in the parsed patch (zod's `.partial()` on a
// field with `.default()` still fills the default, which is how a one-field change reset other fields).

const PATCHES = { sitePatchSchema, designPatchSchema, unitPatchSchema, eventPatchSchema, sessionPatchSchema } as const;

describe('patch schemas', () => {
  it.each(Object.entries(PATCHES))('%s parses {} to {}', (_, schema) => {
    expect(schema.parse({})).toEqual({});
  });

  it('parse a one-field body to exactly that field', () => {
    expect(unitPatchSchema.parse({ year: 2004 })).toEqual({ year: 2004 });
    expect(designPatchSchema.parse({ maker: 'Other Works' })).toEqual({ maker: 'Other Works' });
    expect(sitePatchSchema.parse({ name: 'Harrow' })).toEqual({ name: 'Harrow' });
    expect(eventPatchSchema.parse({ notes: 'x' })).toEqual({ notes: 'x' });
    expect(sessionPatchSchema.parse({ humidityPercent: 55 })).toEqual({ humidityPercent: 55 });
    // The person patch refuses an empty change, and adds nothing to a one-field one.
    expect(userPatchSchema.safeParse({}).success).toBe(false);
    expect(userPatchSchema.parse({ active: false })).toEqual({ active: false });
  });

  it('check a field sent as on create, with the error naming the field', () => {
    const unit = unitPatchSchema.safeParse({ systemImpedancePercent: 101 });
    expect(unit.success).toBe(false);
    expect(unit.error?.issues[0].path).toEqual(['systemImpedancePercent']);
    const design = designPatchSchema.safeParse({ requiredCapacitance: ['C-H'] });
    expect(design.success).toBe(false);
    expect(design.error?.issues[0]).toMatchObject({ path: ['requiredCapacitance', 0], message: 'letters only, e.g. CHL' });
    expect(designPatchSchema.safeParse({ windings: 'five-winding' }).error?.issues[0].path).toEqual(['windings']);
  });

  it('leave the create schemas their defaults', () => {
    const design = designBodySchema.parse({
      reference: 'D-1',
      maker: 'Works',
      vectorGroup: 'YNd1',
      hvKV: 132,
      lvKV: 33,
      coolingStages: [{ stage: 'ONAN', kVA: 40000 }],
      impedancePercent: 10.5,
      impedanceBaseKVA: 40000,
    });
    expect(design).toMatchObject({ windings: 'two-winding', phases: 3, conductor: 'Cu', requiredCapacitance: [] });
    expect(unitBodySchema.parse({ serial: 'T-1', siteId: 1, designId: 2 })).toEqual({ serial: 'T-1', siteId: 1, designId: 2, position: '', systemImpedancePercent: 0 });
  });
});
