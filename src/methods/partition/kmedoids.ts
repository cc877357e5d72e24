// k-medoids by PAM on any dissimilarity (Gower included) or on rows with a chosen metric.
import { KinsortError } from '../../core/errors';
import { isMatrix, type RowsInput } from '../../core/matrix';
import { checkInteger, checkOptions, describe } from '../../core/options';
import { checkProgress, report, type ProgressCallback } from '../../core/progress';
import { isDissimilarity, type Dissimilarity } from '../../measure/condensed';
import { dissimilarity } from '../../measure/dissimilarity';
import type { MetricName } from '../../measure/metrics';
import type { Seed } from '../../random';
import { checkSegmentCount, partitionRows } from './partition-input';
import { pamBuild, pamState, pamSwap } from './pam';

export interface KmedoidsOptions {
  /** Number of segments (required). */
  k: number;
  /**
   * Accepted for symmetry with kmeans but not used: PAM is deterministic (BUILD has no random
   * step) and ties are broken by row order, so the same input always gives the same medoids.
   */
  seed?: Seed;
  /** Metric when rows are given (default "euclidean"); ignored with a dissimilarity, which carries its own. */
  metric?: MetricName;
  /** Most exchanges in SWAP (default 10,000; each exchange strictly lowers the cost, so it ends). */
  maxSwaps?: number;
  /** Called after each BUILD step and each SWAP pass. */
  onProgress?: ProgressCallback;
}

export interface KmedoidsResult {
  readonly kind: 'kmedoids';
  readonly k: number;
  /** Segment of each row, 0..k-1: the nearest medoid (ties: the lower segment). */
  readonly assignment: Int32Array;
  /** Row index (0-based) of each segment's medoid; segments are numbered in increasing medoid row order. */
  readonly medoids: number[];
  /** Total dissimilarity of the rows to their medoids (R's cluster::pam reports this divided by n). */
  readonly cost: number;
  /** Total dissimilarity after BUILD, before SWAP. */
  readonly buildCost: number;
  readonly sizes: number[];
  /** Exchanges made by SWAP. */
  readonly swaps: number;
  /** SWAP passes (the last one finds no improving exchange unless maxSwaps stopped it). */
  readonly iterations: number;
  /** The metric of the dissimilarity used. */
  readonly metric: string;
}

const KMEDOIDS_OPTIONS = ['k', 'seed', 'metric', 'maxSwaps', 'onProgress'] as const;

/**
 * Partition into k segments around k medoids (actual rows), minimising the total dissimilarity
 * of every row to its segment's medoid.
 */
export function kmedoids(input: RowsInput | Dissimilarity, options: KmedoidsOptions): KmedoidsResult {
  const where = 'kmedoids';
  const opts = checkOptions(options, KMEDOIDS_OPTIONS, where);
  checkProgress(opts.onProgress, where);
  let diss: Dissimilarity;
  if (isDissimilarity(input)) {
    if (opts.metric !== undefined && opts.metric !== input.metric) {
      throw new KinsortError(
        `kmedoids: metric "${opts.metric}" was given with a dissimilarity already computed as "${input.metric}"; leave metric out.`,
        'bad-option',
      );
    }
    diss = input;
    checkCountForDissimilarity(opts.k, diss.size);
    checkDistinctInDissimilarity(opts.k, diss);
  } else {
    if (!Array.isArray(input) && !isMatrix(input)) {
      throw new KinsortError('kmedoids: give rows (number[][] or a Matrix) or a dissimilarity.', 'bad-input');
    }
    const m = partitionRows(input, where);
    checkSegmentCount(opts.k, m, where);
    diss = dissimilarity(m, { metric: opts.metric ?? 'euclidean' });
  }
  const k = opts.k;
  const n = diss.size;
  const maxSwaps = checkInteger(opts.maxSwaps ?? 10_000, 'kmedoids: maxSwaps', 0);
  const condensed = diss.condensed;

  const built = n === 1 ? [0] : pamBuild(condensed, n, k, (done) => report(opts.onProgress, { task: 'k-medoids BUILD', done, total: k }));
  const buildCost = n === 1 ? 0 : pamState(condensed, n, built).cost;
  const run =
    n === 1
      ? { state: { medoids: [0], nearest: new Int32Array(1), cost: 0 }, swaps: 0, passes: 0 }
      : pamSwap(condensed, n, built, maxSwaps, (passes, swaps) =>
          report(opts.onProgress, { task: 'k-medoids SWAP passes', done: passes, total: passes, detail: `${swaps} exchanges so far` }),
        );
  const assignment = Int32Array.from(run.state.nearest);
  const sizes = new Array<number>(k).fill(0);
  for (let i = 0; i < n; i++) sizes[assignment[i]]++;
  return {
    kind: 'kmedoids',
    k,
    assignment,
    medoids: run.state.medoids.slice(),
    cost: run.state.cost,
    buildCost,
    sizes,
    swaps: run.swaps,
    iterations: run.passes,
    metric: diss.metric,
  };
}

/**
 * k at most the number of distinct rows (rows at dissimilarity 0 count once), as k-means and
 * k-medoids on rows require: otherwise some segments stay empty. Compares each row with one
 * representative per group found so far and stops at k groups, so the usual case is cheap.
 */
function checkDistinctInDissimilarity(k: number, diss: Dissimilarity): void {
  const n = diss.size;
  const representatives: number[] = [];
  for (let i = 0; i < n && representatives.length < k; i++) {
    if (representatives.every((r) => diss.get(r, i) > 0)) representatives.push(i);
  }
  if (representatives.length < k) {
    throw new KinsortError(
      `kmedoids: k = ${k} but the ${n} rows hold only ${representatives.length} distinct rows (rows at dissimilarity 0 count once); ` +
        `k can be at most ${representatives.length} (each segment needs a row of its own).`,
      'bad-k',
    );
  }
}

function checkCountForDissimilarity(k: unknown, n: number): void {
  if (k === undefined) throw new KinsortError('kmedoids: the option k (number of segments) is required, e.g. { k: 3 }.', 'bad-k');
  if (typeof k !== 'number' || !Number.isInteger(k) || k < 1 || k > n) {
    throw new KinsortError(
      `kmedoids: k must be a whole number from 1 to ${n} (the rows of the dissimilarity); got ${describe(k)}.`,
      'bad-k',
    );
  }
}
