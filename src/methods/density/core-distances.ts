// Core distances (Campello, Moulavi & Sander 2013): the distance from each row to its
// `minSamples`-th nearest row, the row itself counted as the first (distance 0). This is R
// dbscan's convention too (its `coredist` takes the (minPts − 1)-th neighbour other than the row).
// O(n²) pair evaluations, O(n) extra memory: one buffer of distances reused for every row.
import { PairSource } from './pair-source';

export function coreDistances(source: PairSource, minSamples: number): Float64Array {
  const n = source.size;
  const core = new Float64Array(n);
  // The row itself is the first neighbour: with minSamples = 1 every core distance is 0.
  const rank = minSamples - 2;
  if (rank < 0) return core;
  const buffer = new Float64Array(n - 1);
  for (let i = 0; i < n; i++) {
    let c = 0;
    for (let j = 0; j < n; j++) if (j !== i) buffer[c++] = source.pair(i, j);
    core[i] = selectRank(buffer, rank);
  }
  return core;
}

/** The value of rank `k` (0-based) in increasing order; reorders `values` (Hoare's selection). */
export function selectRank(values: Float64Array, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    const pivot = values[(lo + hi) >>> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i];
        values[i] = values[j];
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return values[k];
  }
  return values[k];
}
