// The order of a design family's table: outliers first (largest |M| first), then the other units by serial.
// A leaf (no engine, no schema library): the family page imports it without the statistics.

export interface OrderedFamilyItem {
  serial: string;
  outlier: boolean;
  modifiedZ: number | null;
}

/** Outliers first (largest |M| first), then the others by serial. */
export function outliersFirst<T extends OrderedFamilyItem>(items: readonly T[]): T[] {
  const size = (i: T) => Math.abs(i.modifiedZ ?? 0);
  return [...items].sort((a, b) => Number(b.outlier) - Number(a.outlier) || (a.outlier && b.outlier ? size(b) - size(a) : 0) || a.serial.localeCompare(b.serial));
}
