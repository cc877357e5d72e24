// Mixed-type columns for Gower's dissimilarity: the intake layer produces them, the measure layer
// consumes them. Values are numeric codes so the hot loop stays on typed arrays.

export type MixedKind = 'numeric' | 'binary' | 'categorical' | 'ordinal';

export interface MixedColumn {
  readonly name: string;
  readonly kind: MixedKind;
  /**
   * One value per row; NaN marks a missing value.
   * numeric: the value; binary: 0 or 1; categorical: level code 0..L-1; ordinal: rank code 0..L-1.
   */
  readonly values: Float64Array;
  /** Level names for categorical / ordinal / binary columns (code i names levels[i]). */
  readonly levels?: readonly string[];
  /** Binary only: an asymmetric binary column, where two 0s (absence) say nothing (Gower 1971). */
  readonly asymmetric?: boolean;
  /** Column weight in Gower's average (default 1). */
  readonly weight?: number;
}

export interface MixedTable {
  readonly kind: 'mixed';
  readonly rows: number;
  readonly columns: readonly MixedColumn[];
  /** Optional row labels (ids). */
  readonly rowLabels?: readonly string[];
}

export function isMixedTable(value: unknown): value is MixedTable {
  return typeof value === 'object' && value !== null && (value as MixedTable).kind === 'mixed';
}
