// The metric names, their option checks, and a pairwise kernel usable on any two rows stored in
// flat arrays (k-medoids, silhouette on rows and assigning new rows use it without a matrix).
import { KinsortError, checkChoice } from '../core/errors';
import { describe } from '../core/options';
import { squaredDistance } from './squared-distance';

export const ROW_METRICS = ['euclidean', 'sqeuclidean', 'manhattan', 'chebyshev', 'minkowski', 'cosine', 'correlation'] as const;
export type RowMetric = (typeof ROW_METRICS)[number];

export const METRICS = [...ROW_METRICS, 'gower'] as const;
export type MetricName = (typeof METRICS)[number];

/** Metrics whose values are a true metric (triangle inequality holds). */
export const TRUE_METRICS: readonly MetricName[] = ['euclidean', 'manhattan', 'chebyshev', 'minkowski', 'gower'];

/** Metrics that take per-column weights. */
export const WEIGHTED_METRICS: readonly MetricName[] = ['euclidean', 'sqeuclidean', 'manhattan', 'minkowski', 'chebyshev', 'gower'];

/** Kernel: dissimilarity of the row at a[aOffset..aOffset+dims) and the row at b[bOffset..). */
export type PairKernel = (a: Float64Array, aOffset: number, b: Float64Array, bOffset: number, dims: number) => number;

export function checkMetric(metric: unknown, where: string): MetricName {
  try {
    return checkChoice(metric, METRICS, 'metric');
  } catch (e) {
    if (e instanceof KinsortError) throw new KinsortError(`${where}: ${e.message}`, e.code);
    throw e;
  }
}

/**
 * Resolve the Minkowski exponent: required (≥ 1, Infinity allowed) for minkowski, refused for any
 * other metric so a stray `p` is never silently ignored.
 */
export function checkExponent(metric: MetricName, p: unknown, where: string): number | undefined {
  if (metric !== 'minkowski') {
    if (p !== undefined) {
      throw new KinsortError(`${where}: option p (${describe(p)}) applies only to metric "minkowski", not "${metric}".`, 'bad-option');
    }
    return undefined;
  }
  if (p === undefined) {
    throw new KinsortError(`${where}: metric "minkowski" needs option p, a number ≥ 1 (1 = manhattan, 2 = euclidean).`, 'bad-option');
  }
  if (typeof p !== 'number' || Number.isNaN(p) || p < 1) {
    throw new KinsortError(`${where}: minkowski p must be a number ≥ 1 (Infinity allowed); got ${describe(p)}.`, 'bad-option');
  }
  return p;
}

/** Validate per-column weights: `dims` finite values ≥ 0, not all zero. Returns a copy. */
export function checkWeights(
  metric: MetricName,
  weights: unknown,
  dims: number,
  where: string,
  columnName: (j: number) => string = (j) => `column ${j + 1}`,
): Float64Array | undefined {
  if (weights === undefined) return undefined;
  if (!WEIGHTED_METRICS.includes(metric)) {
    throw new KinsortError(
      `${where}: option weights is not available for metric "${metric}"; it applies to ${WEIGHTED_METRICS.join(', ')}.`,
      'bad-option',
    );
  }
  if (!Array.isArray(weights) && !ArrayBuffer.isView(weights)) {
    throw new KinsortError(
      `${where}: weights must be an array of ${dims} numbers, one per column; got ${describe(weights)}.`,
      'bad-option',
    );
  }
  const w = weights as ArrayLike<unknown>;
  if (w.length !== dims) {
    throw new KinsortError(`${where}: ${w.length} weights given for ${dims} columns; give one weight per column.`, 'bad-option');
  }
  const out = new Float64Array(dims);
  let any = false;
  for (let j = 0; j < dims; j++) {
    const v = w[j];
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
      throw new KinsortError(
        `${where}: the weight of ${columnName(j)} is ${describe(v)}; weights must be finite numbers ≥ 0.`,
        'bad-option',
      );
    }
    out[j] = v;
    if (v > 0) any = true;
  }
  if (!any) throw new KinsortError(`${where}: every weight is 0; at least one column must count.`, 'bad-option');
  return out;
}

/**
 * A pairwise kernel for one of the row metrics, following SciPy's definitions
 * (cosine = 1 − cos θ, correlation = 1 − Pearson r). Cosine and correlation compute the norms
 * per call; for all pairs `dissimilarity` precomputes them instead. A zero-norm row gives NaN
 * here (callers that can name the row check first).
 */
export function distanceFunction(metric: RowMetric | string, p?: number, weights?: ArrayLike<number>): PairKernel {
  const m = checkMetric(metric, 'distanceFunction');
  if (m === 'gower') {
    throw new KinsortError(
      'distanceFunction: gower needs the whole table (column ranges); call dissimilarity on a mixed table.',
      'not-supported',
    );
  }
  const exponent = checkExponent(m, p, 'distanceFunction');
  const w = weights === undefined ? undefined : Float64Array.from(weights);
  switch (m) {
    case 'euclidean':
      return w ? weightedMinkowski(w, 2) : euclideanPair;
    case 'sqeuclidean':
      return w ? (a, ao, b, bo, d) => weightedMinkowskiSum(w, 2, a, ao, b, bo, d) : sqeuclideanPair;
    case 'manhattan':
      return w ? weightedMinkowski(w, 1) : manhattanPair;
    case 'chebyshev':
      return w ? weightedChebyshev(w) : chebyshevPair;
    case 'minkowski':
      return minkowskiKernel(exponent!, w);
    case 'cosine':
      return cosinePair;
    case 'correlation':
      return correlationPair;
  }
}

export function euclideanPair(a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  return Math.sqrt(squaredDistance(a, ao, b, bo, d));
}

export const sqeuclideanPair: PairKernel = squaredDistance;

function manhattanPair(a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  let s = 0;
  for (let t = 0; t < d; t++) s += Math.abs(a[ao + t] - b[bo + t]);
  return s;
}

function chebyshevPair(a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  let s = 0;
  for (let t = 0; t < d; t++) {
    const v = Math.abs(a[ao + t] - b[bo + t]);
    if (v > s) s = v;
  }
  return s;
}

function minkowskiKernel(p: number, w: Float64Array | undefined): PairKernel {
  if (p === Infinity) return w ? weightedChebyshev(w) : chebyshevPair;
  if (w) return weightedMinkowski(w, p);
  if (p === 1) return manhattanPair;
  if (p === 2) return euclideanPair;
  const inv = 1 / p;
  return (a, ao, b, bo, d) => {
    let s = 0;
    for (let t = 0; t < d; t++) s += Math.pow(Math.abs(a[ao + t] - b[bo + t]), p);
    return Math.pow(s, inv);
  };
}

function weightedMinkowskiSum(w: Float64Array, p: number, a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  let s = 0;
  if (p === 2) {
    for (let t = 0; t < d; t++) {
      const diff = a[ao + t] - b[bo + t];
      s += w[t] * diff * diff;
    }
  } else if (p === 1) {
    for (let t = 0; t < d; t++) s += w[t] * Math.abs(a[ao + t] - b[bo + t]);
  } else {
    for (let t = 0; t < d; t++) s += w[t] * Math.pow(Math.abs(a[ao + t] - b[bo + t]), p);
  }
  return s;
}

/** SciPy's weighted Minkowski: (Σ w_t |a_t − b_t|^p)^(1/p). */
function weightedMinkowski(w: Float64Array, p: number): PairKernel {
  if (p === 1) return (a, ao, b, bo, d) => weightedMinkowskiSum(w, 1, a, ao, b, bo, d);
  if (p === 2) return (a, ao, b, bo, d) => Math.sqrt(weightedMinkowskiSum(w, 2, a, ao, b, bo, d));
  const inv = 1 / p;
  return (a, ao, b, bo, d) => Math.pow(weightedMinkowskiSum(w, p, a, ao, b, bo, d), inv);
}

/** SciPy's weighted Chebyshev: the largest |a_t − b_t| over columns with weight > 0. */
function weightedChebyshev(w: Float64Array): PairKernel {
  return (a, ao, b, bo, d) => {
    let s = 0;
    for (let t = 0; t < d; t++) {
      if (w[t] <= 0) continue;
      const v = Math.abs(a[ao + t] - b[bo + t]);
      if (v > s) s = v;
    }
    return s;
  };
}

/** 1 − cos from a dot product and two norms, clamped the way SciPy clamps it. */
export function cosineFromParts(dot: number, normA: number, normB: number): number {
  let c = dot / (normA * normB);
  if (c > 1) c = 1;
  else if (c < -1) c = -1;
  return 1 - c;
}

function cosinePair(a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  let dot = 0;
  let na = 0;
  let nb = 0;
  for (let t = 0; t < d; t++) {
    const x = a[ao + t];
    const y = b[bo + t];
    dot += x * y;
    na += x * x;
    nb += y * y;
  }
  return cosineFromParts(dot, Math.sqrt(na), Math.sqrt(nb));
}

function correlationPair(a: Float64Array, ao: number, b: Float64Array, bo: number, d: number): number {
  let ma = 0;
  let mb = 0;
  for (let t = 0; t < d; t++) {
    ma += a[ao + t];
    mb += b[bo + t];
  }
  ma /= d;
  mb /= d;
  let dot = 0;
  let na = 0;
  let nb = 0;
  for (let t = 0; t < d; t++) {
    const x = a[ao + t] - ma;
    const y = b[bo + t] - mb;
    dot += x * y;
    na += x * x;
    nb += y * y;
  }
  return cosineFromParts(dot, Math.sqrt(na), Math.sqrt(nb));
}
