// The columns of a reading-sets spreadsheet (one reading a row, sets of many units). A leaf module: no imports, so the
// import dialog can use it without pulling the parsers or zod into its chunk.

/** The fields a row can carry: which set (serial, kind, takenAt), the reading, then the set's conditions. */
export const READING_SET_SHEET_FIELDS = [
  'serial',
  'kind',
  'takenAt',
  'quantity',
  'configuration',
  'phase',
  'value',
  'unit',
  'topOilC',
  'ambientC',
  'tap',
  'instrument',
  'reference',
] as const;
export type ReadingSetSheetField = (typeof READING_SET_SHEET_FIELDS)[number];

/** Fields every file must have a column for. */
export const READING_SET_SHEET_REQUIRED: readonly ReadingSetSheetField[] = ['serial', 'kind', 'takenAt', 'quantity', 'value', 'unit'];

/** Words for the fields on screen. */
export const READING_SET_SHEET_FIELD_LABELS: Record<ReadingSetSheetField, string> = {
  serial: 'Unit serial',
  kind: 'Kind (factory, commissioning, routine)',
  takenAt: 'Taken at',
  quantity: 'Quantity',
  configuration: 'Configuration',
  phase: 'Phase',
  value: 'Value',
  unit: 'Unit of the value',
  topOilC: 'Top oil (°C)',
  ambientC: 'Ambient (°C)',
  tap: 'Tap position',
  instrument: 'Instrument',
  reference: 'Reference set (yes/no)',
};

/** Most reading rows one import takes. */
export const READING_SET_IMPORT_ROW_LIMIT = 10000;
