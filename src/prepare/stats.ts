// Column statistics for scaling. Quantiles are type 7 (linear between order statistics), the
// default of numpy.percentile and R's quantile(), from core/quantile.ts.
import { quantileSorted } from '../core/quantile';

export function mean(values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  return sum / values.length;
}

/** Sample standard deviation (divisor n − 1), two-pass. NaN when n < 2. */
export function sampleSd(values: Float64Array): number {
  const n = values.length;
  if (n < 2) return NaN;
  const m = mean(values);
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i] - m;
    ss += d * d;
  }
  return Math.sqrt(ss / (n - 1));
}

export function sortedCopy(values: Float64Array): Float64Array {
  return Float64Array.from(values).sort();
}

export function median(values: Float64Array): number {
  return quantileSorted(sortedCopy(values), 0.5);
}

/** Median absolute deviation from the median, times 1.4826 so it estimates sd for normal data. */
export function scaledMad(values: Float64Array, centre: number): number {
  const dev = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) dev[i] = Math.abs(values[i] - centre);
  return 1.4826 * median(dev);
}

export function minMax(values: Float64Array): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < values.length; i++) {
    if (values[i] < lo) lo = values[i];
    if (values[i] > hi) hi = values[i];
  }
  return [lo, hi];
}
