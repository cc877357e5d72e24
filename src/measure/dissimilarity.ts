// All pairwise dissimilarities of a table's rows, stored condensed (SciPy pdist layout).
import { KinsortError } from '../core/errors';
import { Matrix, RowsInput, rowName, toMatrix } from '../core/matrix';
import { MixedTable, isMixedTable } from '../core/mixed';
import { checkOptions } from '../core/options';
import { checkProgress, progressTicker, type ProgressCallback, type Ticker } from '../core/progress';
import { Dissimilarity, guardPairwise, makeDissimilarity } from './condensed';
import { euclideanCondensed } from './parallel';
import { gowerDissimilarity } from './gower';
import { MetricName, PairKernel, checkExponent, checkMetric, checkWeights, cosineFromParts, distanceFunction } from './metrics';

export interface DissimilarityOptions {
  /** euclidean (default for number rows), sqeuclidean, manhattan, chebyshev, minkowski, cosine, correlation, gower (default for a mixed table). */
  metric?: MetricName;
  /** Minkowski exponent, ≥ 1 (Infinity = chebyshev). Only with metric "minkowski". */
  p?: number;
  /** One weight ≥ 0 per column (euclidean, sqeuclidean, manhattan, minkowski, chebyshev, gower). */
  weights?: ArrayLike<number>;
  /** Called about a hundred times as the pairs are computed (task "dissimilarity"). */
  onProgress?: ProgressCallback;
}

const OPTION_NAMES = ['metric', 'p', 'weights', 'onProgress'];
const WHERE = 'dissimilarity';

/**
 * Dissimilarities between all pairs of rows. `input` is `number[][]`, a Matrix, or a MixedTable
 * (Gower). Values follow SciPy's `pdist` definitions; identical rows give exactly 0 for the
 * difference-based metrics. Refuses, before allocating, a matrix that would not fit in memory.
 */
export function dissimilarity(input: RowsInput | MixedTable, options?: DissimilarityOptions): Dissimilarity {
  const opts = checkOptions(options, OPTION_NAMES, WHERE);
  const mixed = isMixedTable(input);
  const metric = checkMetric(opts.metric ?? (mixed ? 'gower' : 'euclidean'), WHERE);
  const p = checkExponent(metric, opts.p, WHERE);
  const onProgress = checkProgress(opts.onProgress, WHERE);
  if (mixed) {
    if (metric !== 'gower') {
      throw new KinsortError(
        `${WHERE}: a mixed table (numeric, binary, categorical, ordinal columns) takes metric "gower", not "${metric}"; ` +
          `or prepare it into numbers (one-hot) first.`,
        'bad-option',
      );
    }
    return gowerDissimilarity(input, opts.weights, WHERE, pairTicker(onProgress, input.rows, 'gower'));
  }
  // Gower skips a missing value (NaN) pair by pair; every other metric refuses it.
  const m = toMatrix(input, { what: WHERE, finite: metric !== 'gower' });
  if (m.cols === 0) throw new KinsortError(`${WHERE}: the rows have no columns.`, 'empty');
  if (metric === 'gower') return gowerDissimilarity(numericTable(m), opts.weights, WHERE, pairTicker(onProgress, m.rows, 'gower'));
  const weights = checkWeights(metric, opts.weights, m.cols, WHERE, (j) =>
    m.colNames?.[j] ? `column "${m.colNames[j]}"` : `column ${j + 1}`,
  );
  guardPairwise(m.rows, WHERE);
  const pairs = (m.rows * (m.rows - 1)) / 2;
  const fast = (metric === 'euclidean' || metric === 'sqeuclidean') && !weights;
  if (fast) {
    // May run as WebAssembly and share its work with a worker thread (output in shared memory).
    const onParts = onProgress
      ? (done: number, total: number) => onProgress({ task: 'dissimilarity', done, total, detail: `${metric}, ${m.rows} rows, in parts` })
      : undefined;
    return makeDissimilarity(m.rows, euclideanCondensed(m.data, m.rows, m.cols, metric === 'euclidean', onParts), metric, m.rowLabels);
  }
  const out = new Float64Array(pairs);
  const tick = pairTicker(onProgress, m.rows, metric);
  if (metric === 'cosine') {
    cosineInto(m, m.data, out, 'cosine', tick);
  } else if (metric === 'correlation') {
    cosineInto(m, centredRows(m), out, 'correlation', tick);
  } else {
    kernelInto(distanceFunction(metric, p, weights), m.data, m.rows, m.cols, out, tick);
  }
  return makeDissimilarity(m.rows, out, metric, m.rowLabels);
}

/** Progress in pairs done, for the loops that go row by row. */
function pairTicker(onProgress: ProgressCallback | undefined, n: number, metric: string): Ticker | undefined {
  return progressTicker(onProgress, 'dissimilarity', (n * (n - 1)) / 2, `${metric}, ${n} rows`);
}

function kernelInto(kernel: PairKernel, data: Float64Array, n: number, d: number, out: Float64Array, tick?: Ticker): void {
  let k = 0;
  for (let i = 0; i < n; i++) {
    const ai = i * d;
    for (let j = i + 1; j < n; j++) out[k++] = kernel(data, ai, data, j * d, d);
    if (tick) tick(k);
  }
}

/** Rows minus their own mean (correlation = cosine of centred rows, as SciPy computes it). */
function centredRows(m: Matrix): Float64Array {
  const { rows: n, cols: d, data } = m;
  const out = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    let mean = 0;
    for (let t = 0; t < d; t++) mean += data[i * d + t];
    mean /= d;
    for (let t = 0; t < d; t++) out[i * d + t] = data[i * d + t] - mean;
  }
  return out;
}

function cosineInto(m: Matrix, data: Float64Array, out: Float64Array, metric: 'cosine' | 'correlation', tick?: Ticker): void {
  const { rows: n, cols: d } = m;
  const norms = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let t = 0; t < d; t++) s += data[i * d + t] * data[i * d + t];
    if (!(s > 0)) {
      throw new KinsortError(
        metric === 'cosine'
          ? `${WHERE}: ${rowName(m, i)} is all zeros, so its cosine dissimilarity is undefined; drop the row or use another metric.`
          : `${WHERE}: ${rowName(m, i)} has the same value in every column, so its correlation with other rows is undefined; drop the row or use another metric.`,
        'bad-input',
      );
    }
    norms[i] = Math.sqrt(s);
  }
  let k = 0;
  for (let i = 0; i < n; i++) {
    const ai = i * d;
    for (let j = i + 1; j < n; j++) {
      const bj = j * d;
      let dot = 0;
      for (let t = 0; t < d; t++) dot += data[ai + t] * data[bj + t];
      out[k++] = cosineFromParts(dot, norms[i], norms[j]);
    }
    if (tick) tick(k);
  }
}

/** A numeric matrix seen as a mixed table of numeric columns (Gower on numbers only). */
function numericTable(m: Matrix): MixedTable {
  const columns = [];
  for (let j = 0; j < m.cols; j++) {
    const values = new Float64Array(m.rows);
    for (let i = 0; i < m.rows; i++) values[i] = m.data[i * m.cols + j];
    columns.push({ name: m.colNames?.[j] ?? `column ${j + 1}`, kind: 'numeric' as const, values });
  }
  return { kind: 'mixed', rows: m.rows, columns, rowLabels: m.rowLabels };
}
