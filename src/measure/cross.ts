// Dissimilarities between every row of one matrix and every row of another (rows to medoids,
// new rows to centres), without a pairwise matrix of either.
import { KinsortError } from '../core/errors';
import { Matrix, RowsInput, rowName, toMatrix } from '../core/matrix';
import { checkOptions } from '../core/options';
import { checkExponent, checkMetric, checkWeights, distanceFunction, RowMetric } from './metrics';

export interface CrossDistanceOptions {
  /** Minkowski exponent, only with metric "minkowski". */
  p?: number;
  /** One weight ≥ 0 per column (euclidean, sqeuclidean, manhattan, minkowski, chebyshev). */
  weights?: ArrayLike<number>;
}

const WHERE = 'crossDistances';

/**
 * `out[i * b.rows + j]` = dissimilarity of row i of `a` and row j of `b` (a.rows × b.rows,
 * row-major). Any row metric except gower, which needs the ranges of a whole table.
 */
export function crossDistances(a: RowsInput, b: RowsInput, metric: RowMetric = 'euclidean', options?: CrossDistanceOptions): Float64Array {
  const opts = checkOptions(options, ['p', 'weights'], WHERE);
  const m = checkMetric(metric, WHERE);
  if (m === 'gower') {
    throw new KinsortError(
      `${WHERE}: gower needs the column ranges of one whole table; compute dissimilarity on a mixed table instead.`,
      'not-supported',
    );
  }
  const p = checkExponent(m, opts.p, WHERE);
  const ma = toMatrix(a, { what: `${WHERE} (first rows)` });
  const mb = toMatrix(b, { what: `${WHERE} (second rows)` });
  if (ma.cols !== mb.cols) {
    throw new KinsortError(
      `${WHERE}: the first rows have ${ma.cols} columns but the second rows have ${mb.cols}; both need the same columns.`,
      'bad-input',
    );
  }
  const weights = checkWeights(m, opts.weights, ma.cols, WHERE);
  if (m === 'cosine' || m === 'correlation') {
    refuseFlatRows(ma, m);
    refuseFlatRows(mb, m);
  }
  const kernel = distanceFunction(m, p, weights);
  const d = ma.cols;
  const out = new Float64Array(ma.rows * mb.rows);
  for (let i = 0; i < ma.rows; i++) {
    const ai = i * d;
    const row = i * mb.rows;
    for (let j = 0; j < mb.rows; j++) out[row + j] = kernel(ma.data, ai, mb.data, j * d, d);
  }
  return out;
}

/** Cosine needs non-zero rows, correlation non-constant rows: name the row rather than return NaN. */
function refuseFlatRows(m: Matrix, metric: 'cosine' | 'correlation'): void {
  const d = m.cols;
  for (let i = 0; i < m.rows; i++) {
    let flat = true;
    const first = m.data[i * d];
    for (let t = 0; t < d && flat; t++) {
      const v = m.data[i * d + t];
      flat = metric === 'cosine' ? v === 0 : v === first;
    }
    if (flat) {
      throw new KinsortError(
        `${WHERE}: ${rowName(m, i)} is ${metric === 'cosine' ? 'all zeros' : 'the same value in every column'}, so its ${metric} dissimilarity is undefined.`,
        'bad-input',
      );
    }
  }
}
