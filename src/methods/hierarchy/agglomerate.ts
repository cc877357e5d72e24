// agglomerate(): input checks and the choice of algorithm (Müllner 2011):
//   single                       → minimum spanning tree (Prim), from rows without a matrix
//   complete, average, weighted  → nearest-neighbour chain on a condensed matrix
//   ward                         → nearest-neighbour chain; from Euclidean rows on centroids (no matrix)
//   centroid, median             → generic algorithm; from Euclidean rows on centroids (no matrix)
import { KinsortError, checkChoice } from '../../core/errors';
import { Matrix, RowsInput, isMatrix, toMatrix } from '../../core/matrix';
import { checkOptions } from '../../core/options';
import type { ProgressCallback } from '../../core/progress';
import { Dissimilarity, guardPairwise, isDissimilarity, pairOf } from '../../measure/condensed';
import { dissimilarity } from '../../measure/dissimilarity';
import { MetricName, ROW_METRICS, checkExponent, distanceFunction } from '../../measure/metrics';
import { genericLinkage, matrixSpace, vectorSpace } from './generic';
import { RawMerges, relabelInOrder, relabelSorted } from './merges';
import { ReducibleMethod, nnChainOnMatrix } from './nn-chain-matrix';
import { FULL_MATRIX_LIMIT_BYTES, fullEuclidean, nnChainOnFull } from './nn-chain-full';
import { singleFromCondensed, singleFromPairs, singleFromRowsEuclidean } from './single-mst';
import { LinkageMethod, PairSource, Tree, buildTree } from './tree';
import { wardFromVectors } from './ward-vectors';
import { MergeTick, mergeTicker } from './ticker';
import { agglomerationWork } from './work-estimate';
import { checkProgress, report } from '../../core/progress';

export const LINKAGE_METHODS: readonly LinkageMethod[] = ['single', 'complete', 'average', 'weighted', 'centroid', 'median', 'ward'];

export interface AgglomerateOptions {
  /** single, complete, average (UPGMA), weighted (WPGMA), centroid (UPGMC), median (WPGMC), ward. */
  method: LinkageMethod;
  /** For rows only: the metric (default euclidean). A Dissimilarity carries its own. */
  metric?: MetricName;
  /** Minkowski exponent, with metric "minkowski". */
  p?: number;
  /** Called about a hundred times with merges done / n-1 (task "agglomerating"). */
  onProgress?: ProgressCallback;
}

const WHERE = 'agglomerate';
const EUCLIDEAN_ONLY: readonly LinkageMethod[] = ['ward', 'centroid', 'median'];

/**
 * Build a hierarchy by repeatedly joining the two closest clusters.
 *
 * `input` is rows (`number[][]` or a Matrix; a `number[][]` is always read as rows, one entity
 * each — wrap a ready-made dissimilarity with `fromCondensed`) or a Dissimilarity. Heights are on
 * the dissimilarity's scale; for ward, centroid and median they are Euclidean distances (not
 * squared), as SciPy reports them. Equal dissimilarities are resolved deterministically: scans run
 * over clusters in increasing index and keep the first minimum; a merged cluster takes the larger
 * of its two parts' indices; merges of equal height keep the order they were found in.
 */
export function agglomerate(input: RowsInput | Dissimilarity, options: AgglomerateOptions): Tree {
  const opts = checkOptions(options, ['method', 'metric', 'p', 'onProgress'], WHERE);
  if (opts.method === undefined) {
    throw new KinsortError(`${WHERE}: option method is required; choose one of ${LINKAGE_METHODS.join(', ')}.`, 'bad-option');
  }
  const method = prefixed(() => checkChoice(opts.method, LINKAGE_METHODS, 'method'));
  const onProgress = checkProgress(opts.onProgress, WHERE);
  if (isDissimilarity(input)) {
    if (opts.metric !== undefined || opts.p !== undefined) {
      throw new KinsortError(
        `${WHERE}: options metric and p apply to rows; this dissimilarity was already computed (metric "${input.metric}").`,
        'bad-option',
      );
    }
    announce(onProgress, input.size, 1, method);
    return fromDissimilarity(input, method, mergeTicker(onProgress, input.size, method));
  }
  const metric = prefixed(() => checkChoice(opts.metric ?? 'euclidean', ROW_METRICS, 'metric'));
  const p = checkExponent(metric, opts.p, WHERE);
  refuseSquareMatrix(input);
  if (!isMatrix(input) && Array.isArray(input) && input.length < 2) tooFew(input.length);
  const rows = toMatrix(input as RowsInput, { what: `${WHERE}: rows`, minRows: 1 });
  if (rows.rows < 2) tooFew(rows.rows);
  if (rows.cols === 0) throw new KinsortError(`${WHERE}: the rows have no columns.`, 'empty');
  announce(onProgress, rows.rows, rows.cols, method);
  return fromRows(rows, method, metric, p, mergeTicker(onProgress, rows.rows, method));
}

/** The first progress event, before any work: how much work is coming (work-estimate.ts). */
function announce(progress: ProgressCallback | undefined, n: number, coordinates: number, method: string): void {
  report(progress, {
    task: 'agglomerating',
    done: 0,
    total: Math.max(1, n - 1),
    detail: agglomerationWork(n, coordinates, method).summary,
  });
}

function fromRows(rows: Matrix, method: LinkageMethod, metric: MetricName, p: number | undefined, tick: MergeTick | undefined): Tree {
  const n = rows.rows;
  const dims = rows.cols;
  const kernel = distanceFunction(metric, p);
  const data = rows.data;
  const source: PairSource = { kind: 'pairs', pair: (i, j) => kernel(data, i * dims, data, j * dims, dims) };
  const finish = (raw: RawMerges, sorted: boolean) =>
    buildTree(sorted ? relabelSorted(n, raw) : relabelInOrder(n, raw), n, method, metric, source, rows.rowLabels);

  if (EUCLIDEAN_ONLY.includes(method)) {
    if (metric !== 'euclidean') throw notEuclidean(method, `metric "${metric}"`);
    const points = Float64Array.from(data);
    if (method === 'ward') return finish(wardFromVectors(n, dims, points, tick), true);
    return finish(genericLinkage(n, vectorSpace(dims, points, method as 'centroid' | 'median'), tick), false);
  }
  if (method === 'single') {
    const raw = metric === 'euclidean' ? singleFromRowsEuclidean(n, dims, data, tick) : singleFromPairs(n, source.pair, tick);
    return finish(raw, true);
  }
  const reducibleMethod = method as ReducibleMethod;
  // Both routes below hold at least the condensed matrix: ask the memory budget first.
  guardPairwise(n, WHERE);
  if (metric === 'euclidean' && n * n * 8 <= FULL_MATRIX_LIMIT_BYTES) {
    // A full n × n array makes every chain scan contiguous; worth its double memory while it fits.
    const full = allocateOrUndefined(() => fullEuclidean(n, dims, data));
    if (full) return finish(nnChainOnFull(n, full, reducibleMethod, tick), true);
  }
  const d = dissimilarity(rows, { metric, p });
  return finish(nnChainCondensed(n, d.condensed, reducibleMethod, true, tick), true);
}

/**
 * Ward, centroid and median linkage square the dissimilarities: beyond 1e150 the squares overflow
 * to Infinity and the merge loop can never finish, so refuse first.
 */
function refuseOverflowingSquares(d: Dissimilarity, method: LinkageMethod): void {
  const values = d.condensed;
  for (let k = 0; k < values.length; k++) {
    if (values[k] > 1e150) {
      const [i, j] = pairOf(d.size, k);
      throw new KinsortError(
        `${WHERE}: the dissimilarity between ${nameOf(d, i)} and ${nameOf(d, j)} is ${values[k]}; ${method} linkage squares ` +
          `dissimilarities, and beyond 1e150 the squares overflow. Rescale the dissimilarities (or the rows) first.`,
        'bad-dissimilarity',
      );
    }
  }
}

function fromDissimilarity(d: Dissimilarity, method: LinkageMethod, tick: MergeTick | undefined): Tree {
  const n = d.size;
  if (!Number.isInteger(n) || n < 2 || d.condensed.length !== (n * (n - 1)) / 2) {
    if (Number.isInteger(n) && n < 2) tooFew(n);
    throw new KinsortError(
      `${WHERE}: the dissimilarity says ${d.size} rows but holds ${d.condensed.length} values (n(n-1)/2 expected); build it with fromCondensed.`,
      'bad-dissimilarity',
    );
  }
  const values = d.condensed;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (!(v >= 0) || v === Infinity) {
      const [i, j] = pairOf(n, k);
      throw new KinsortError(
        `${WHERE}: the dissimilarity between ${nameOf(d, i)} and ${nameOf(d, j)} is ${v}; dissimilarities must be finite and ≥ 0.`,
        'bad-dissimilarity',
      );
    }
  }
  if (EUCLIDEAN_ONLY.includes(method) && d.metric !== 'euclidean') throw notEuclidean(method, `a dissimilarity with metric "${d.metric}"`);
  if (EUCLIDEAN_ONLY.includes(method)) refuseOverflowingSquares(d, method);
  const source: PairSource = { kind: 'dissimilarity', dissimilarity: d };
  const finish = (raw: RawMerges, sorted: boolean) =>
    buildTree(sorted ? relabelSorted(n, raw) : relabelInOrder(n, raw), n, method, d.metric, source, d.labels);

  if (method === 'single') return finish(singleFromCondensed(n, values, tick), true);
  if (method === 'centroid' || method === 'median') {
    const work = Float64Array.from(values);
    for (let k = 0; k < work.length; k++) work[k] *= work[k];
    return finish(genericLinkage(n, matrixSpace(n, work, method), tick), false);
  }
  return finish(nnChainCondensed(n, values, method, false, tick), true);
}

/** NN-chain on the condensed layout. `owned`: the array is ours to overwrite. Ward works on squares. */
function nnChainCondensed(
  n: number,
  condensed: Float64Array,
  method: ReducibleMethod,
  owned: boolean,
  tick: MergeTick | undefined,
): RawMerges {
  const work = owned ? condensed : Float64Array.from(condensed);
  if (method === 'ward') for (let k = 0; k < work.length; k++) work[k] *= work[k];
  return nnChainOnMatrix(n, work, method, tick);
}

/** Run an allocation that may not fit; undefined instead of the RangeError, so a leaner route can run. */
function allocateOrUndefined(build: () => Float64Array): Float64Array | undefined {
  try {
    return build();
  } catch (e) {
    if (e instanceof RangeError) return undefined;
    throw e;
  }
}

function notEuclidean(method: LinkageMethod, given: string): KinsortError {
  return new KinsortError(
    `${WHERE}: method "${method}" was asked for on ${given}. Ward, centroid and median linkage are defined through ` +
      `cluster centroids in Euclidean space, so on other dissimilarities their heights have no meaning. ` +
      `Use method "average", "complete" or "single" on this dissimilarity, or give the rows themselves ` +
      `(metric euclidean). If these values really are Euclidean distances, wrap them with ` +
      `fromCondensed(values, { metric: 'euclidean' }).`,
    'bad-option',
  );
}

function tooFew(count: number): never {
  throw new KinsortError(`${WHERE}: ${count} row(s) given; a hierarchy needs at least 2 rows.`, 'empty');
}

function nameOf(d: Dissimilarity, i: number): string {
  const label = d.labels?.[i];
  return label === undefined ? `row ${i + 1}` : `row ${i + 1} (id "${label}")`;
}

/**
 * A square number[][] with a zero diagonal that is symmetric is almost surely a full
 * dissimilarity matrix passed where rows are read; say so rather than cluster its rows.
 */
function refuseSquareMatrix(input: unknown): void {
  if (!Array.isArray(input) || input.length < 3) return;
  const n = input.length;
  for (let i = 0; i < n; i++) {
    const row = input[i];
    if (!Array.isArray(row) || row.length !== n || row[i] !== 0) return;
  }
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (input[i][j] !== input[j][i]) return;
  throw new KinsortError(
    `${WHERE}: the ${n} × ${n} array looks like a full dissimilarity matrix (square, symmetric, zero diagonal), but arrays ` +
      `are read as rows of measurements. Give the pairs as a Dissimilarity: fromCondensed(upper-triangle values in row order). ` +
      `If these really are ${n} rows of ${n} measurements, pass them as a Matrix (toMatrix) instead.`,
    'bad-input',
  );
}

function prefixed<T>(check: () => T): T {
  try {
    return check();
  } catch (e) {
    if (e instanceof KinsortError) throw new KinsortError(`${WHERE}: ${e.message}`, e.code);
    throw e;
  }
}
