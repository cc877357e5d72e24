// The package's flat matrix: row-major values in one Float64Array. Every numeric method takes
// `number[][]` or this, and converts once at the boundary.
import { KinsortError } from './errors';

export interface Matrix {
  readonly rows: number;
  readonly cols: number;
  /** Row-major: value (i, j) is data[i * cols + j]. */
  readonly data: Float64Array;
  /** Optional row labels (ids), used only to name rows in messages and views. */
  readonly rowLabels?: readonly string[];
  /** Optional column names, used only to name columns in messages and views. */
  readonly colNames?: readonly string[];
}

export type RowsInput = readonly (readonly number[])[] | Matrix;

export function isMatrix(value: unknown): value is Matrix {
  return (
    typeof value === 'object' &&
    value !== null &&
    (value as Matrix).data instanceof Float64Array &&
    typeof (value as Matrix).rows === 'number' &&
    typeof (value as Matrix).cols === 'number'
  );
}

/** Build a matrix; `data` is taken as is (not copied) when given. */
export function createMatrix(
  rows: number,
  cols: number,
  data?: Float64Array,
  names?: { rowLabels?: readonly string[]; colNames?: readonly string[] },
): Matrix {
  const values = data ?? new Float64Array(rows * cols);
  if (values.length !== rows * cols) {
    throw new KinsortError(`matrix data has ${values.length} values, expected ${rows} × ${cols}.`, 'bad-input');
  }
  return { rows, cols, data: values, rowLabels: names?.rowLabels, colNames: names?.colNames };
}

/** How a row is named in messages: its label when known, else its 1-based position. */
export function rowName(m: Pick<Matrix, 'rowLabels'>, i: number): string {
  const label = m.rowLabels?.[i];
  return label === undefined ? `row ${i + 1}` : `row ${i + 1} (id "${label}")`;
}

/** How a column is named in messages: its name when known, else its 1-based position. */
export function colName(m: Pick<Matrix, 'colNames'>, j: number): string {
  const name = m.colNames?.[j];
  return name === undefined ? `column ${j + 1}` : `column "${name}"`;
}

export interface ToMatrixOptions {
  /** What the caller calls its input, for messages ("rows", "centers"). */
  what?: string;
  /** Refuse NaN / ±Infinity (default true). */
  finite?: boolean;
  /** Minimum number of rows (default 1). */
  minRows?: number;
}

/**
 * Convert `number[][]` or a Matrix to a validated Matrix. Ragged rows, non-numbers and
 * non-finite values are refused with the row and column named.
 */
export function toMatrix(input: RowsInput, options: ToMatrixOptions = {}): Matrix {
  const what = options.what ?? 'rows';
  const finite = options.finite ?? true;
  const minRows = options.minRows ?? 1;
  let m: Matrix;
  if (isMatrix(input)) {
    m = input;
  } else {
    if (!Array.isArray(input)) {
      throw new KinsortError(`${what} must be an array of number arrays or a kinsort Matrix.`, 'bad-input');
    }
    const rows = input.length;
    if (rows === 0) {
      if (minRows > 0) throw new KinsortError(`${what} is empty: at least ${minRows} row(s) needed.`, 'empty');
      return createMatrix(0, 0);
    }
    const first = input[0] as ArrayLike<unknown>;
    if (!Array.isArray(first) && !ArrayBuffer.isView(first)) {
      throw new KinsortError(`${what}: row 1 is not an array of numbers.`, 'bad-input');
    }
    const cols = first.length;
    const data = new Float64Array(rows * cols);
    for (let i = 0; i < rows; i++) {
      const row = input[i] as ArrayLike<unknown>;
      if (!Array.isArray(row) && !ArrayBuffer.isView(row)) {
        throw new KinsortError(`${what}: row ${i + 1} is not an array of numbers.`, 'bad-input');
      }
      if (row.length !== cols) {
        throw new KinsortError(
          `${what}: row ${i + 1} has ${row.length} values but row 1 has ${cols}; every row needs the same columns.`,
          'ragged',
        );
      }
      for (let j = 0; j < cols; j++) {
        const v = row[j];
        if (typeof v !== 'number') {
          throw new KinsortError(`${what}: row ${i + 1}, column ${j + 1} holds ${JSON.stringify(v)}, not a number.`, 'bad-input');
        }
        data[i * cols + j] = v;
      }
    }
    m = createMatrix(rows, cols, data);
  }
  if (m.rows < minRows) {
    throw new KinsortError(`${what}: ${m.rows} row(s) given, at least ${minRows} needed.`, 'empty');
  }
  if (finite) assertFinite(m, what);
  return m;
}

/** Refuse NaN / ±Infinity, naming the first offending row and column. */
/**
 * Largest size of a value that distances can square and sum without overflow, and smallest size
 * of the largest value for which squared differences do not underflow to 0 (double precision).
 */
export const LARGEST_USABLE_MAGNITUDE = 1e150;
export const SMALLEST_USABLE_SCALE = 1e-150;

export function assertFinite(m: Matrix, what = 'rows'): void {
  const { data, cols } = m;
  let largest = 0;
  let largestAt = -1;
  for (let k = 0; k < data.length; k++) {
    const v = data[k];
    const size = Math.abs(v);
    if (size > largest) {
      largest = size;
      largestAt = k;
    }
    if (!Number.isFinite(v)) {
      const i = Math.floor(k / cols);
      const j = k - i * cols;
      throw new KinsortError(
        `${what}: ${rowName(m, i)}, ${colName(m, j)} is ${v}; only finite numbers can be used ` +
          `(choose a missing-value policy when preparing the table).`,
        'not-finite',
      );
    }
  }
  // Squared distances of such values overflow to Infinity or underflow to 0, and every method
  // would silently give wrong segments (or never finish): refuse instead, saying how to fix it.
  if (largest > LARGEST_USABLE_MAGNITUDE || (largest > 0 && largest < SMALLEST_USABLE_SCALE)) {
    const i = Math.floor(largestAt / cols);
    const j = largestAt - i * cols;
    const problem =
      largest > LARGEST_USABLE_MAGNITUDE
        ? `is ${data[largestAt]}, beyond ±${LARGEST_USABLE_MAGNITUDE} where squared distances overflow`
        : `is ${data[largestAt]}, the largest value in size, and below ${SMALLEST_USABLE_SCALE} squared differences underflow to 0`;
    throw new KinsortError(
      `${what}: ${rowName(m, i)}, ${colName(m, j)} ${problem}; rescale the values (prepare the table with ` +
        `scale 'zscore', 'robust' or 'minmax', or multiply by a power of ten) before clustering.`,
      'bad-input',
    );
  }
}

/** Copy of row i (allocates; not for hot loops). */
export function rowOf(m: Matrix, i: number): number[] {
  return Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols));
}

/** Back to nested arrays (allocates; for results and tests). */
export function toNested(m: Matrix): number[][] {
  const out: number[][] = new Array(m.rows);
  for (let i = 0; i < m.rows; i++) out[i] = rowOf(m, i);
  return out;
}

/** The rows at `indices`, in that order, as a new matrix. */
export function takeRows(m: Matrix, indices: ArrayLike<number>): Matrix {
  const out = new Float64Array(indices.length * m.cols);
  for (let r = 0; r < indices.length; r++) {
    const i = indices[r];
    out.set(m.data.subarray(i * m.cols, (i + 1) * m.cols), r * m.cols);
  }
  const labels = m.rowLabels ? Array.from(indices, (i) => m.rowLabels![i]) : undefined;
  return createMatrix(indices.length, m.cols, out, { rowLabels: labels, colNames: m.colNames });
}
