// PAM (Kaufman & Rousseeuw 1990): BUILD picks k medoids greedily, SWAP then exchanges a medoid
// for a non-medoid while that lowers the total dissimilarity, always taking the best exchange of
// the pass ("steepest descent", as R's cluster::pam does). Each pass evaluates all k × (n − k)
// exchanges in O(n²) rather than O(k n²) with the FastPAM1 bookkeeping of Schubert & Rousseeuw
// (2019); the exchange chosen is the same as the plain evaluation's.
//
// Ties follow R's cluster::pam (from memory, and checked against it on a tie-heavy fixture):
// in BUILD the later row wins a tie; in SWAP the first exchange found wins, scanning candidate
// rows in order and, for each, the medoids in row order. Values within 1e-12 of the total are
// treated as ties so that a different summation order cannot change the choice.

/** Row `c` of the full matrix, read from the condensed array, into `out`. */
export function condensedRow(condensed: Float64Array, n: number, c: number, out: Float64Array): void {
  // Pairs (j, c) with j < c sit in earlier rows of the condensed array; (c, j) with j > c are contiguous.
  let index = c - 1;
  for (let j = 0; j < c; j++) {
    out[j] = condensed[index];
    index += n - j - 2;
  }
  out[c] = 0;
  const start = n * c - (c * (c + 1)) / 2;
  for (let j = c + 1; j < n; j++) out[j] = condensed[start + j - c - 1];
}

export interface PamState {
  /** Medoid rows, kept in increasing row order. */
  medoids: number[];
  /** Per row: position in `medoids` of its nearest medoid, its distance, and the second nearest distance. */
  nearest: Int32Array;
  nearestDistance: Float64Array;
  secondDistance: Float64Array;
  cost: number;
}

/** BUILD: the first medoid minimises the total dissimilarity; each next one gains the most. */
export function pamBuild(condensed: Float64Array, n: number, k: number, onStep?: (done: number) => void): number[] {
  const row = new Float64Array(n);
  const closest = new Float64Array(n).fill(Infinity);
  const isMedoid = new Uint8Array(n);
  const medoids: number[] = [];
  let scale = 0;
  for (let t = 0; t < condensed.length; t++) scale += condensed[t];
  const eps = 1e-12 * Math.max(scale, Number.MIN_VALUE);
  for (let step = 0; step < k; step++) {
    let bestGain = -Infinity;
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (isMedoid[i]) continue;
      condensedRow(condensed, n, i, row);
      let gain = 0;
      if (step === 0) {
        for (let j = 0; j < n; j++) gain -= row[j];
      } else {
        for (let j = 0; j < n; j++) {
          const g = closest[j] - row[j];
          if (g > 0) gain += g;
        }
      }
      // Later row wins a tie (≥ within eps).
      if (best < 0 || gain >= bestGain - eps) {
        best = i;
        if (gain > bestGain) bestGain = gain;
      }
    }
    isMedoid[best] = 1;
    medoids.push(best);
    condensedRow(condensed, n, best, row);
    for (let j = 0; j < n; j++) if (row[j] < closest[j]) closest[j] = row[j];
    onStep?.(step + 1);
  }
  return medoids.sort((a, b) => a - b);
}

/** Nearest and second-nearest medoid of every row (ties: the lower medoid row). */
export function pamState(condensed: Float64Array, n: number, medoids: number[]): PamState {
  const k = medoids.length;
  const nearest = new Int32Array(n);
  const nearestDistance = new Float64Array(n).fill(Infinity);
  const secondDistance = new Float64Array(n).fill(Infinity);
  const row = new Float64Array(n);
  for (let m = 0; m < k; m++) {
    condensedRow(condensed, n, medoids[m], row);
    for (let j = 0; j < n; j++) {
      const v = row[j];
      if (v < nearestDistance[j]) {
        secondDistance[j] = nearestDistance[j];
        nearestDistance[j] = v;
        nearest[j] = m;
      } else if (v < secondDistance[j]) {
        secondDistance[j] = v;
      }
    }
  }
  let cost = 0;
  for (let j = 0; j < n; j++) cost += nearestDistance[j];
  return { medoids: medoids.slice(), nearest, nearestDistance, secondDistance, cost };
}

export interface SwapRun {
  state: PamState;
  swaps: number;
  passes: number;
}

/** SWAP with FastPAM1 bookkeeping: best exchange per pass, until none lowers the cost. */
export function pamSwap(condensed: Float64Array, n: number, start: number[], maxSwaps: number, onPass?: (passes: number, swaps: number) => void): SwapRun {
  let state = pamState(condensed, n, start);
  const k = start.length;
  const row = new Float64Array(n);
  const removalLoss = new Float64Array(k);
  const change = new Float64Array(k);
  const isMedoid = new Uint8Array(n);
  let swaps = 0;
  let passes = 0;
  while (swaps < maxSwaps) {
    passes++;
    const { nearest, nearestDistance, secondDistance, medoids } = state;
    isMedoid.fill(0);
    for (const m of medoids) isMedoid[m] = 1;
    // Losing medoid m sends each of its rows to its second nearest medoid.
    removalLoss.fill(0);
    for (let j = 0; j < n; j++) removalLoss[nearest[j]] += secondDistance[j] - nearestDistance[j];
    const eps = 1e-12 * Math.max(state.cost, Number.MIN_VALUE);
    let bestChange = 0;
    let bestCandidate = -1;
    let bestSlot = -1;
    for (let c = 0; c < n; c++) {
      if (isMedoid[c]) continue;
      condensedRow(condensed, n, c, row);
      change.set(removalLoss);
      let shared = 0;
      for (let j = 0; j < n; j++) {
        const dc = row[j];
        const dn = nearestDistance[j];
        if (dc < dn) {
          // Row j moves to the candidate whichever medoid leaves.
          shared += dc - dn;
          change[nearest[j]] += dn - secondDistance[j];
        } else if (dc < secondDistance[j]) {
          // Row j moves to the candidate only if its own medoid leaves.
          change[nearest[j]] += dc - secondDistance[j];
        }
      }
      // Medoids in row order (state.medoids is sorted); the first clearly better exchange wins.
      for (let m = 0; m < k; m++) {
        const total = change[m] + shared;
        if (total < bestChange - eps) {
          bestChange = total;
          bestCandidate = c;
          bestSlot = m;
        }
      }
    }
    onPass?.(passes, swaps);
    if (bestCandidate < 0) break;
    const next = medoids.slice();
    next[bestSlot] = bestCandidate;
    next.sort((a, b) => a - b);
    state = pamState(condensed, n, next);
    swaps++;
  }
  return { state, swaps, passes };
}
