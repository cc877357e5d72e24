// Segment centroids and sizes, shared by the centroid-based measures (Calinski–Harabasz,
// Davies–Bouldin). Also checks the two conditions both measures need.
import { compactLabels, requireSegments, AssignmentInput, CompactLabels } from '../core/assignment';
import { KinsortError } from '../core/errors';
import { Matrix, RowsInput, toMatrix } from '../core/matrix';

export interface SegmentedRows {
  readonly m: Matrix;
  readonly compact: CompactLabels;
  /** k × d centroids, row-major. */
  readonly centres: Float64Array;
}

/** Validate rows and assignment for a measure that needs 2 ≤ k < n, and compute centroids. */
export function segmentRows(rows: RowsInput, assignment: AssignmentInput, what: string): SegmentedRows {
  const m = toMatrix(rows, { what: `${what} rows` });
  const compact = compactLabels(assignment, m.rows, what);
  requireSegments(compact.k, 2, what);
  if (compact.k >= m.rows) {
    throw new KinsortError(
      `${what} needs fewer segments than rows, but the assignment puts ${m.rows} rows into ${compact.k} segments; ` +
        `with one row per segment there is no within-segment spread to compare.`,
      'bad-assignment',
    );
  }
  return { m, compact, centres: centroids(m, compact.labels, compact.k) };
}

/** k × d centroids (row-major) of the rows of each segment. */
export function centroids(m: Matrix, labels: Int32Array, k: number): Float64Array {
  const d = m.cols;
  const x = m.data;
  const centres = new Float64Array(k * d);
  const counts = new Float64Array(k);
  for (let i = 0; i < m.rows; i++) {
    const c = labels[i];
    counts[c]++;
    const co = c * d;
    const io = i * d;
    for (let j = 0; j < d; j++) centres[co + j] += x[io + j];
  }
  for (let c = 0; c < k; c++) {
    const co = c * d;
    for (let j = 0; j < d; j++) centres[co + j] /= counts[c];
  }
  return centres;
}
