// Nearest segment for prepared rows: flat loops over a Float64Array, ties to the lower segment
// number (strict "<" while scanning segments in order) — the same rule the SQL text uses.
import type { Ticker } from '../core/progress';
import { valueAtPosition } from '../core/quantile';
import { squaredDistance } from '../measure/squared-distance';
import type { DefinitionMetric } from './definition-types';

/** Distance from row i of `data` to centre c of `centers` (both row-major, `dims` wide). */
export function pointToCenter(
  data: Float64Array,
  i: number,
  centers: Float64Array,
  c: number,
  dims: number,
  metric: DefinitionMetric,
): number {
  const a = i * dims;
  const b = c * dims;
  let s = 0;
  if (metric === 'manhattan') {
    for (let j = 0; j < dims; j++) s += Math.abs(data[a + j] - centers[b + j]);
    return s;
  }
  s = squaredDistance(data, a, centers, b, dims);
  return metric === 'euclidean' ? Math.sqrt(s) : s;
}

export interface NearestResult {
  /** 0-based segment per row. */
  readonly segment: Int32Array;
  /** Distance to that segment's centre. */
  readonly distance: Float64Array;
  /** 1 when the row is farther than `farBeyond[c]` from every centre c. */
  readonly far: Uint8Array;
}

/**
 * Nearest centre for each of `rows` rows; `farBeyond` per segment (omitted while building).
 * Euclidean distances are compared as squares (as the SQL does), the root taken once at the end.
 */
export function nearestCenters(
  data: Float64Array,
  rows: number,
  centers: Float64Array,
  k: number,
  dims: number,
  metric: DefinitionMetric,
  farBeyond?: ArrayLike<number>,
  tick?: Ticker,
): NearestResult {
  const segment = new Int32Array(rows);
  const distance = new Float64Array(rows);
  const far = new Uint8Array(rows);
  const compareAs: DefinitionMetric = metric === 'euclidean' ? 'sqeuclidean' : metric;
  const limits = farBeyond ? Float64Array.from(farBeyond, (t) => (metric === 'euclidean' ? t * t : t)) : undefined;
  for (let i = 0; i < rows; i++) {
    let best = 0;
    let bestD = Infinity;
    let farFromAll = 1;
    for (let c = 0; c < k; c++) {
      const d = pointToCenter(data, i, centers, c, dims, compareAs);
      if (d < bestD) {
        bestD = d;
        best = c;
      }
      if (limits && !(d > limits[c])) farFromAll = 0;
    }
    segment[i] = best;
    distance[i] = metric === 'euclidean' ? Math.sqrt(bestD) : bestD;
    far[i] = limits ? farFromAll : 0;
    if (tick) tick(i + 1);
  }
  return { segment, distance, far };
}

/** Percentile p (0..100), type 7 (core/quantile.ts); 0 for no values. */
export function percentile(values: Float64Array, p: number): number {
  if (values.length === 0) return 0;
  const sorted = Float64Array.from(values).sort();
  return valueAtPosition(sorted, ((sorted.length - 1) * p) / 100);
}
