// The intake layer's plain table: one array of raw values per column, with the type we inferred.

/** A raw cell after intake: a number, a string, or null for a missing value. */
export type Cell = number | string | null;

/** What intake decided a column holds, from its values alone. */
export type InferredType = 'numeric' | 'binary' | 'categorical' | 'text';

/** What a person may declare a column to be (overrides inference). */
export type DeclaredType = 'numeric' | 'binary' | 'categorical' | 'ordinal';

export interface TableColumn {
  readonly name: string;
  /**
   * One value per row exactly as given (text stays text, even when it reads as a number: the
   * preparation parses numbers under the text rule); null = missing.
   */
  readonly values: Cell[];
  readonly inferred: InferredType;
  /** Inferred binary columns of true/false in any ASCII letter case: one column, levels matched ignoring case. */
  readonly anyCase?: boolean;
  /** 0-based row of a cell written with a decimal comma or thousands separator, in a column otherwise of numbers. */
  readonly commaNumberRow?: number;
  /** The CSV's unnamed first column (row names or an index, as R and pandas write them). */
  readonly rowNames?: boolean;
  /** Set when the caller declared the type (readTable's `types`). */
  readonly declared?: DeclaredType;
  /** Ordinal columns: the level order, lowest first. */
  readonly ordinalLevels?: readonly string[];
}

export interface Table {
  readonly kind: 'table';
  readonly rowCount: number;
  readonly columns: TableColumn[];
  /** Missing markers the cells were read with (default DEFAULT_MISSING_MARKERS). */
  readonly missingMarkers?: readonly string[];
  /** The decimal mark numbers are read with (default '.'). */
  readonly decimalMark?: '.' | ',';
  /** What intake decided that a person should know (row-name column, trailing empty lines…). */
  readonly notes?: readonly string[];
}

export function isTable(value: unknown): value is Table {
  return typeof value === 'object' && value !== null && (value as Table).kind === 'table' && Array.isArray((value as Table).columns);
}
