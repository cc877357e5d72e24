// PAM (Kaufman & Rousseeuw 1990): BUILD picks k medoids greedily, SWAP then exchanges a medoid
// for a non-medoid while that lowers the total dissimilarity, always taking the best exchange of
// the pass ("steepest descent", as R's cluster::pam does). Each pass evaluates all k × (n − k)
// exchanges in O(n²) rather than O(k n²) with the FastPAM1 bookkeeping of Schubert & Rousseeuw
// (2019); the exchange chosen is the same as the plain evaluation's.
//
// BUILD follows R's cluster::pam (cluster 2.1, src/pam.c, bswap) to the last bit: every row
// starts at a distance "larger than all", 1.1 × the largest dissimilarity + 1; a candidate's
// gain is Σ_j max(0, current_j − d(i, j)) summed in row order (the candidate itself included,
// at distance 0); gains are compared exactly and the later row wins a tie. So the same
// dissimilarities give R's BUILD medoids even where gains tie or differ only by rounding
// (checked on tie-heavy Gower data: test/reference/pam_gower_ties.R).
// In SWAP the first exchange found wins, scanning candidate rows in order and, for each, the
// medoids in row order, as in R; there the change of cost is summed in another order than R's,
// so values within 1e-12 of the total are treated as ties and a summation order cannot change
// the choice.
//
// References:
//   L. Kaufman and P. J. Rousseeuw, "Finding Groups in Data: An Introduction to Cluster
//   Analysis", Wiley (1990), chapter 2, doi:10.1002/9780470316801.
//   E. Schubert and P. J. Rousseeuw, "Faster k-medoids clustering: improving the PAM, CLARA, and
//   CLARANS algorithms", SISAP 2019, 171–187, doi:10.1007/978-3-030-32047-8_16, arXiv:1810.05691.

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

/**
 * BUILD: the first medoid minimises the total dissimilarity; each next one gains the most.
 * Arithmetic and tie rule as R's cluster::pam (see the top of this file).
 */
export function pamBuild(condensed: Float64Array, n: number, k: number, onStep?: (done: number) => void): number[] {
  const row = new Float64Array(n);
  let largest = 0;
  for (let t = 0; t < condensed.length; t++) if (largest < condensed[t]) largest = condensed[t];
  // R's "larger than all dissimilarities"; the first step's gains are then n × this − Σ d(i, ·).
  const closest = new Float64Array(n).fill(largest * 1.1 + 1);
  const isMedoid = new Uint8Array(n);
  const medoids: number[] = [];
  for (let step = 0; step < k; step++) {
    let bestGain = 0;
    let best = -1;
    for (let i = 0; i < n; i++) {
      if (isMedoid[i]) continue;
      condensedRow(condensed, n, i, row);
      let gain = 0;
      for (let j = 0; j < n; j++) {
        const g = closest[j] - row[j];
        if (g > 0) gain += g;
      }
      // Exact comparison, the later row wins a tie.
      if (bestGain <= gain) {
        bestGain = gain;
        best = i;
      }
    }
    // Only NaN gains get here without a choice (R refuses missing dissimilarities): the first free row.
    if (best < 0) best = isMedoid.indexOf(0);
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
export function pamSwap(
  condensed: Float64Array,
  n: number,
  start: number[],
  maxSwaps: number,
  onPass?: (passes: number, swaps: number) => void,
): SwapRun {
  let state = pamState(condensed, n, start);
  const k = start.length;
  const row = new Float64Array(n);
  const removalLoss = new Float64Array(k);
  const change = new Float64Array(k);
  const isMedoid = new Uint8Array(n);
  const medoidRow = new Float64Array(n);
  const otherRow = new Float64Array(n);
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
    let bestExact = NaN;
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
      // Near ties (within eps) are settled as R settles them: on the change summed R's way,
      // strictly lower wins.
      for (let m = 0; m < k; m++) {
        const total = change[m] + shared;
        if (total < bestChange - eps) {
          bestChange = total;
          bestCandidate = c;
          bestSlot = m;
          bestExact = NaN;
        } else if (bestCandidate >= 0 && total <= bestChange + eps) {
          if (Number.isNaN(bestExact)) bestExact = changeAsR(condensed, n, state, medoids[bestSlot], bestCandidate, medoidRow, otherRow);
          const exact = changeAsR(condensed, n, state, medoids[m], c, medoidRow, otherRow);
          if (exact < bestExact) {
            bestChange = total;
            bestCandidate = c;
            bestSlot = m;
            bestExact = exact;
          }
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

/**
 * The change of cost when `candidate` replaces `medoid`, summed as R's cluster::pam sums it (row
 * by row, with its own case split), for settling near ties exactly as R does.
 */
function changeAsR(
  condensed: Float64Array,
  n: number,
  state: PamState,
  medoid: number,
  candidate: number,
  medoidRow: Float64Array,
  candidateRow: Float64Array,
): number {
  condensedRow(condensed, n, medoid, medoidRow);
  condensedRow(condensed, n, candidate, candidateRow);
  const { nearestDistance, secondDistance } = state;
  let dz = 0;
  for (let j = 0; j < n; j++) {
    const dm = medoidRow[j];
    const dc = candidateRow[j];
    if (dm === nearestDistance[j]) {
      const small = secondDistance[j] > dc ? dc : secondDistance[j];
      dz += -nearestDistance[j] + small;
    } else if (dc < nearestDistance[j]) {
      dz += -nearestDistance[j] + dc;
    }
  }
  return dz;
}
