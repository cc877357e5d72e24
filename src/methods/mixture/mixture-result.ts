// What gaussianMixture returns.
import type { CovarianceShape } from './covariance-shapes';
import type { MixtureStart } from './starts';

export interface GaussianMixtureResult {
  readonly kind: 'gaussian-mixture';
  readonly k: number;
  readonly covariance: CovarianceShape;
  /** Component of each row with the highest membership probability, 0..k-1 (ties: the lower number). */
  readonly assignment: Int32Array;
  /**
   * Membership probabilities, n × k, flat and row-major: row i's probability of component c is
   * membership[i × k + c]; each row sums to 1.
   */
  readonly membership: Float64Array;
  /** Mixing weight of each component (they sum to 1). */
  readonly weights: number[];
  /** Mean of each component (k rows × d). */
  readonly means: number[][];
  /**
   * Covariance of each component as a full d × d matrix, whatever the shape: 'tied' repeats one
   * matrix, 'diagonal' and 'spherical' hold zeros off the diagonal. varianceFloor is included.
   */
  readonly covariances: number[][][];
  /** Σ over rows of ln Σ_c w_c N(x | μ_c, Σ_c), at the returned parameters. */
  readonly logLikelihood: number;
  /** Free parameters: k − 1 weights, k·d means and the shape's covariance figures. */
  readonly parameterCount: number;
  /** Bayesian information criterion −2 ln L + parameterCount · ln n (Schwarz 1978): lower is better. */
  readonly bic: number;
  /** Added to every variance at every M-step so that no component collapses. */
  readonly varianceFloor: number;
  readonly start: MixtureStart;
  /** EM iterations of the kept restart. */
  readonly iterations: number;
  /** Whether the kept restart's log-likelihood settled within tolerance before maxIterations. */
  readonly converged: boolean;
  readonly restartsRun: number;
  /** Final log-likelihood of each restart, in order. */
  readonly restartLogLikelihoods: number[];
}
