// The intake layer's plain table: one array of raw values per column, with the type we inferred.

/** A raw cell after intake: a number, a string, or null for a missing value. */
export type Cell = number | string | null;

/** What intake decided a column holds, from its values alone. */
export type InferredType = 'numeric' | 'binary' | 'categorical' | 'text';

/** What a person may declare a column to be (overrides inference). */
export type DeclaredType = 'numeric' | 'binary' | 'categorical' | 'ordinal';

export interface TableColumn {
  readonly name: string;
  /** One raw value per row; null = missing. Numeric-looking strings are already numbers. */
  readonly values: Cell[];
  readonly inferred: InferredType;
  /** Set when the caller declared the type (readTable's `types`). */
  readonly declared?: DeclaredType;
  /** Ordinal columns: the level order, lowest first. */
  readonly ordinalLevels?: readonly string[];
}

export interface Table {
  readonly kind: 'table';
  readonly rowCount: number;
  readonly columns: TableColumn[];
}

export function isTable(value: unknown): value is Table {
  return (
    typeof value === 'object' &&
    value !== null &&
    (value as Table).kind === 'table' &&
    Array.isArray((value as Table).columns)
  );
}
