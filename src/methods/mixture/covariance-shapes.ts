// The four covariance shapes a mixture can have, and the M-step estimate of each (Dempster,
// Laird & Rubin 1977): the responsibility-weighted scatter around each component's mean, with a
// small floor added to every variance so that no component collapses onto a few rows.
//
// Every shape is returned as k full d × d matrices (flat, row-major), so the log-density and the
// stored definition rule need one code path: 'tied' repeats one matrix, 'diagonal' and
// 'spherical' hold zeros off the diagonal.

export type CovarianceShape = 'full' | 'diagonal' | 'spherical' | 'tied';
export const COVARIANCE_SHAPES: readonly CovarianceShape[] = ['full', 'diagonal', 'spherical', 'tied'];

/**
 * Responsibilities below this are left out of the M-step sums (means and covariances), as exact
 * zeros are. On separated components most row–component pairs are far below it, and skipping them
 * halves the M-step; what is left out is at most n · 1e-12 of a row's weight per component (1e-7
 * at 100,000 rows), far inside the log-likelihood checks (1e-6 relative). Component sizes and
 * weights still add every responsibility.
 */
export const NEGLIGIBLE_RESPONSIBILITY = 1e-12;

/**
 * Free parameters of a mixture of k components in d dimensions: k − 1 weights, k × d means and
 * the covariance figures of the shape (full: k·d(d+1)/2, diagonal: k·d, spherical: k, tied:
 * d(d+1)/2). BIC counts these.
 */
export function parameterCount(shape: CovarianceShape, k: number, d: number): number {
  const triangle = (d * (d + 1)) / 2;
  const covariance = shape === 'full' ? k * triangle : shape === 'diagonal' ? k * d : shape === 'spherical' ? k : triangle;
  return k - 1 + k * d + covariance;
}

/**
 * Covariances for the given responsibilities (`resp`, n × k), component sizes `nk` (Σ of each
 * column of resp) and means, into `out` (k × d × d). `floor` is added to every variance.
 */
export function estimateCovariances(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  resp: Float64Array,
  nk: Float64Array,
  means: Float64Array,
  shape: CovarianceShape,
  floor: number,
  out: Float64Array,
): void {
  out.fill(0);
  const dd = d * d;
  const diff0 = new Float64Array(d);
  const diff1 = new Float64Array(d);
  const lowerOnly = shape === 'full' || shape === 'tied';
  // The lower triangle packed row by row, two rows of data at a time (each product pair added together).
  const packed = new Float64Array(lowerOnly ? (d * (d + 1)) / 2 : d);
  for (let c = 0; c < k; c++) {
    const at = c * dd;
    const m = c * d;
    packed.fill(0);
    let pending = -1; // a row with weight waiting for a partner
    let pendingR = 0;
    const take = (i: number, into: Float64Array) => {
      const x = i * d;
      for (let j = 0; j < d; j++) into[j] = data[x + j] - means[m + j];
    };
    for (let i = 0; i < n; i++) {
      const r = resp[i * k + c];
      if (r < NEGLIGIBLE_RESPONSIBILITY) continue; // left out, as in the means (em-step.ts)
      if (pending < 0) {
        pending = i;
        pendingR = r;
        continue;
      }
      take(pending, diff0);
      take(i, diff1);
      pending = -1;
      const r0 = pendingR;
      if (lowerOnly) {
        let p = 0;
        for (let a = 0; a < d; a++) {
          const u0 = r0 * diff0[a];
          const u1 = r * diff1[a];
          for (let b = 0; b <= a; b++) packed[p++] += u0 * diff0[b] + u1 * diff1[b];
        }
      } else {
        for (let a = 0; a < d; a++) packed[a] += r0 * diff0[a] * diff0[a] + r * diff1[a] * diff1[a];
      }
    }
    if (pending >= 0) {
      take(pending, diff0);
      if (lowerOnly) {
        let p = 0;
        for (let a = 0; a < d; a++) {
          const u0 = pendingR * diff0[a];
          for (let b = 0; b <= a; b++) packed[p++] += u0 * diff0[b];
        }
      } else {
        for (let a = 0; a < d; a++) packed[a] += pendingR * diff0[a] * diff0[a];
      }
    }
    if (lowerOnly) {
      let p = 0;
      for (let a = 0; a < d; a++) for (let b = 0; b <= a; b++) out[at + a * d + b] = packed[p++];
    } else {
      for (let a = 0; a < d; a++) out[at + a * d + a] = packed[a];
    }
  }
  if (shape === 'tied') {
    // One matrix: the scatter of all components over all rows, repeated for every component.
    let total = 0;
    for (let c = 0; c < k; c++) total += nk[c];
    for (let c = 1; c < k; c++) for (let e = 0; e < dd; e++) out[e] += out[c * dd + e];
    for (let e = 0; e < dd; e++) out[e] /= total;
    for (let c = 1; c < k; c++) out.copyWithin(c * dd, 0, dd);
  } else {
    for (let c = 0; c < k; c++) for (let e = 0; e < dd; e++) out[c * dd + e] /= nk[c];
  }
  for (let c = 0; c < k; c++) {
    const at = c * dd;
    if (shape === 'spherical') {
      // One variance per component: the mean of its per-feature variances (each with the floor).
      let s = 0;
      for (let a = 0; a < d; a++) s += out[at + a * d + a] + floor;
      for (let a = 0; a < d; a++) out[at + a * d + a] = s / d;
    } else {
      for (let a = 0; a < d; a++) out[at + a * d + a] += floor;
    }
    // Mirror the lower triangle so every returned matrix is whole and symmetric.
    for (let a = 0; a < d; a++) for (let b = 0; b < a; b++) out[at + b * d + a] = out[at + a * d + b];
  }
}
