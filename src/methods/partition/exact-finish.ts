// The exact end of a k-means run: every row to its nearest centre by a full scan (ties: the lower
// segment number) and, while that moves any row, Lloyd iterations with tolerance 0 until nothing
// moves — so the reported assignment is nearest-centre for the reported centres, which are the
// means of their rows, without rounding drift from the incremental updates of the iterations.
import { twoByFour } from '../../measure/squared-distance';
import { centresToMeans } from './centre-update';
import { runHamerly } from './hamerly';
import { acrossBlocks, forEachBlock, type KmeansMemory } from './kmeans-memory';

const quad = new Float64Array(8);

/**
 * The exact last word on a kept k-means result (in `mem.assignment` and `mem.centres`): every
 * row to its nearest centre by a full scan (ties: lower segment number). When that moves any
 * row (the restart stopped on the tolerance, or rounding in its running sums), Lloyd iterations
 * go on from these centres with tolerance 0 — with Hamerly's bounds, as in the restarts — until
 * nothing moves, and the centres then become the means of their rows, summed from scratch and
 * checked by one more full scan (at most `maxSteps` centre updates in all). Returns the number of
 * extra centre updates. Afterwards the assignment is nearest-centre for centres that are the
 * means of their rows, unless the cap hit.
 */
export function settleExactly(mem: KmeansMemory, maxSteps: number): number {
  if (nearestAll(mem) === 0) return 0;
  let steps = runHamerly(mem, maxSteps, 0, false, 'centres').iterations;
  for (;;) {
    centresToMeans(mem);
    if (steps >= maxSteps) break;
    if (nearestAll(mem) === 0) break;
    steps++;
  }
  return steps;
}

/**
 * Every row to its nearest centre by a full scan (ties: the lower segment number); fills every
 * block's counts (not the sums) and returns how many rows changed segment.
 */
export function nearestAll(mem: KmeansMemory): number {
  const { d, k, blocks } = mem.layout;
  forEachBlock(mem, (lo, hi, b) => {
    mem.blockValue[b] = nearestRows(mem.rows, d, k, lo, hi, mem.paddedCentres, mem.assignment, mem.counts.subarray(b * k, (b + 1) * k));
  });
  return acrossBlocks(mem.blockValue, blocks, 1, 0);
}

/**
 * Rows [lo, hi) to their nearest centre by a full scan; returns how many changed segment and
 * fills `counts`. Two rows against four centres at a time (twoByFour; `centres` padded to a
 * multiple of four with centres at infinity), then compared in centre order, so ties go to the
 * lower segment number exactly as one centre at a time would.
 */
function nearestRows(
  rows: Float64Array,
  d: number,
  k: number,
  lo: number,
  hi: number,
  centres: Float64Array,
  assignment: Int32Array,
  counts: Float64Array,
): number {
  counts.fill(0);
  let changed = 0;
  for (let i = lo; i < hi; i += 2) {
    // An odd last row is paired with itself; the copy's result is not used.
    const pair = i + 1 < hi;
    const i1 = pair ? i + 1 : i;
    const ib = i * d;
    const jb = i1 * d;
    let best0 = 0;
    let bestD0 = Infinity;
    let best1 = 0;
    let bestD1 = Infinity;
    for (let c = 0; c < k; c += 4) {
      twoByFour(rows, ib, jb, centres, c * d, d, quad);
      for (let q = 0; q < 4; q++) {
        if (quad[q] < bestD0) {
          bestD0 = quad[q];
          best0 = c + q;
        }
        if (quad[4 + q] < bestD1) {
          bestD1 = quad[4 + q];
          best1 = c + q;
        }
      }
    }
    if (assignment[i] !== best0) changed++;
    assignment[i] = best0;
    counts[best0]++;
    if (!pair) continue;
    if (assignment[i1] !== best1) changed++;
    assignment[i1] = best1;
    counts[best1]++;
  }
  return changed;
}
