// Weighted log-densities ln(w_c) + ln N(x | μ_c, Σ_c) for every row and component, through the
// inverse Cholesky factor W_c = L_c⁻¹ of each covariance (Σ_c = L_c L_cᵀ):
//   ln N = −d/2 · ln(2π) + Σ_j ln W_c,jj − ½ |W_c (x − μ_c)|².
// The stored definition rule (segments/mixture-rule.ts) and its SQL use exactly this arithmetic.
import { KinsortError } from '../../core/errors';
import { choleskyLower, invertLower } from './cholesky';

const HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);

export interface ComponentFactors {
  /** W_c = L_c⁻¹ for every component, k × d × d, lower triangular. */
  readonly whitening: Float64Array;
  /** ln(w_c) − d/2 · ln(2π) + Σ_j ln W_c,jj: the part of the log-density that does not depend on the row. */
  readonly constant: Float64Array;
}

/** The constant of component c from its weight and the diagonal of its W (the order of additions is fixed: the SQL repeats it). */
export function componentConstant(weight: number, whitening: ArrayLike<number>, at: number, d: number): number {
  let s = Math.log(weight) - d * HALF_LOG_TWO_PI;
  for (let j = 0; j < d; j++) s += Math.log(whitening[at + j * d + j]);
  return s;
}

/** Factor every covariance; a covariance that is not positive definite is refused, naming the component. */
export function factorComponents(covariances: Float64Array, weights: Float64Array, k: number, d: number, where: string): ComponentFactors {
  const dd = d * d;
  const lower = new Float64Array(dd);
  const whitening = new Float64Array(k * dd);
  const constant = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    const bad = choleskyLower(covariances, c * dd, d, lower, 0);
    if (bad >= 0) {
      throw new KinsortError(
        `${where}: the covariance of component ${c + 1} is not positive definite (pivot ${bad + 1}); the rows may lie on a ` +
          'lower-dimensional subspace. Drop redundant columns or raise varianceFloor.',
        'bad-input',
      );
    }
    invertLower(lower, 0, d, whitening, c * dd);
    constant[c] = componentConstant(weights[c], whitening, c * dd, d);
  }
  return { whitening, constant };
}

/**
 * Squared Mahalanobis distance |W_c (x_i − μ_c)|² of row i to component c: the differences first,
 * then row j of W times them over l = 0..j, squared and summed in order of j.
 */
export function whitenedSquare(
  data: ArrayLike<number>,
  x: number,
  means: ArrayLike<number>,
  m: number,
  whitening: ArrayLike<number>,
  w: number,
  d: number,
  diff: Float64Array,
): number {
  for (let j = 0; j < d; j++) diff[j] = data[x + j] - means[m + j];
  let q = 0;
  for (let j = 0; j < d; j++) {
    const row = w + j * d;
    let z = 0;
    for (let l = 0; l <= j; l++) z += whitening[row + l] * diff[l];
    q += z * z;
  }
  return q;
}

/** out[i × k + c] = ln(w_c) + ln N(x_i | μ_c, Σ_c) for all rows and components. */
export function weightedLogDensities(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  means: Float64Array,
  factors: ComponentFactors,
  out: Float64Array,
): void {
  const { whitening, constant } = factors;
  const diff = new Float64Array(d);
  const dd = d * d;
  for (let c = 0; c < k; c++) {
    const w = c * dd;
    const m = c * d;
    const lead = constant[c];
    for (let i = 0; i < n; i++) out[i * k + c] = lead - 0.5 * whitenedSquare(data, i * d, means, m, whitening, w, d, diff);
  }
}
