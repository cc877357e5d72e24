// Segment means in the prepared space: the centres a hierarchy cut is assigned by, and what a
// projection marks for it.
import type { Matrix } from '../core/matrix';
import { centroids } from '../assess/segment-centres';

export function segmentMeans(m: Matrix, assignment: Int32Array, k: number): number[][] {
  const flat = centroids(m, assignment, k);
  return Array.from({ length: k }, (_, s) => Array.from(flat.subarray(s * m.cols, (s + 1) * m.cols)));
}

/** The prepared rows at `indices`, as nested arrays. */
export function rowsAt(m: Matrix, indices: readonly number[]): number[][] {
  return indices.map((i) => Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols)));
}
