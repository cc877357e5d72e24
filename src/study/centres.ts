// Segment means in the prepared space: the centres a hierarchy cut is assigned by, and what a
// projection marks for it.
import type { Matrix } from '../core/matrix';
import { centroids } from '../assess/segment-centres';

/** Segment means (nested, segment order) and the within-segment sum of squares around them. */
export function segmentMeans(m: Matrix, assignment: Int32Array, k: number): { centers: number[][]; withinSS: number } {
  const d = m.cols;
  const flat = centroids(m, assignment, k);
  let withinSS = 0;
  for (let i = 0; i < m.rows; i++) {
    const c = assignment[i] * d;
    for (let j = 0; j < d; j++) {
      const diff = m.data[i * d + j] - flat[c + j];
      withinSS += diff * diff;
    }
  }
  const centers = Array.from({ length: k }, (_, s) => Array.from(flat.subarray(s * d, (s + 1) * d)));
  return { centers, withinSS };
}

/** The prepared rows at `indices`, as nested arrays. */
export function rowsAt(m: Matrix, indices: readonly number[]): number[][] {
  return indices.map((i) => Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols)));
}
