// Single-row transfers after Lloyd's iterations (Hartigan's rule): a row leaves its segment a for
// segment b when that lowers the within-SS, which is when
//     n_b / (n_b + 1) · ‖x − c_b‖²  <  n_a / (n_a − 1) · ‖x − c_a‖²,
// and both centres then move to the new means at once. Lloyd's rule moves a row only when c_b is
// nearer than c_a; this one also sees that taking a row out of a small segment pulls its centre
// away, so it escapes many of Lloyd's local optima (every fixed point of this rule is one of
// Lloyd's, not the other way round).
//
// Passes go over the rows in row order until one makes no transfer (deterministic). Most rows are
// skipped without a distance: Hamerly's bounds from the Lloyd run are carried along — the upper
// bound widened by how far the row's own centre has moved, the lower bound narrowed by the
// farthest any centre has moved since the pass began (a bound measured during the pass is kept as
// measured and narrowed the same way: looser, still valid), and the gap between centres used as
// in Hamerly's test — and a row whose weighted lower bound cannot beat its weighted upper bound
// cannot move.
//
// References:
//   J. A. Hartigan and M. A. Wong, "Algorithm AS 136: A k-means clustering algorithm", Journal of
//   the Royal Statistical Society, Series C (Applied Statistics) 28(1), 100–108 (1979),
//   doi:10.2307/2346830.
//   M. Telgarsky and A. Vattani, "Hartigan's method: k-means clustering without Voronoi",
//   Proceedings of the 13th International Conference on Artificial Intelligence and Statistics
//   (AISTATS 2010), PMLR 9, 820–827.
import { fourDistances, squaredDistance } from '../../measure/squared-distance';
import { centresFromSums, segmentSizes, sumsFromScratch, repairEmpty } from './centre-update';
import { type KmeansMemory } from './kmeans-memory';

/**
 * A transfer must lower the row's weighted cost by more than this share of it: rounding in the
 * incremental centre updates can then never make two rows trade places back and forth.
 */
const MARGIN = 1e-12;

export interface TransferRun {
  /** Rows moved. */
  moves: number;
  /** True when the last pass moved no row (a fixed point of the rule). */
  settled: boolean;
}

/**
 * Hartigan transfers from the end of a Lloyd run (assignment and bounds in `mem`): first the
 * centres become the means of their rows, then single rows move while any move lowers the
 * within-SS, at most `maxPasses` passes. The centres are left as the running means (the caller
 * recomputes them from scratch).
 */
export function transferRows(mem: KmeansMemory, maxPasses: number): TransferRun {
  const { n, d, k } = mem.layout;
  const { rows, centres, paddedCentres, previous, assignment, upper, lower, halfGap } = mem;
  // Centres to the means of the rows (the last Lloyd sweep may have moved rows after the last
  // centre update); the bounds follow the moves, as in a Hamerly iteration.
  previous.set(centres);
  sumsFromScratch(mem);
  repairEmpty(mem);
  centresFromSums(mem, mem.moved);
  let widest = 0;
  for (let c = 0; c < k; c++) if (mem.moved[c] > widest) widest = mem.moved[c];
  for (let i = 0; i < n; i++) {
    upper[i] += mem.moved[assignment[i]];
    lower[i] -= widest;
  }

  const sizes = Float64Array.from(segmentSizes(mem));
  // Since the start of the pass: how far each centre has moved (summed step lengths), and the most.
  const drift = new Float64Array(k);
  let widestDrift = 0;
  const distances = new Float64Array(4 * Math.ceil(k / 4));
  const quad = new Float64Array(4);
  let smallest = minimum(sizes);
  let moves = 0;
  let settled = false;
  for (let pass = 0; pass < maxPasses && !settled; pass++) {
    let movedThisPass = 0;
    centreGaps(centres, k, d, halfGap);
    for (let i = 0; i < n; i++) {
      const a = assignment[i];
      const na = sizes[a];
      if (na <= 1) continue;
      const leave = na / (na - 1);
      // The cheapest any other segment can be: its weight is at least smallest / (smallest + 1).
      const join = smallest / (smallest + 1);
      // Lower bounds on the distance to any other centre: the carried bound, and the gap from
      // the row's centre to the nearest other less the distance to its own (triangle inequality).
      const up = upper[i] + drift[a];
      const carried = lower[i] - widestDrift;
      const gap = 2 * halfGap[a] - 2 * widestDrift;
      let low = gap - up > carried ? gap - up : carried;
      if (low > 0 && join * low * low >= leave * up * up) continue;
      // The exact distance to the row's own centre may already rule a move out.
      const ib = i * d;
      const own = squaredDistance(rows, ib, centres, a * d, d);
      const ownDistance = Math.sqrt(own);
      if (gap - ownDistance > low) low = gap - ownDistance;
      if (low > 0 && join * low * low >= leave * own) {
        upper[i] = ownDistance - drift[a];
        continue;
      }
      // Four centres at a time (the padded centres end in copies at infinity); each distance is
      // summed in column order, so distances[a] is `own` to the bit.
      // (Through one scratch of four: a subarray per call allocated an object in the hottest loop.)
      for (let c = 0; c < k; c += 4) {
        fourDistances(rows, ib, ib, ib, ib, paddedCentres, c * d, (c + 1) * d, (c + 2) * d, (c + 3) * d, d, quad);
        distances[c] = quad[0];
        distances[c + 1] = quad[1];
        distances[c + 2] = quad[2];
        distances[c + 3] = quad[3];
      }
      let best = -1;
      let bestCost = leave * own * (1 - MARGIN);
      let nearestOther = Infinity;
      for (let c = 0; c < k; c++) {
        if (c === a) continue;
        const s = distances[c];
        if (s < nearestOther) nearestOther = s;
        const cost = (sizes[c] / (sizes[c] + 1)) * s;
        if (cost < bestCost) {
          bestCost = cost;
          best = c;
        }
      }
      if (best < 0) {
        // Exact bounds now, kept relative to the drift so far.
        upper[i] = ownDistance - drift[a];
        lower[i] = Math.sqrt(nearestOther);
        continue;
      }
      // Move row i from a to best; both centres to their new means.
      const nb = sizes[best];
      const ab = a * d;
      const bb = best * d;
      for (let j = 0; j < d; j++) {
        const x = rows[ib + j];
        centres[ab + j] -= (x - centres[ab + j]) / (na - 1);
        centres[bb + j] += (x - centres[bb + j]) / (nb + 1);
      }
      const stepA = ownDistance / (na - 1);
      const stepB = Math.sqrt(distances[best]) / (nb + 1);
      drift[a] += stepA;
      drift[best] += stepB;
      if (drift[a] > widestDrift) widestDrift = drift[a];
      if (drift[best] > widestDrift) widestDrift = drift[best];
      sizes[a] = na - 1;
      sizes[best] = nb + 1;
      smallest = minimum(sizes);
      assignment[i] = best;
      // The row's distance to its new centre shrinks by nb / (nb + 1), to its old one grows by
      // na / (na − 1); the others did not move.
      distances[best] *= (nb / (nb + 1)) ** 2;
      distances[a] *= leave * leave;
      let second = Infinity;
      for (let c = 0; c < k; c++) if (c !== best && distances[c] < second) second = distances[c];
      upper[i] = Math.sqrt(distances[best]) - drift[best];
      lower[i] = Math.sqrt(second);
      movedThisPass++;
    }
    // Bounds back to absolute terms for the next pass.
    for (let i = 0; i < n; i++) {
      upper[i] += drift[assignment[i]];
      lower[i] -= widestDrift;
    }
    drift.fill(0);
    widestDrift = 0;
    moves += movedThisPass;
    settled = movedThisPass === 0;
  }
  return { moves, settled };
}

/** Half the distance from each centre to its nearest other centre (as in a Hamerly iteration). */
function centreGaps(centres: Float64Array, k: number, d: number, halfGap: Float64Array): void {
  halfGap.fill(Infinity);
  for (let c = 0; c < k; c++) {
    for (let e = c + 1; e < k; e++) {
      const h = 0.5 * Math.sqrt(squaredDistance(centres, c * d, centres, e * d, d));
      if (h < halfGap[c]) halfGap[c] = h;
      if (h < halfGap[e]) halfGap[e] = h;
    }
  }
}

function minimum(values: Float64Array): number {
  let m = Infinity;
  for (let c = 0; c < values.length; c++) if (values[c] < m) m = values[c];
  return m;
}
