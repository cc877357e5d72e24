// One EM iteration for a Gaussian mixture (Dempster, Laird & Rubin 1977): the E-step turns
// weighted log-densities into membership probabilities by log-sum-exp (and gives the
// log-likelihood); the M-step re-estimates weights, means and covariances from them.
import { estimateCovariances, NEGLIGIBLE_RESPONSIBILITY, type CovarianceShape } from './covariance-shapes';

/** Smallest component size used in divisions, so that an emptied component does not give 0 / 0 (10 machine epsilons). */
const SIZE_FLOOR = 10 * Number.EPSILON;

/**
 * In place: each row of `logp` (n × k weighted log-densities) becomes the row's membership
 * probabilities. Returns the log-likelihood Σ_i ln Σ_c exp(logp_ic), summed in row order.
 */
export function expectation(logp: Float64Array, n: number, k: number): number {
  let total = 0;
  for (let i = 0; i < n; i++) {
    const at = i * k;
    let top = -Infinity;
    for (let c = 0; c < k; c++) if (logp[at + c] > top) top = logp[at + c];
    let s = 0;
    for (let c = 0; c < k; c++) {
      const e = Math.exp(logp[at + c] - top);
      logp[at + c] = e;
      s += e;
    }
    total += top + Math.log(s);
    for (let c = 0; c < k; c++) logp[at + c] /= s;
  }
  return total;
}

export interface MixtureParameters {
  /** k weights summing to 1. */
  readonly weights: Float64Array;
  /** k × d. */
  readonly means: Float64Array;
  /** k × d × d full matrices. */
  readonly covariances: Float64Array;
}

/** M-step: parameters from membership probabilities `resp` (n × k). */
export function maximisation(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  resp: Float64Array,
  shape: CovarianceShape,
  floor: number,
  into?: MixtureParameters,
): MixtureParameters {
  const weights = into?.weights ?? new Float64Array(k);
  const means = into?.means ?? new Float64Array(k * d);
  const covariances = into?.covariances ?? new Float64Array(k * d * d);
  const nk = new Float64Array(k);
  means.fill(0);
  for (let i = 0; i < n; i++) {
    const x = i * d;
    for (let c = 0; c < k; c++) {
      const r = resp[i * k + c];
      nk[c] += r;
      if (r < NEGLIGIBLE_RESPONSIBILITY) continue;
      const m = c * d;
      for (let j = 0; j < d; j++) means[m + j] += r * data[x + j];
    }
  }
  for (let c = 0; c < k; c++) {
    nk[c] += SIZE_FLOOR;
    for (let j = 0; j < d; j++) means[c * d + j] /= nk[c];
  }
  let total = 0;
  for (let c = 0; c < k; c++) total += nk[c];
  for (let c = 0; c < k; c++) weights[c] = nk[c] / total;
  estimateCovariances(data, n, d, k, resp, nk, means, shape, floor, covariances);
  return { weights, means, covariances };
}
