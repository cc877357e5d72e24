// Which mixture: Gaussian mixtures over a range of k and several covariance shapes, compared by
// BIC (Schwarz 1978), −2 ln L + p ln n, where lower is better. The one with the lowest BIC is
// chosen; ties keep the simpler one (fewer parameters, then the lower k).
import { KinsortError, checkChoice } from '../core/errors';
import { toMatrix, type RowsInput } from '../core/matrix';
import { checkInteger, checkOptions } from '../core/options';
import { report, type ProgressCallback } from '../core/progress';
import type { Seed } from '../random';
import { COVARIANCE_SHAPES, gaussianMixture, type CovarianceShape } from '../methods/mixture';

export interface CompareMixturesOptions {
  /** Smallest k (default 1). */
  from?: number;
  /** Largest k (default 8, at most the number of rows). */
  to?: number;
  /** Covariance shapes to try (default all four). */
  shapes?: readonly CovarianceShape[];
  /** Seed of every fit (default 0). */
  seed?: Seed;
  /** Restarts of every fit (default 3). */
  restarts?: number;
  onProgress?: ProgressCallback;
}

export interface MixtureCandidate {
  readonly k: number;
  readonly covariance: CovarianceShape;
  /** Lower is better. */
  readonly bic: number;
  readonly logLikelihood: number;
  readonly parameterCount: number;
  readonly converged: boolean;
}

export interface CompareMixturesResult {
  readonly kind: 'mixture-comparison';
  readonly rows: number;
  /** One entry per shape and k, shapes in the order asked, k rising. */
  readonly candidates: MixtureCandidate[];
  /** The lowest BIC of all. */
  readonly chosen: { readonly k: number; readonly covariance: CovarianceShape; readonly bic: number };
  /** The k with the lowest BIC within each shape. */
  readonly bestKByShape: Partial<Record<CovarianceShape, number>>;
  /** How to read BIC here, in words. */
  readonly convention: string;
}

const OPTIONS = ['from', 'to', 'shapes', 'seed', 'restarts', 'onProgress'] as const;

export function compareMixtures(rows: RowsInput, options: CompareMixturesOptions = {}): CompareMixturesResult {
  const where = 'compareMixtures';
  const opts = checkOptions(options, OPTIONS, where);
  const m = toMatrix(rows, { what: `${where}: rows`, minRows: 2 });
  const from = checkInteger(opts.from ?? 1, `${where}: from`, 1, m.rows);
  const to = checkInteger(opts.to ?? Math.min(8, m.rows), `${where}: to`, from, m.rows);
  const shapes: readonly CovarianceShape[] = opts.shapes ?? COVARIANCE_SHAPES;
  if (!Array.isArray(shapes as unknown) || shapes.length === 0) {
    throw new KinsortError(`${where}: shapes must list at least one of ${COVARIANCE_SHAPES.join(', ')}.`, 'bad-option');
  }
  shapes.forEach((s) => checkChoice(s, COVARIANCE_SHAPES, `${where}: covariance shape`));
  const restarts = checkInteger(opts.restarts ?? 3, `${where}: restarts`, 1);
  const candidates: MixtureCandidate[] = [];
  const total = shapes.length * (to - from + 1);
  for (const covariance of shapes) {
    for (let k = from; k <= to; k++) {
      const fit = gaussianMixture(m, { k, covariance, seed: opts.seed ?? 0, restarts });
      candidates.push({
        k,
        covariance,
        bic: fit.bic,
        logLikelihood: fit.logLikelihood,
        parameterCount: fit.parameterCount,
        converged: fit.converged,
      });
      report(opts.onProgress, { task: 'mixtures compared', done: candidates.length, total, detail: `k = ${k}, ${covariance}` });
    }
  }
  const better = (a: MixtureCandidate, b: MixtureCandidate) =>
    a.bic < b.bic || (a.bic === b.bic && (a.parameterCount < b.parameterCount || (a.parameterCount === b.parameterCount && a.k < b.k)));
  let chosen = candidates[0];
  for (const c of candidates) if (better(c, chosen)) chosen = c;
  const bestKByShape: Partial<Record<CovarianceShape, number>> = {};
  for (const covariance of shapes) {
    const own = candidates.filter((c) => c.covariance === covariance);
    bestKByShape[covariance] = own.reduce((a, c) => (better(c, a) ? c : a), own[0]).k;
  }
  return {
    kind: 'mixture-comparison',
    rows: m.rows,
    candidates,
    chosen: { k: chosen.k, covariance: chosen.covariance, bic: chosen.bic },
    bestKByShape,
    convention: 'BIC = −2 ln L + (free parameters) · ln n (Schwarz 1978); lower is better.',
  };
}
