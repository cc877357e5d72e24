// The gap statistic (Tibshirani, Walther & Hastie 2001): how much tighter the k-means segments of
// the data are than those of reference data with no segments, on the log scale.
//   W_k      = Σ_r D_r / (2 n_r) with D_r the sum of squared distances over ordered pairs in
//              segment r — the k-means within-SS.
//   Gap(k)   = mean_b log W*_kb − log W_k over B reference sets drawn uniformly in the
//              principal-axis box of the data (the paper's method (b)).
//   s_k      = sd_k · sqrt(1 + 1/B), sd_k the population standard deviation (1/B, as in the paper)
//              of log W*_kb. (R's cluster::clusGap uses the sample sd, 1/(B−1).)
//   k chosen = the smallest k with Gap(k) ≥ Gap(k+1) − s_(k+1); the largest k tried when none is.
import { KinsortError } from '../core/errors';
import { createMatrix, Matrix, RowsInput, toMatrix } from '../core/matrix';
import { checkInteger, checkOptions } from '../core/options';
import { ProgressCallback, checkProgress, report } from '../core/progress';
import { kmeans } from '../methods/partition/kmeans';
import { createRandom, Random, Seed } from '../random';
import { drawFromBox, principalBox } from './principal-box';

export interface GapStatisticOptions {
  /** Smallest k (default 1: "no segments" is a possible answer). */
  kFrom?: number;
  /** Largest k (required). */
  kTo: number;
  /** Number of reference sets B (default 50). */
  references?: number;
  /** Seed of the reference draws and of k-means (default 0). */
  seed?: Seed;
  /** k-means restarts for each k, on the data and on each reference set (default 10). */
  restarts?: number;
  onProgress?: ProgressCallback;
}

export interface GapRow {
  readonly k: number;
  /** log W_k of the data. */
  readonly logW: number;
  /** Mean log W*_k over the reference sets. */
  readonly expectedLogW: number;
  readonly gap: number;
  /** s_k = sd_k · sqrt(1 + 1/B). */
  readonly se: number;
}

export interface GapStatisticResult {
  readonly table: GapRow[];
  /** The smallest k with Gap(k) ≥ Gap(k+1) − s(k+1) (the largest k tried when none is). */
  readonly recommended: number;
  /** The rule, in words. */
  readonly rule: string;
  readonly references: number;
}

export const GAP_RULE =
  'the smallest k whose gap is at least the gap at k + 1 minus one standard error there (Tibshirani, Walther & Hastie 2001)';

const GAP_OPTIONS = ['kFrom', 'kTo', 'references', 'seed', 'restarts', 'onProgress'] as const;

/** Within-SS of one segmentation into k (k = 1: the total sum of squares). */
export function withinForK(m: Matrix, k: number, seed: Seed, restarts: number): number {
  if (k === 1) {
    const { rows: n, cols: d, data } = m;
    let total = 0;
    for (let j = 0; j < d; j++) {
      let mean = 0;
      for (let i = 0; i < n; i++) mean += data[i * d + j];
      mean /= n;
      for (let i = 0; i < n; i++) {
        const t = data[i * d + j] - mean;
        total += t * t;
      }
    }
    return total;
  }
  return kmeans(m, { k, seed, restarts }).withinSS;
}

export function gapStatistic(rows: RowsInput, options: GapStatisticOptions): GapStatisticResult {
  const where = 'gapStatistic';
  const opts = checkOptions(options, GAP_OPTIONS, where);
  checkProgress(opts.onProgress, where);
  const m = toMatrix(rows, { what: `${where} rows` });
  if (opts.kTo === undefined) {
    throw new KinsortError(`${where}: the option kTo (largest k to try) is required, e.g. { kTo: 8 }.`, 'bad-k');
  }
  const kFrom = checkInteger(opts.kFrom ?? 1, `${where}: kFrom`, 1);
  const kTo = checkInteger(opts.kTo, `${where}: kTo`, kFrom, m.rows);
  const restarts = checkInteger(opts.restarts ?? 10, `${where}: restarts`, 1);
  const seed = opts.seed ?? 0;
  const ks: number[] = [];
  for (let k = kFrom; k <= kTo; k++) ks.push(k);
  const logW = ks.map((k) => Math.log(withinForK(m, k, seed, restarts)));
  return gapFromDataFit(m, ks, logW, { references: opts.references, seed, restarts, onProgress: opts.onProgress }, where);
}

/**
 * The reference part of the gap statistic, given log W_k of the data already (so that a k
 * comparison that has run k-means on the data does not run it again).
 */
export function gapFromDataFit(
  m: Matrix,
  ks: readonly number[],
  logW: readonly number[],
  options: { references?: number; seed: Seed; restarts: number; onProgress?: ProgressCallback },
  where: string,
): GapStatisticResult {
  const references = checkInteger(options.references ?? 50, `${where}: references`, 1);
  const box = principalBox(m);
  const root = createRandom(options.seed);
  const reference = new Float64Array(references * ks.length);
  for (let b = 0; b < references; b++) {
    // Each reference set has its own stream: its draws do not depend on the others.
    const random: Random = root.fork(`gap reference ${b}`);
    const z = createMatrix(m.rows, m.cols, drawFromBox(box, m.rows, random));
    for (let t = 0; t < ks.length; t++) {
      reference[b * ks.length + t] = Math.log(withinForK(z, ks[t], random.uint32(), options.restarts));
    }
    report(options.onProgress, { task: 'gap reference sets', done: b + 1, total: references });
  }
  const table: GapRow[] = ks.map((k, t) => {
    let mean = 0;
    for (let b = 0; b < references; b++) mean += reference[b * ks.length + t];
    mean /= references;
    let squares = 0;
    for (let b = 0; b < references; b++) squares += (reference[b * ks.length + t] - mean) ** 2;
    const sd = Math.sqrt(squares / references);
    return { k, logW: logW[t], expectedLogW: mean, gap: mean - logW[t], se: sd * Math.sqrt(1 + 1 / references) };
  });
  return { table, recommended: gapChoice(table), rule: GAP_RULE, references };
}

/** The smallest k with Gap(k) ≥ Gap(k+1) − s(k+1); the largest k tried when none is. */
export function gapChoice(table: readonly GapRow[]): number {
  for (let t = 0; t + 1 < table.length; t++) {
    if (table[t].gap >= table[t + 1].gap - table[t + 1].se) return table[t].k;
  }
  return table[table.length - 1].k;
}
