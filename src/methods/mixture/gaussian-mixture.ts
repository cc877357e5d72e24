// Gaussian mixtures fitted by EM (Dempster, Laird & Rubin 1977) with the four covariance shapes,
// k-means or k-means++ starts, several restarts on their own random streams, the highest
// log-likelihood kept. The steps, one file each: starts.ts, em-step.ts, covariance-shapes.ts,
// log-density.ts (Cholesky factors), cholesky.ts.
//
// Reference:
//   A. P. Dempster, N. M. Laird and D. B. Rubin, "Maximum likelihood from incomplete data via the
//   EM algorithm", Journal of the Royal Statistical Society B 39 (1977) 1–38 (DOI from memory:
//   10.1111/j.2517-6161.1977.tb01600.x).
//   G. Schwarz, "Estimating the dimension of a model", Annals of Statistics 6 (1978) 461–464.
import { KinsortError, checkChoice } from '../../core/errors';
import type { Matrix, RowsInput } from '../../core/matrix';
import { checkInteger, checkNumber, checkOptions } from '../../core/options';
import { report, type ProgressCallback } from '../../core/progress';
import { createRandom, type Seed } from '../../random';
import { checkSegmentCount, partitionRows } from '../partition/partition-input';
import { COVARIANCE_SHAPES, parameterCount, type CovarianceShape } from './covariance-shapes';
import { expectation, maximisation, type MixtureParameters } from './em-step';
import { factorComponents, weightedLogDensities } from './log-density';
import type { GaussianMixtureResult } from './mixture-result';
import { MIXTURE_STARTS, startingMembership, type MixtureStart } from './starts';

export interface GaussianMixtureOptions {
  /** Number of components (required), 1 to the number of distinct rows. */
  k: number;
  /** 'full' (default), 'diagonal', 'spherical' or 'tied' (one covariance shared by all components). */
  covariance?: CovarianceShape;
  /** Seed of the starts (default 0). Restart r draws from createRandom(seed).fork(r). */
  seed?: Seed;
  /** Independent starts; the one with the highest log-likelihood is kept (default 1). */
  restarts?: number;
  /** 'k-means++' (default: each row to its nearest k-means++ seed) or 'k-means' (one Lloyd run from such seeds). */
  start?: MixtureStart;
  /** Most EM iterations per restart (default 300). */
  maxIterations?: number;
  /** Stop when the mean per-row log-likelihood gains at most this much in one iteration (default 1e-4). */
  tolerance?: number;
  /** Added to every variance at every M-step, against collapse onto a few rows (default 1e-6). */
  varianceFloor?: number;
  /** Called after each restart. */
  onProgress?: ProgressCallback;
}

const OPTIONS = ['k', 'covariance', 'seed', 'restarts', 'start', 'maxIterations', 'tolerance', 'varianceFloor', 'onProgress'] as const;

interface Run {
  params: MixtureParameters;
  membership: Float64Array;
  logLikelihood: number;
  iterations: number;
  converged: boolean;
}

/** A Gaussian mixture of k components, fitted to the rows by EM. */
export function gaussianMixture(rows: RowsInput, options: GaussianMixtureOptions): GaussianMixtureResult {
  const where = 'gaussianMixture';
  const opts = checkOptions(options, OPTIONS, where);
  const m = partitionRows(rows, where);
  if (m.rows < 2) throw new KinsortError(`${where}: ${m.rows} row given; a mixture needs at least 2 rows.`, 'empty');
  const k = checkSegmentCount(opts.k, m, where);
  const shape = checkChoice(opts.covariance ?? 'full', COVARIANCE_SHAPES, `${where}: covariance`);
  const start = checkChoice(opts.start ?? 'k-means++', MIXTURE_STARTS, `${where}: start`);
  const restarts = checkInteger(opts.restarts ?? 1, `${where}: restarts`, 1);
  const maxIterations = checkInteger(opts.maxIterations ?? 300, `${where}: maxIterations`, 1);
  const tolerance = checkNumber(opts.tolerance ?? 1e-4, `${where}: tolerance`, 0);
  const floor = checkNumber(opts.varianceFloor ?? 1e-6, `${where}: varianceFloor`, 0);
  const root = createRandom(opts.seed ?? 0);

  let best: Run | undefined;
  const byRestart: number[] = [];
  for (let r = 0; r < restarts; r++) {
    const run = runEm(m, k, shape, start, root.fork(r), maxIterations, tolerance, floor, where);
    byRestart.push(run.logLikelihood);
    // Strictly higher: ties keep the earlier restart.
    if (best === undefined || run.logLikelihood > best.logLikelihood) best = run;
    report(opts.onProgress, { task: 'mixture restarts', done: r + 1, total: restarts, detail: `k = ${k}, ${shape}` });
  }
  const kept = best!;
  const { rows: n, cols: d } = m;
  const assignment = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let top = 0;
    for (let c = 1; c < k; c++) if (kept.membership[i * k + c] > kept.membership[i * k + top]) top = c;
    assignment[i] = top;
  }
  const count = parameterCount(shape, k, d);
  return {
    kind: 'gaussian-mixture',
    k,
    covariance: shape,
    assignment,
    membership: kept.membership,
    weights: Array.from(kept.params.weights),
    means: Array.from({ length: k }, (_, c) => Array.from(kept.params.means.subarray(c * d, (c + 1) * d))),
    covariances: Array.from({ length: k }, (_, c) =>
      Array.from({ length: d }, (_, a) => Array.from(kept.params.covariances.subarray(c * d * d + a * d, c * d * d + (a + 1) * d))),
    ),
    logLikelihood: kept.logLikelihood,
    parameterCount: count,
    bic: -2 * kept.logLikelihood + count * Math.log(n),
    varianceFloor: floor,
    start,
    iterations: kept.iterations,
    converged: kept.converged,
    restartsRun: restarts,
    restartLogLikelihoods: byRestart,
  };
}

/**
 * EM from one start until the mean log-likelihood per row gains at most `tolerance`, then one more
 * E-step so that the memberships and log-likelihood belong to the returned parameters.
 */
function runEm(
  m: Matrix,
  k: number,
  shape: CovarianceShape,
  start: MixtureStart,
  random: ReturnType<typeof createRandom>,
  maxIterations: number,
  tolerance: number,
  floor: number,
  where: string,
): Run {
  const { rows: n, cols: d, data } = m;
  const resp = startingMembership(m, k, start, random);
  const params = maximisation(data, n, d, k, resp, shape, floor);
  let previous = -Infinity;
  let iterations = 0;
  let converged = false;
  for (let it = 1; it <= maxIterations; it++) {
    const factors = factorComponents(params.covariances, params.weights, k, d, where);
    weightedLogDensities(data, n, d, k, params.means, factors, resp);
    const logLikelihood = expectation(resp, n, k);
    maximisation(data, n, d, k, resp, shape, floor, params);
    iterations = it;
    if (Math.abs(logLikelihood - previous) / n <= tolerance) {
      converged = true;
      break;
    }
    previous = logLikelihood;
  }
  const factors = factorComponents(params.covariances, params.weights, k, d, where);
  weightedLogDensities(data, n, d, k, params.means, factors, resp);
  const logLikelihood = expectation(resp, n, k);
  return { params, membership: resp, logLikelihood, iterations, converged };
}
