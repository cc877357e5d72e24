// Shapes of the preparation layer: the options, the fitted (JSON-serialisable) Preparation, the
// report a person reads, and the prepared data the numeric layers take.
import type { Matrix } from '../core/matrix';
import type { MixedTable } from '../core/mixed';
import type { DecimalMark } from '../table/cells';
import type { Cell, DeclaredType } from '../table/types';

/**
 * Version of the Preparation format; 2 stores the schema (text rule, missing markers, decimal mark,
 * level matching); 3 spells each column's subtracted value `center` (2 said `centre`; read and
 * translated by upgrade.ts).
 */
export const PREPARATION_VERSION = 3;

export type ScaleMethod = 'none' | 'zscore' | 'robust' | 'minmax';
export type MissingPolicy = 'refuse' | 'drop' | 'median';
export const SCALE_METHODS: readonly ScaleMethod[] = ['none', 'zscore', 'robust', 'minmax'];
/** The column types a preparation knows (the declared types of table/): the one list of them. */
export { DECLARED_TYPES as COLUMN_TYPES } from '../table/read';
/** What a prepared column's spread is. */
export type SpreadKind = 'sd' | 'iqr' | 'mad' | 'range' | 'none';
export const SPREAD_KINDS: readonly SpreadKind[] = ['sd', 'iqr', 'mad', 'range', 'none'];
export const MISSING_POLICIES: readonly MissingPolicy[] = ['refuse', 'drop', 'median'];

export interface PrepareOptions {
  /** Column of unique row ids; when absent ids are "1".."n" (input row numbers). */
  id?: string;
  /** Feature columns; default: every column but id, keep, and columns that read as free text. */
  use?: readonly string[];
  /** Profile-only columns: carried along to describe segments, never used for fitting. */
  keep?: readonly string[];
  types?: Record<string, DeclaredType>;
  ordinalLevels?: Record<string, readonly (string | number)[]>;
  /** Default 'zscore' (sample standard deviation, n − 1, as R's scale()). */
  scale?: ScaleMethod;
  /** Numeric columns to pass through log1p before scaling (negative values refused). */
  log?: readonly string[];
  /** Multiplier of each scaled column (for a one-hot column, of each of its indicators). */
  weights?: Record<string, number>;
  /** Default 'refuse'. */
  missing?: MissingPolicy;
  /** Intake (when the input is not a Table yet): texts meaning missing besides an empty cell. */
  missingMarkers?: readonly string[];
  /** Intake (when the input is not a Table yet): '.' (default) or ','. */
  decimalMark?: DecimalMark;
}

/** How one used column becomes features. Plain JSON: no typed arrays, no functions. */
export interface PreparedColumn {
  name: string;
  type: DeclaredType;
  /** numeric only: log1p applied before centring. */
  log: boolean;
  weight: number;
  /** binary: [level coded 0, level coded 1]; categorical: sorted levels; ordinal: lowest first. Exact text. */
  levels: string[] | null;
  /**
   * How a cell's text is matched to a level: 'exact' (code units, no trimming) or 'ascii-case'
   * (binary true/false columns: ASCII letters of any case). null for numeric columns.
   */
  levelMatch: 'exact' | 'ascii-case' | null;
  /** numeric / ordinal: subtracted after log (ordinal: from the rank 0..L-1). 0 for others. */
  center: number;
  /** numeric / ordinal: divisor after centring. 1 for others. */
  spread: number;
  /** What `spread` is: sd, iqr, mad (×1.4826), range, or none (1). */
  spreadKind: SpreadKind;
  /** Value put in for a missing cell under the 'median' policy (raw units or level); null otherwise. */
  fill: number | string | null;
  /** Names of the matrix columns this column produces, in order. */
  features: string[];
}

export interface Preparation {
  format: 'kinsort-preparation';
  version: 3;
  /** The text rule cells are read with (table/cells.ts; docs/stored-schema.md). */
  textRule: 'kinsort-text-1';
  /** Texts meaning missing besides an empty cell, compared after trimming ASCII spaces. */
  missingMarkers: string[];
  /** Decimal mark of numbers written as text. */
  decimalMark: DecimalMark;
  /** Column of row ids (exact text), or null when rows are numbered 1..n. */
  idColumn: string | null;
  scale: ScaleMethod;
  missing: MissingPolicy;
  /** Used columns that produce features, in feature order. */
  columns: PreparedColumn[];
  /** Used columns dropped because they had no spread in the training rows. */
  constantColumns: string[];
  /** Profile-only columns. */
  keep: string[];
  featureNames: string[];
}

export interface DroppedRow {
  id: string;
  /** 0-based input row. */
  row: number;
  columns: string[];
  reason: string;
}

export interface ImputedColumn {
  column: string;
  value: number | string;
  count: number;
  ids: string[];
}

export interface UnseenLevel {
  id: string;
  row: number;
  column: string;
  level: string;
}

export interface PreparationReport {
  inputRows: number;
  keptRows: number;
  dropped: DroppedRow[];
  imputed: ImputedColumn[];
  constantColumns: string[];
  /** applyPreparation only (empty when fitting): categorical levels never seen in training. */
  unseenLevels: UnseenLevel[];
  notes: string[];
}

export interface PreparedData {
  matrix: Matrix;
  ids: string[];
  /** 0-based input row of each kept row. */
  rowNumbers: Int32Array;
  featureNames: string[];
  preparation: Preparation;
  report: PreparationReport;
  /** The used columns unscaled (after imputation and log) as codes for Gower, same kept rows. */
  mixed: MixedTable;
  /** Raw values of the keep columns and of the used columns, for the kept rows. */
  profile: { columns: Record<string, Cell[]> };
}
