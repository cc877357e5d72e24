// The quantile of sorted values by linear interpolation between order statistics: Hyndman & Fan's
// type 7, the default of R's quantile() and of numpy.percentile. One home for scaling (robust
// scale), profiles (quartiles) and the distance limits of assigned rows.
//
// Reference: R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The American
// Statistician 50(4), 361–365 (1996), doi:10.1080/00031305.1996.10473566.

/**
 * The value at fractional position `h` (0 … n − 1) of ascending `sorted`: sorted[⌊h⌋] plus the
 * fraction of the step to the next one. NaN when there are no values.
 */
export function valueAtPosition(sorted: ArrayLike<number>, h: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  if (n === 1) return sorted[0];
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** Type-7 quantile of ascending `sorted`, p in [0, 1]: the value at position (n − 1) · p. */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  return valueAtPosition(sorted, (sorted.length - 1) * p);
}
