// The canonical readings CSV's columns. A leaf module (no imports), so a screen can name them without loading the CSV
// parser (papaparse); shared/imports/readings-csv.ts re-exports them.

/** Column names of the canonical readings CSV, in the order written by `mapColumns`. */
export const READINGS_COLUMNS = ['quantity', 'configuration', 'phase', 'value', 'unit'] as const;
export type ReadingsColumn = (typeof READINGS_COLUMNS)[number];
