// Davies–Bouldin index (Davies & Bouldin 1979): for each segment the worst ratio of summed spreads
// to centroid separation against any other segment, averaged. Smaller is better; 0 is the floor.
import { AssignmentInput } from '../core/assignment';
import { RowsInput } from '../core/matrix';
import { segmentRows } from './segment-centres';

/**
 * DB = (1/k) Σ_c max_{c'≠c} (S_c + S_c') / M_cc', S_c = mean Euclidean distance of the segment's
 * rows to its centroid, M = Euclidean distance between centroids. Two segments with the same
 * centroid are not separated at all: their ratio, and so the index, is Infinity (unless both
 * spreads are 0 as well, when the pair adds nothing).
 */
export function daviesBouldin(rows: RowsInput, assignment: AssignmentInput): number {
  const { m, compact, centres } = segmentRows(rows, assignment, 'daviesBouldin');
  const n = m.rows;
  const d = m.cols;
  const k = compact.k;
  const x = m.data;
  const spread = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    const c = compact.labels[i];
    let s = 0;
    for (let j = 0; j < d; j++) {
      const t = x[i * d + j] - centres[c * d + j];
      s += t * t;
    }
    spread[c] += Math.sqrt(s);
  }
  for (let c = 0; c < k; c++) spread[c] /= compact.sizes[c];
  let total = 0;
  for (let c = 0; c < k; c++) {
    let worst = 0;
    for (let o = 0; o < k; o++) {
      if (o === c) continue;
      let s = 0;
      for (let j = 0; j < d; j++) {
        const t = centres[c * d + j] - centres[o * d + j];
        s += t * t;
      }
      const separation = Math.sqrt(s);
      const spreads = spread[c] + spread[o];
      const ratio = separation > 0 ? spreads / separation : spreads > 0 ? Infinity : 0;
      if (ratio > worst) worst = ratio;
    }
    total += worst;
  }
  return total / k;
}
