// The reference region of the gap statistic, method (b) of Tibshirani, Walther & Hastie (2001):
// the box aligned with the principal axes of the centred rows. Reference rows are drawn uniformly
// in that box and rotated back, so the null model follows the data's orientation.
import { Matrix } from '../core/matrix';
import { Random } from '../random';
import { symmetricEigen } from '../methods/project/eigen';

export interface PrincipalBox {
  readonly cols: number;
  /** Column means. */
  readonly mean: Float64Array;
  /** d × d, column c = principal axis c (orthonormal). */
  readonly axes: Float64Array;
  /** Range of the rotated rows along each axis. */
  readonly low: Float64Array;
  readonly high: Float64Array;
}

/** The principal-axis box of the rows. */
export function principalBox(m: Matrix): PrincipalBox {
  const n = m.rows;
  const d = m.cols;
  const x = m.data;
  const mean = new Float64Array(d);
  for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) mean[j] += x[i * d + j];
  for (let j = 0; j < d; j++) mean[j] /= n;
  const cross = new Float64Array(d * d);
  for (let i = 0; i < n; i++) {
    for (let p = 0; p < d; p++) {
      const xp = x[i * d + p] - mean[p];
      for (let q = p; q < d; q++) cross[p * d + q] += xp * (x[i * d + q] - mean[q]);
    }
  }
  for (let p = 0; p < d; p++) for (let q = 0; q < p; q++) cross[p * d + q] = cross[q * d + p];
  const axes = symmetricEigen(cross, d).vectors;
  const low = new Float64Array(d).fill(Infinity);
  const high = new Float64Array(d).fill(-Infinity);
  for (let i = 0; i < n; i++) {
    for (let c = 0; c < d; c++) {
      let s = 0;
      for (let j = 0; j < d; j++) s += (x[i * d + j] - mean[j]) * axes[j * d + c];
      if (s < low[c]) low[c] = s;
      if (s > high[c]) high[c] = s;
    }
  }
  return { cols: d, mean, axes, low, high };
}

/** n rows drawn uniformly in the box, rotated back to the original coordinates (row-major). */
export function drawFromBox(box: PrincipalBox, n: number, random: Random): Float64Array {
  const d = box.cols;
  const out = new Float64Array(n * d);
  const z = new Float64Array(d);
  for (let i = 0; i < n; i++) {
    for (let c = 0; c < d; c++) z[c] = random.uniform(box.low[c], box.high[c]);
    for (let j = 0; j < d; j++) {
      let s = box.mean[j];
      for (let c = 0; c < d; c++) s += box.axes[j * d + c] * z[c];
      out[i * d + j] = s;
    }
  }
  return out;
}
