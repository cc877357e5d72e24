// Principal components of a table's rows: covariance (d × d) in one pass over the centred rows,
// then its symmetric eigen-decomposition. Scores, loadings and variances for views and the scree.
import { KinsortError } from '../../core/errors';
import { Matrix, RowsInput, createMatrix, toMatrix } from '../../core/matrix';
import { checkInteger, checkOptions } from '../../core/options';
import { symmetricEigen } from './eigen';

export interface ProjectOptions {
  /** Number of principal components kept in scores and loadings (default 2, at most the column count). */
  components?: number;
  /** Subtract the column means first (default true). Without it the "variances" are uncentred second moments. */
  center?: boolean;
}

export interface Projection {
  readonly kind: 'projection';
  /** n × components: row i in principal-component coordinates. */
  readonly scores: Matrix;
  /**
   * d × components: column c is the unit eigenvector of component c. Sign convention: the entry
   * of largest absolute value in each column is positive (the first such entry on ties).
   */
  readonly loadings: Matrix;
  /** Variance along every component (all d, largest first; sample variance, divisor n − 1). */
  readonly explainedVariance: number[];
  /** explainedVariance divided by its sum (all d), for a scree view. */
  readonly explainedVarianceRatio: number[];
  /** Column means subtracted before projecting (zeros when center is false). */
  readonly mean: number[];
  /** Number of components kept. */
  readonly components: number;
  readonly featureNames?: readonly string[];
}

const WHERE = 'project';

export function project(rows: RowsInput, options?: ProjectOptions): Projection {
  const opts = checkOptions(options, ['components', 'center'], WHERE);
  const m = toMatrix(rows, { what: WHERE, minRows: 2 });
  const { rows: n, cols: d, data } = m;
  if (d === 0) throw new KinsortError(`${WHERE}: the rows have no columns.`, 'empty');
  const components = checkInteger(opts.components ?? 2, `${WHERE}: components`, 1, d);
  const center = opts.center ?? true;
  if (typeof center !== 'boolean') throw new KinsortError(`${WHERE}: center must be true or false.`, 'bad-option');

  const mean = new Float64Array(d);
  if (center) {
    for (let i = 0; i < n; i++) for (let t = 0; t < d; t++) mean[t] += data[i * d + t];
    for (let t = 0; t < d; t++) mean[t] /= n;
  }
  // Upper triangle of the covariance, one pass over the centred rows, four rows at a time: each
  // entry takes the four rows' products at once, a quarter of the updates of one row at a time.
  const cov = new Float64Array(d * d);
  const centred = new Float64Array(4 * d);
  let i = 0;
  for (; i + 3 < n; i += 4) {
    for (let t = 0; t < 4 * d; t++) centred[t] = data[i * d + t] - mean[t % d];
    for (let a = 0; a < d; a++) {
      const x0 = centred[a];
      const x1 = centred[d + a];
      const x2 = centred[2 * d + a];
      const x3 = centred[3 * d + a];
      const row = a * d;
      for (let b = a; b < d; b++) cov[row + b] += x0 * centred[b] + x1 * centred[d + b] + x2 * centred[2 * d + b] + x3 * centred[3 * d + b];
    }
  }
  for (; i < n; i++) {
    for (let t = 0; t < d; t++) centred[t] = data[i * d + t] - mean[t];
    for (let a = 0; a < d; a++) {
      const ca = centred[a];
      const row = a * d;
      for (let b = a; b < d; b++) cov[row + b] += ca * centred[b];
    }
  }
  for (let a = 0; a < d; a++) {
    for (let b = a; b < d; b++) {
      const value = cov[a * d + b] / (n - 1);
      cov[a * d + b] = value;
      cov[b * d + a] = value;
    }
  }

  const { values, vectors } = symmetricEigen(cov, d);
  fixSigns(vectors, d);
  // Rounding can leave the smallest eigenvalues a hair below 0; a variance cannot be.
  const explainedVariance = Array.from(values, (v) => (v > 0 ? v : 0));
  const sum = explainedVariance.reduce((s, v) => s + v, 0);
  const explainedVarianceRatio = explainedVariance.map((v) => (sum > 0 ? v / sum : 0));

  const loadings = new Float64Array(d * components);
  for (let t = 0; t < d; t++) for (let c = 0; c < components; c++) loadings[t * components + c] = vectors[t * d + c];
  const featureNames = m.colNames;
  const projection: Projection = {
    kind: 'projection',
    scores: createMatrix(0, components),
    loadings: createMatrix(d, components, loadings, { rowLabels: featureNames }),
    explainedVariance,
    explainedVarianceRatio,
    mean: Array.from(mean),
    components,
    featureNames,
  };
  return { ...projection, scores: scoresOf(projection, m) };
}

/** Scores of new rows (same columns, same order) on a fitted projection. */
export function projectNew(projection: Projection, rows: RowsInput): Matrix {
  if (!projection || projection.kind !== 'projection') {
    throw new KinsortError('projectNew: the first argument must be the result of project().', 'bad-argument');
  }
  const m = toMatrix(rows, { what: 'projectNew' });
  if (m.cols !== projection.mean.length) {
    throw new KinsortError(
      `projectNew: the rows have ${m.cols} columns but the projection was fitted on ${projection.mean.length}; give the same columns in the same order.`,
      'bad-input',
    );
  }
  return scoresOf(projection, m);
}

function scoresOf(projection: Projection, m: Matrix): Matrix {
  const { rows: n, cols: d, data } = m;
  const c = projection.components;
  const w = projection.loadings.data;
  const mean = projection.mean;
  const out = new Float64Array(n * c);
  const centred = new Float64Array(d);
  for (let i = 0; i < n; i++) {
    for (let t = 0; t < d; t++) centred[t] = data[i * d + t] - mean[t];
    // Components four at a time: independent sums, each over the columns in order.
    let k = 0;
    for (; k + 3 < c; k += 4) {
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0; // prettier-ignore
      for (let t = 0; t < d; t++) {
        const x = centred[t];
        const wt = t * c + k;
        s0 += x * w[wt];
        s1 += x * w[wt + 1];
        s2 += x * w[wt + 2];
        s3 += x * w[wt + 3];
      }
      out[i * c + k] = s0;
      out[i * c + k + 1] = s1;
      out[i * c + k + 2] = s2;
      out[i * c + k + 3] = s3;
    }
    for (; k < c; k++) {
      let s = 0;
      for (let t = 0; t < d; t++) s += centred[t] * w[t * c + k];
      out[i * c + k] = s;
    }
  }
  return createMatrix(n, c, out, { rowLabels: m.rowLabels });
}

/** Make the largest-magnitude entry of each eigenvector positive, so results do not flip between runs or machines. */
function fixSigns(vectors: Float64Array, d: number): void {
  for (let c = 0; c < d; c++) {
    let best = 0;
    let bestAbs = -1;
    for (let k = 0; k < d; k++) {
      const v = Math.abs(vectors[k * d + c]);
      if (v > bestAbs + 1e-12) {
        bestAbs = v;
        best = k;
      }
    }
    if (vectors[best * d + c] < 0) for (let k = 0; k < d; k++) vectors[k * d + c] = -vectors[k * d + c];
  }
}
