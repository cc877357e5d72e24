// Silhouettes (Rousseeuw 1987): for each row, a = mean dissimilarity to the other rows of its own
// segment, b = smallest mean dissimilarity to the rows of another segment, s = (b - a) / max(a, b).
// A row alone in its segment gets s = 0 (the convention of R cluster::silhouette and scikit-learn).
//
// From rows the n × n matrix is never built: pairs are streamed in tiles (each pair once) and only
// per-row, per-segment sums of distances are kept — n · k doubles.
import { checkProgress, progressTicker, type ProgressCallback, type Ticker } from '../core/progress';
import { compactLabels, requireSegments, AssignmentInput } from '../core/assignment';
import { checkChoice, KinsortError } from '../core/errors';
import { RowsInput, toMatrix, Matrix } from '../core/matrix';
import { checkOptions } from '../core/options';
import { Dissimilarity, isDissimilarity } from '../measure/condensed';

/** Metrics the silhouette can stream straight from rows; for others, pass a dissimilarity. */
export const SILHOUETTE_ROW_METRICS = ['euclidean', 'sqeuclidean', 'manhattan'] as const;
export type SilhouetteRowMetric = (typeof SILHOUETTE_ROW_METRICS)[number];

export interface SilhouetteOptions {
  /** Distance between rows when rows (not a dissimilarity) are given. Default 'euclidean'. */
  metric?: SilhouetteRowMetric;
  /** Called about a hundred times as the rows' distance sums are gathered (task "silhouette"). */
  onProgress?: ProgressCallback;
}

export interface SilhouetteResult {
  /** s(i) for every row, in [-1, 1]. */
  readonly values: Float64Array;
  /** Mean of all s(i) (singletons count as 0). */
  readonly average: number;
  /** Mean s(i) per segment, in the order of the compacted labels 0..k-1. */
  readonly bySegment: number[];
  /** For each row the nearest other segment (compacted label 0..k-1): the one that gives b. */
  readonly neighbour: Int32Array;
  /** The caller's label for each compacted segment (sorted increasing). */
  readonly segmentLabels: number[];
}

/** Silhouette of an assignment, from rows (streamed, metric chosen) or from a dissimilarity. */
export function silhouette(
  rowsOrDissimilarity: RowsInput | Dissimilarity,
  assignment: AssignmentInput,
  options?: SilhouetteOptions,
): SilhouetteResult {
  const opts = checkOptions(options, ['metric', 'onProgress'], 'silhouette');
  const onProgress = checkProgress(opts.onProgress, 'silhouette');
  let n: number;
  let sumsOf: (labels: Int32Array, k: number) => Float64Array;
  if (isDissimilarity(rowsOrDissimilarity)) {
    if (opts.metric !== undefined) {
      throw new KinsortError(
        `silhouette: the metric option applies to rows only; the dissimilarity given already uses "${rowsOrDissimilarity.metric}".`,
        'bad-option',
      );
    }
    const diss = rowsOrDissimilarity;
    n = diss.size;
    sumsOf = (labels, k) => sumsFromCondensed(diss.condensed, n, labels, k, pairTicker(onProgress, n, ''));
  } else {
    const metric = checkChoice(opts.metric ?? 'euclidean', SILHOUETTE_ROW_METRICS, 'silhouette metric');
    const m = toMatrix(rowsOrDissimilarity, { what: 'silhouette rows' });
    n = m.rows;
    sumsOf = (labels, k) => sumsFromRows(m, labels, k, metric, pairTicker(onProgress, n, `, ${metric}`));
  }
  const compact = compactLabels(assignment, n, 'silhouette', isDissimilarity(rowsOrDissimilarity) ? 'the dissimilarity' : 'the rows');
  requireSegments(compact.k, 2, 'silhouette');
  const sums = sumsOf(compact.labels, compact.k);
  return silhouetteFromSums(sums, compact.labels, compact.sizes, compact.original);
}

/** Progress in pairs of rows summed (task "silhouette"). */
function pairTicker(onProgress: ProgressCallback | undefined, n: number, detail: string): Ticker | undefined {
  return progressTicker(onProgress, 'silhouette', (n * (n - 1)) / 2, `${n} rows${detail}`);
}

/** Pairs (i, j), i < j, whose first row is among the first `rows` of n. */
function pairsBefore(rows: number, n: number): number {
  return rows * n - (rows * (rows + 1)) / 2;
}

/** Turn per-row, per-segment distance sums into silhouettes. */
export function silhouetteFromSums(
  sums: Float64Array,
  labels: Int32Array,
  sizes: Int32Array,
  original: readonly number[],
): SilhouetteResult {
  const n = labels.length;
  const k = sizes.length;
  const values = new Float64Array(n);
  const neighbour = new Int32Array(n);
  const segmentTotal = new Float64Array(k);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const own = labels[i];
    let b = Infinity;
    let nearest = -1;
    for (let c = 0; c < k; c++) {
      if (c === own) continue;
      const mean = sums[i * k + c] / sizes[c];
      if (mean < b) {
        b = mean;
        nearest = c;
      }
    }
    neighbour[i] = nearest;
    let s = 0;
    if (sizes[own] > 1) {
      const a = sums[i * k + own] / (sizes[own] - 1);
      const larger = a > b ? a : b;
      s = larger > 0 ? (b - a) / larger : 0; // a = b = 0: coincident rows, no evidence either way
    }
    values[i] = s;
    segmentTotal[own] += s;
    total += s;
  }
  const bySegment = Array.from(segmentTotal, (t, c) => t / sizes[c]);
  return { values, average: total / n, bySegment, neighbour, segmentLabels: original.slice() };
}

/** Per-row, per-segment sums from a condensed dissimilarity (pairs i<j, row-major). */
function sumsFromCondensed(condensed: Float64Array, n: number, labels: Int32Array, k: number, tick?: Ticker): Float64Array {
  const sums = new Float64Array(n * k);
  let p = 0;
  for (let i = 0; i < n - 1; i++) {
    const li = labels[i];
    const rowI = i * k;
    for (let j = i + 1; j < n; j++) {
      const d = condensed[p++];
      sums[rowI + labels[j]] += d;
      sums[j * k + li] += d;
    }
    if (tick) tick(pairsBefore(i + 1, n));
  }
  if (tick) tick(pairsBefore(n, n));
  return sums;
}

// Tile sizes: a block of TILE_J rows is reused by TILE_I rows of the outer loop while it is
// still in the first-level cache (for d ≤ ~16, TILE_J · d doubles ≈ 32 KB).
const TILE_I = 64;
const TILE_J = 256;

/** Per-row, per-segment distance sums straight from rows, each pair computed once. */
export function sumsFromRows(m: Matrix, labels: Int32Array, k: number, metric: SilhouetteRowMetric, tick?: Ticker): Float64Array {
  const n = m.rows;
  const d = m.cols;
  const x = m.data;
  const sums = new Float64Array(n * k);
  const kind = metric === 'euclidean' ? 0 : metric === 'sqeuclidean' ? 1 : 2;
  for (let i0 = 0; i0 < n; i0 += TILE_I) {
    const i1 = Math.min(n, i0 + TILE_I);
    for (let j0 = i0; j0 < n; j0 += TILE_J) {
      const j1 = Math.min(n, j0 + TILE_J);
      if (kind === 2) manhattanTile(x, d, labels, k, sums, i0, i1, j0, j1);
      else squaredTile(x, d, labels, k, sums, i0, i1, j0, j1, kind === 0);
    }
    // Rows i0..i1 have met every later row; the earlier ones had met them before.
    if (tick) tick(pairsBefore(i1, n));
  }
  return sums;
}

function squaredTile(
  x: Float64Array,
  d: number,
  labels: Int32Array,
  k: number,
  sums: Float64Array,
  i0: number,
  i1: number,
  j0: number,
  j1: number,
  root: boolean,
): void {
  for (let i = i0; i < i1; i++) {
    const li = labels[i];
    const io = i * d;
    const rowI = i * k;
    const start = j0 > i ? j0 : i + 1;
    for (let j = start; j < j1; j++) {
      const jo = j * d;
      let s = 0;
      let c = 0;
      for (; c + 1 < d; c += 2) {
        const t0 = x[io + c] - x[jo + c];
        const t1 = x[io + c + 1] - x[jo + c + 1];
        s += t0 * t0 + t1 * t1;
      }
      if (c < d) {
        const t = x[io + c] - x[jo + c];
        s += t * t;
      }
      const dist = root ? Math.sqrt(s) : s;
      sums[rowI + labels[j]] += dist;
      sums[j * k + li] += dist;
    }
  }
}

function manhattanTile(
  x: Float64Array,
  d: number,
  labels: Int32Array,
  k: number,
  sums: Float64Array,
  i0: number,
  i1: number,
  j0: number,
  j1: number,
): void {
  for (let i = i0; i < i1; i++) {
    const li = labels[i];
    const io = i * d;
    const rowI = i * k;
    const start = j0 > i ? j0 : i + 1;
    for (let j = start; j < j1; j++) {
      const jo = j * d;
      let s = 0;
      for (let c = 0; c < d; c++) s += Math.abs(x[io + c] - x[jo + c]);
      sums[rowI + labels[j]] += s;
      sums[j * k + li] += s;
    }
  }
}
