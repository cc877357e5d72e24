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
  const diff = new Float64Array(d);
  const lowerOnly = shape === 'full' || shape === 'tied';
  for (let c = 0; c < k; c++) {
    const at = c * dd;
    const m = c * d;
    for (let i = 0; i < n; i++) {
      const r = resp[i * k + c];
      if (r === 0) continue;
      const x = i * d;
      for (let j = 0; j < d; j++) diff[j] = data[x + j] - means[m + j];
      if (lowerOnly) {
        for (let a = 0; a < d; a++) {
          const ra = r * diff[a];
          const row = at + a * d;
          for (let b = 0; b <= a; b++) out[row + b] += ra * diff[b];
        }
      } else {
        for (let a = 0; a < d; a++) out[at + a * d + a] += r * diff[a] * diff[a];
      }
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
