// k-means: k-means++ starts (or random rows, or given centres), Lloyd iterations with Hamerly
// bounds, single-row transfers (Hartigan's rule) after them, several restarts each on its own
// random stream, the lowest within-SS kept.
//
// The steps, one file each (with their papers): seeding.ts (k-means++, Arthur & Vassilvitskii
// 2007), hamerly.ts and hamerly-sweep.ts (Lloyd 1982 with Hamerly's 2010 bounds),
// centre-update.ts (means and the repair of an empty segment), transfers.ts (Hartigan & Wong
// 1979; Telgarsky & Vattani 2010), exact-finish.ts and partition-figures.ts (the exact end),
// restarts.ts (the order of it all), wasm-kernels.ts (the WebAssembly kernels, kernels/*.wat).
import { KinsortError } from '../../core/errors';
import { toMatrix, type RowsInput } from '../../core/matrix';
import { checkInteger, checkNumber, checkOptions, describe } from '../../core/options';
import { checkProgress, report, type ProgressCallback } from '../../core/progress';
import type { Seed } from '../../random';
import { checkSegmentCount, partitionRows } from './partition-input';
import { runKmeans } from './restarts';

export type KmeansStart = 'k-means++' | 'random' | readonly (readonly number[])[];

export interface KmeansOptions {
  /** Number of segments (required). */
  k: number;
  /** Seed of the random starts (default 0). Restart r uses createRandom(seed).fork(r). */
  seed?: Seed;
  /** Independent starts; the one with the lowest within-SS is kept (default 10; 1 with given centres). */
  restarts?: number;
  /** Most centre updates per restart (default 300). */
  maxIterations?: number;
  /**
   * Stop when the summed squared movement of the centres is at most tolerance × the mean of the
   * column variances (default 1e-4; scaling by the data's variance is scikit-learn's convention).
   * 0 runs until no row changes segment.
   */
  tolerance?: number;
  /** How to start: 'k-means++' (default), 'random' rows, or k given centres (k rows × d). */
  start?: KmeansStart;
  /**
   * After Lloyd's iterations in every restart, move single rows to another segment while that
   * lowers the within-SS (Hartigan's rule; default true). Reaches the best optimum more often;
   * false gives plain Lloyd.
   */
  refine?: boolean;
  /** Called after each restart. */
  onProgress?: ProgressCallback;
  /** @internal Record the within-SS after every centre update of the kept restart (tests). */
  trace?: boolean;
}

export interface KmeansResult {
  readonly kind: 'kmeans';
  /** 'lloyd' for full-batch runs, 'mini-batch' for kmeansMiniBatch. */
  readonly variant: 'lloyd' | 'mini-batch';
  readonly k: number;
  /** Segment of each row, 0..k-1. */
  readonly assignment: Int32Array;
  /** Centre of each segment (the mean of its rows). */
  readonly centers: number[][];
  readonly sizes: number[];
  /** Within-segment sum of squared Euclidean distances to the centres. */
  readonly withinSS: number;
  readonly withinSSBySegment: number[];
  /** Σ size × squared distance of each centre to the grand mean. */
  readonly betweenSS: number;
  /** Σ squared distance of each row to the grand mean (= withinSS + betweenSS up to rounding). */
  readonly totalSS: number;
  /** Centre updates of the kept restart. */
  readonly iterations: number;
  /** Whether the kept restart stopped within tolerance before maxIterations. */
  readonly converged: boolean;
  readonly restartsRun: number;
  /** Rows moved by single transfers after Lloyd in the kept restart (0 with refine: false). */
  readonly refinedRows: number;
  /** Within-SS reached by each restart, in order. */
  readonly restartWithinSS: number[];
  /** @internal Per-update within-SS of the kept restart, when `trace` was asked for. */
  readonly withinSSTrace?: number[];
}

const KMEANS_OPTIONS = ['k', 'seed', 'restarts', 'maxIterations', 'tolerance', 'start', 'refine', 'onProgress', 'trace'] as const;

/**
 * Partition rows into k segments by k-means.
 *
 * The kept restart ends with a full exact scan: every row goes to its nearest centre (ties: the
 * lower segment number) and, while that moves any row, the iterations go on with tolerance 0
 * until nothing moves, confirmed by another full scan (these extra updates count in
 * `iterations`, within `maxIterations` in all). So the reported assignment is nearest-centre for
 * the reported centres, which are the means of their rows, and within-SS is computed from them. A segment that goes empty is given the row farthest from its own centre,
 * taking rows in a fixed order (see `repairEmpty`).
 */
export function kmeans(rows: RowsInput, options: KmeansOptions): KmeansResult {
  const where = 'kmeans';
  const opts = checkOptions(options, KMEANS_OPTIONS, where);
  checkProgress(opts.onProgress, where);
  const m = partitionRows(rows, where);
  const k = checkSegmentCount(opts.k, m, where);
  const n = m.rows;
  const d = m.cols;
  const maxIterations = checkInteger(opts.maxIterations ?? 300, 'kmeans: maxIterations', 1);
  const tolerance = checkNumber(opts.tolerance ?? 1e-4, 'kmeans: tolerance', 0);
  const start = opts.start ?? 'k-means++';
  const given = typeof start === 'string' ? undefined : givenCentres(start, k, d);
  if (typeof start === 'string' && start !== 'k-means++' && start !== 'random') {
    throw new KinsortError(
      `kmeans: start must be "k-means++", "random" or k given centres (an array of ${k} rows × ${d} numbers); got "${start}".`,
      'bad-option',
    );
  }
  if (given && opts.restarts !== undefined && opts.restarts !== 1) {
    throw new KinsortError(
      `kmeans: restarts = ${opts.restarts} with given centres would repeat the same run; leave restarts out or set it to 1.`,
      'bad-option',
    );
  }
  const restarts = given ? 1 : checkInteger(opts.restarts ?? 10, 'kmeans: restarts', 1);
  const trace = opts.trace === true;
  if (opts.refine !== undefined && typeof opts.refine !== 'boolean') {
    throw new KinsortError(`kmeans: refine must be true or false; got ${describe(opts.refine)}.`, 'bad-option');
  }

  let reported = 0;
  const progress = (done: number) => {
    if (done <= reported) return;
    reported = done;
    report(opts.onProgress, { task: 'k-means restarts', done, total: restarts, detail: `k = ${k}` });
  };
  const run = runKmeans(
    {
      data: m.data,
      n,
      d,
      k,
      start: given ?? (start as 'k-means++' | 'random'),
      seed: opts.seed ?? 0,
      restarts,
      maxIterations,
      relativeTolerance: tolerance,
      refine: opts.refine !== false,
      trace,
    },
    progress,
  );
  progress(restarts);
  return {
    kind: 'kmeans',
    variant: 'lloyd',
    k,
    assignment: run.assignment,
    centers: nestedCentres(run.centres, k, d),
    ...run.figures,
    iterations: run.iterations,
    converged: run.converged,
    restartsRun: restarts,
    refinedRows: run.refinedRows,
    restartWithinSS: run.withinByRestart,
    ...(run.trace ? { withinSSTrace: run.trace } : {}),
  };
}

/** Given starting centres: exactly k rows of d finite numbers. */
export function givenCentres(start: unknown, k: number, d: number): Float64Array {
  if (!Array.isArray(start)) {
    throw new KinsortError(
      `kmeans: start must be "k-means++", "random" or k given centres (an array of ${k} rows × ${d} numbers).`,
      'bad-option',
    );
  }
  const c = toMatrix(start as number[][], { what: 'kmeans: start centres' });
  if (c.rows !== k || c.cols !== d) {
    throw new KinsortError(
      `kmeans: the given start centres are ${c.rows} × ${c.cols}, but k = ${k} and the rows have ${d} columns; give ${k} rows of ${d} numbers.`,
      'bad-option',
    );
  }
  return c.data.slice();
}

export function nestedCentres(centers: Float64Array, k: number, d: number): number[][] {
  const out: number[][] = new Array(k);
  for (let c = 0; c < k; c++) out[c] = Array.from(centers.subarray(c * d, (c + 1) * d));
  return out;
}
