// Segment means in the prepared space: the centres a hierarchy cut is assigned by, and what a
// projection marks for it.
import type { Matrix } from '../core/matrix';

export function segmentMeans(m: Matrix, assignment: Int32Array, k: number): number[][] {
  const d = m.cols;
  const sums = new Float64Array(k * d);
  const counts = new Float64Array(k);
  for (let i = 0; i < m.rows; i++) {
    const s = assignment[i];
    counts[s]++;
    const base = i * d;
    for (let j = 0; j < d; j++) sums[s * d + j] += m.data[base + j];
  }
  const out: number[][] = [];
  for (let s = 0; s < k; s++) {
    const row = new Array<number>(d);
    for (let j = 0; j < d; j++) row[j] = sums[s * d + j] / counts[s];
    out.push(row);
  }
  return out;
}

/** The prepared rows at `indices`, as nested arrays. */
export function rowsAt(m: Matrix, indices: readonly number[]): number[][] {
  return indices.map((i) => Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols)));
}
