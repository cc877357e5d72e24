// Bootstrap stability of segments (Hennig 2007): draw n rows with replacement, segment the
// resample again, and for each original segment take the largest Jaccard similarity with any new
// segment, both restricted to the distinct rows that were drawn. A segment that keeps coming back
// has a mean Jaccard near 1; one that dissolves scores low.
import { compactLabels, AssignmentInput } from '../core/assignment';
import { KinsortError, checkChoice } from '../core/errors';
import { Matrix, RowsInput, takeRows, toMatrix } from '../core/matrix';
import { Dissimilarity, isDissimilarity, makeDissimilarity } from '../measure/condensed';
import type { MetricName } from '../measure/metrics';
import { kmedoids } from '../methods/partition/kmedoids';
import { checkInteger, checkOptions } from '../core/options';
import { ProgressCallback, report } from '../core/progress';
import { kmeans } from '../methods/partition/kmeans';
import { createRandom, Seed } from '../random';
import { gaussianMixture, type CovarianceShape } from '../methods/mixture';

export const STABILITY_METHODS = ['kmeans', 'kmedoids', 'mixture'] as const;
export type StabilityMethod = (typeof STABILITY_METHODS)[number];

export interface BootstrapStabilityOptions {
  /** Number of segments; taken from `assignment` when that is given. */
  k?: number;
  /** Number of bootstrap resamples (default 50). */
  resamples?: number;
  seed?: Seed;
  /** How the original rows and each resample are segmented (default 'kmeans'). */
  method?: StabilityMethod;
  /** Restarts per fit (default 5; k-means and mixtures). */
  restarts?: number;
  /** Metric for k-medoids on rows (default 'euclidean'); a dissimilarity given carries its own. */
  metric?: MetricName;
  /** Covariance shape of the Gaussian mixture refits (method 'mixture'; default 'full'). */
  covariance?: CovarianceShape;
  /** The original segmentation to judge; by default the method is run on all rows. */
  assignment?: AssignmentInput;
  onProgress?: ProgressCallback;
}

/** Short name used by the fluent layer. */
export type StabilityResult = BootstrapStabilityResult;

export type StabilityReading = 'stable' | 'doubtful' | 'unstable';

export interface BootstrapStabilityResult {
  readonly method: StabilityMethod;
  readonly k: number;
  /** The original segmentation (0..k-1) that was judged. */
  readonly assignment: Int32Array;
  /** Mean over resamples of each segment's best Jaccard similarity. */
  readonly jaccard: number[];
  /** Share of resamples in which the segment's best Jaccard was below 0.5. */
  readonly dissolved: number[];
  /** Share of resamples in which the segment's best Jaccard was at least 0.75. */
  readonly recovered: number[];
  readonly reading: StabilityReading[];
  /** Best Jaccard per segment (rows) and resample (columns); NaN where no row of the segment was drawn. */
  readonly jaccardByResample: number[][];
  readonly resamples: number;
}

// Reading of the mean Jaccard (common practice, after Hennig 2007): below 0.6 the segment is not
// stable, from 0.75 it is; in between it is doubtful.
export const UNSTABLE_BELOW = 0.6;
export const STABLE_FROM = 0.75;
const DISSOLVED_BELOW = 0.5;

const OPTIONS = ['k', 'resamples', 'seed', 'method', 'restarts', 'metric', 'covariance', 'assignment', 'onProgress'] as const;

/** The data being resampled: rows, or a dissimilarity (k-medoids only). */
type Source = { kind: 'rows'; m: Matrix } | { kind: 'dissimilarity'; d: Dissimilarity };
/** Segment the rows at `indices` (with repeats) into k; returns one label per index. */
type Segmenter = (indices: Int32Array | null, k: number, seed: number) => Int32Array;

/** The dissimilarity among the rows at `indices`, in that order (repeats give distance 0). */
function subDissimilarity(d: Dissimilarity, indices: Int32Array): Dissimilarity {
  const n = indices.length;
  const out = new Float64Array((n * (n - 1)) / 2);
  let p = 0;
  for (let a = 0; a < n - 1; a++) {
    const i = indices[a];
    for (let b = a + 1; b < n; b++) out[p++] = d.get(i, indices[b]);
  }
  return makeDissimilarity(n, out, d.metric);
}

function segmenterFor(
  source: Source,
  method: StabilityMethod,
  restarts: number,
  metric: MetricName | undefined,
  covariance: CovarianceShape | undefined,
): Segmenter {
  if (source.kind === 'dissimilarity') {
    const d = source.d;
    return (indices, k) => kmedoids(indices ? subDissimilarity(d, indices) : d, { k }).assignment;
  }
  const m = source.m;
  if (method === 'kmeans') return (indices, k, seed) => kmeans(indices ? takeRows(m, indices) : m, { k, seed, restarts }).assignment;
  if (method === 'mixture') {
    return (indices, k, seed) => gaussianMixture(indices ? takeRows(m, indices) : m, { k, seed, restarts, covariance }).assignment;
  }
  return (indices, k) => kmedoids(indices ? takeRows(m, indices) : m, { k, metric }).assignment;
}

/**
 * Bootstrap stability of a segmentation. `rowsOrDissimilarity` may be a dissimilarity only with
 * method 'kmedoids' (PAM is deterministic, so resamples differ only in the rows drawn).
 */
export function bootstrapStability(
  rowsOrDissimilarity: RowsInput | Dissimilarity,
  options: BootstrapStabilityOptions,
): BootstrapStabilityResult {
  const where = 'bootstrapStability';
  const opts = checkOptions(options, OPTIONS, where);
  const method = checkChoice(opts.method ?? 'kmeans', STABILITY_METHODS, `${where} method`);
  let source: Source;
  let n: number;
  if (isDissimilarity(rowsOrDissimilarity)) {
    if (method !== 'kmedoids') {
      throw new KinsortError(
        `${where}: ${method === 'mixture' ? 'a Gaussian mixture' : 'k-means'} needs rows, but a dissimilarity was given; use method "kmedoids" with a dissimilarity, or pass the rows.`,
        'bad-option',
      );
    }
    source = { kind: 'dissimilarity', d: rowsOrDissimilarity };
    n = rowsOrDissimilarity.size;
  } else {
    const m = toMatrix(rowsOrDissimilarity, { what: `${where} rows`, minRows: 2 });
    source = { kind: 'rows', m };
    n = m.rows;
  }
  const restarts = checkInteger(opts.restarts ?? 5, `${where}: restarts`, 1);
  const resamples = checkInteger(opts.resamples ?? 50, `${where}: resamples`, 1);
  const root = createRandom(opts.seed ?? 0);
  const segment = segmenterFor(source, method, restarts, opts.metric, opts.covariance);

  let original: Int32Array;
  let k: number;
  if (opts.assignment !== undefined) {
    const compact = compactLabels(opts.assignment, n, where);
    k = compact.k;
    if (opts.k !== undefined && opts.k !== k) {
      throw new KinsortError(
        `${where}: k = ${opts.k} but the assignment given has ${k} segments; leave k out or make them agree.`,
        'bad-k',
      );
    }
    original = compact.labels;
  } else {
    if (opts.k === undefined) {
      throw new KinsortError(`${where}: give k (number of segments) or an assignment to judge, e.g. { k: 3 }.`, 'bad-k');
    }
    k = checkInteger(opts.k, `${where}: k`, 1, n);
    original = segment(null, k, root.fork('original').uint32());
  }

  const byResample: number[][] = Array.from({ length: k }, () => new Array<number>(resamples).fill(NaN));
  const drawnAt = new Int32Array(n).fill(-1); // resample in which row i was last seen
  const indices = new Int32Array(n);
  for (let b = 0; b < resamples; b++) {
    const random = root.fork(`resample ${b}`);
    for (let r = 0; r < n; r++) indices[r] = random.int(n);
    const fit = segment(indices, k, random.uint32());
    const best = bestJaccardBySegment(original, k, indices, fit, k, drawnAt, b);
    for (let c = 0; c < k; c++) byResample[c][b] = best[c];
    report(opts.onProgress, { task: 'bootstrap resamples', done: b + 1, total: resamples, detail: `k = ${k}` });
  }

  const jaccard: number[] = [];
  const dissolved: number[] = [];
  const recovered: number[] = [];
  const reading: StabilityReading[] = [];
  for (let c = 0; c < k; c++) {
    const seen = byResample[c].filter((v) => !Number.isNaN(v));
    const mean = seen.length ? seen.reduce((s, v) => s + v, 0) / seen.length : NaN;
    jaccard.push(mean);
    dissolved.push(seen.length ? seen.filter((v) => v < DISSOLVED_BELOW).length / seen.length : NaN);
    recovered.push(seen.length ? seen.filter((v) => v >= STABLE_FROM).length / seen.length : NaN);
    reading.push(mean >= STABLE_FROM ? 'stable' : mean >= UNSTABLE_BELOW ? 'doubtful' : 'unstable');
  }
  return { method, k, assignment: original, jaccard, dissolved, recovered, reading, jaccardByResample: byResample, resamples };
}

/**
 * For each original segment (labels 0..k-1 of `original`, indexed by row), the largest Jaccard
 * similarity with any segment of a refit (`fit[r]` in 0..kFit-1 is the new segment of row
 * `indices[r]`), both restricted to the distinct rows drawn; NaN for a segment none of whose rows
 * was drawn. A row drawn twice is one entity: its first copy's new segment stands. `drawnAt` is
 * scratch of one entry per row, marked with `stamp` (distinct per call, never -1).
 */
export function bestJaccardBySegment(
  original: Int32Array,
  k: number,
  indices: Int32Array,
  fit: Int32Array,
  kFit: number,
  drawnAt: Int32Array,
  stamp: number,
): Float64Array {
  const intersection = new Float64Array(k * kFit);
  const newSizes = new Float64Array(kFit);
  const keptSizes = new Float64Array(k);
  for (let r = 0; r < indices.length; r++) {
    const i = indices[r];
    if (drawnAt[i] === stamp) continue;
    drawnAt[i] = stamp;
    const c = original[i];
    keptSizes[c]++;
    newSizes[fit[r]]++;
    intersection[c * kFit + fit[r]]++;
  }
  const best = new Float64Array(k).fill(NaN);
  for (let c = 0; c < k; c++) {
    if (keptSizes[c] === 0) continue; // segment not drawn: no evidence from this resample
    let top = 0;
    for (let d = 0; d < kFit; d++) {
      const both = intersection[c * kFit + d];
      if (both === 0) continue;
      const jaccard = both / (keptSizes[c] + newSizes[d] - both);
      if (jaccard > top) top = jaccard;
    }
    best[c] = top;
  }
  return best;
}
