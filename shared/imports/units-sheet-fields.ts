// The columns of a fleet spreadsheet (units import and fleet export). A leaf module: no imports, so the fleet page and
// the import dialog can use it without pulling the parsers or zod into their chunks.

/** The unit fields a spreadsheet row can carry, in the order the preview and the export show them. */
export const UNIT_SHEET_FIELDS = [
  'serial',
  'position',
  'site',
  'design',
  'year',
  'phases',
  'hvKV',
  'lvKV',
  'ratedKVA',
  'impedancePercent',
  'systemImpedancePercent',
  'conductor',
] as const;
export type UnitSheetField = (typeof UNIT_SHEET_FIELDS)[number];

/** Fields every row must have; the others default from the unit's design (system impedance from 0). */
export const UNIT_SHEET_REQUIRED: readonly UnitSheetField[] = ['serial', 'site', 'design'];

/** Words for the fields on screen. */
export const UNIT_SHEET_FIELD_LABELS: Record<UnitSheetField, string> = {
  serial: 'Serial',
  position: 'Position',
  site: 'Site (name)',
  design: 'Design (reference)',
  year: 'Year of manufacture',
  phases: 'Phases',
  hvKV: 'HV (kV)',
  lvKV: 'LV (kV)',
  ratedKVA: 'Rating (kVA)',
  impedancePercent: 'Impedance (%)',
  systemImpedancePercent: 'System impedance (%)',
  conductor: 'Conductor (Cu or Al)',
};

/** Most units one import takes, and most rows one fleet export writes. */
export const UNIT_IMPORT_ROW_LIMIT = 5000;
export const FLEET_EXPORT_ROW_LIMIT = 5000;
