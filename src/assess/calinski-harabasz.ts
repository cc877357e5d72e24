// Calinski–Harabasz index (Calinski & Harabasz 1974): between-segment dispersion over
// within-segment dispersion, each divided by its degrees of freedom. Larger is better.
import { AssignmentInput } from '../core/assignment';
import { RowsInput } from '../core/matrix';
import { segmentRows } from './segment-centres';

/**
 * CH = [B / (k - 1)] / [W / (n - k)], B = Σ_c n_c |centroid_c - mean|², W = Σ_i |x_i - centroid_c(i)|².
 * When W = 0 (every segment is a single point repeated) the index is Infinity.
 */
export function calinskiHarabasz(rows: RowsInput, assignment: AssignmentInput): number {
  const { m, compact, centres } = segmentRows(rows, assignment, 'calinskiHarabasz');
  const n = m.rows;
  const d = m.cols;
  const k = compact.k;
  const x = m.data;
  const mean = new Float64Array(d);
  for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) mean[j] += x[i * d + j];
  for (let j = 0; j < d; j++) mean[j] /= n;
  let between = 0;
  for (let c = 0; c < k; c++) {
    let s = 0;
    for (let j = 0; j < d; j++) {
      const t = centres[c * d + j] - mean[j];
      s += t * t;
    }
    between += compact.sizes[c] * s;
  }
  let within = 0;
  for (let i = 0; i < n; i++) {
    const co = compact.labels[i] * d;
    for (let j = 0; j < d; j++) {
      const t = x[i * d + j] - centres[co + j];
      within += t * t;
    }
  }
  if (within === 0) return between === 0 ? 0 : Infinity;
  return (between * (n - k)) / (within * (k - 1));
}
