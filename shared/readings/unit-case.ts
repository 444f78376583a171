// A unit record (with its design) as the case format's unit block: the one mapping the server's case export, the
// session form's references and the duty figures use. No schema library: the client loads it with any page.
import type { Unit } from '../schemas/case.js';
import { CONDUCTORS, WINDINGS, type Conductor, type Windings } from '../schemas/enums.js';

/** What a unit record holds for the case: its nameplate and its design's vector group, windings and capacitances. */
export interface UnitRecord {
  serial: string;
  phases: 1 | 3;
  ratedKVA: number;
  hvKV: number;
  lvKV: number;
  impedancePercent: number;
  systemImpedancePercent?: number | null;
  conductor?: string | null;
  design?: { vectorGroup?: string | null; windings?: string | null; requiredCapacitance?: readonly string[] | null } | null;
}

/** The case unit of a unit record; optional fields only when the record has them (and they are case values). */
export function unitToCase(u: UnitRecord): Unit {
  const d = u.design ?? null;
  const windings = (WINDINGS as readonly string[]).includes(d?.windings ?? '') ? (d!.windings as Windings) : null;
  const conductor = (CONDUCTORS as readonly string[]).includes(u.conductor ?? '') ? (u.conductor as Conductor) : null;
  return {
    serial: u.serial,
    phases: u.phases,
    ratedKVA: u.ratedKVA,
    hvKV: u.hvKV,
    lvKV: u.lvKV,
    impedancePercent: u.impedancePercent,
    ...(u.systemImpedancePercent != null ? { systemImpedancePercent: u.systemImpedancePercent } : {}),
    ...(windings ? { windings } : {}),
    ...(d?.vectorGroup ? { vectorGroup: d.vectorGroup } : {}),
    ...(conductor ? { conductor } : {}),
    ...(d?.requiredCapacitance?.length ? { requiredCapacitance: [...d.requiredCapacitance] } : {}),
  };
}
