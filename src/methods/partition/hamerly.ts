// Lloyd's k-means iterations accelerated with Hamerly's (2010) bounds: per row one upper bound
// on the distance to its own centre and one lower bound on the distance to any other centre.
// A row whose upper bound is below max(lower bound, half the distance from its centre to the
// nearest other centre) cannot change segment, so its distances are not computed at all.
// The sweeps over the rows are phases (kmeans-blocks.ts); the centre updates here are serial and
// add the blocks' segment sums in block order.
import { sqeuclideanPair as squaredDistance } from '../../measure/metrics';
import { Phase } from './kmeans-blocks';
import { acrossBlocks, blockOf, interleaveInPairs, PARAM_MOST, PARAM_MOST_AT, PARAM_SECOND_MOST, type KmeansMemory } from './kmeans-memory';
import type { KmeansTeam } from './kmeans-team';
import { withinOn } from './partition-summary';

export interface LloydRun {
  /** Centre updates made. */
  iterations: number;
  /** True when the centres stopped moving (within tolerance) before maxIterations. */
  converged: boolean;
  /** Within-SS after each centre update, when asked for (tests only). */
  trace?: number[];
}

/**
 * Run Lloyd iterations from the centres in `mem.centres` (overwritten with the final ones), or
 * from the k-means++ state when `seeded`. The assignment is left in `mem.assignment`. Stops when
 * the summed squared centre movement is at most `tolerance` (an absolute value; the caller
 * scales it), or after `maxIterations` updates.
 */
export function runHamerly(team: KmeansTeam, mem: KmeansMemory, maxIterations: number, tolerance: number, trace: boolean, seeded: boolean): LloydRun {
  const { d, k } = mem.layout;
  const { centres, previous, moved, halfGap, params } = mem;
  const traceValues: number[] | undefined = trace ? [] : undefined;
  team.run(seeded ? Phase.StartSeeded : Phase.StartFromCentres);

  let iterations = 0;
  let converged = false;
  for (;;) {
    // Centres to the means of their rows; how far each moved (from before any repair, so a
    // repaired centre's jump is counted in the bounds too).
    previous.set(centres);
    repairEmpty(mem);
    const shift = centresFromSums(mem, moved);
    iterations++;
    if (traceValues) traceValues.push(withinOn(team, mem));
    if (shift <= tolerance) converged = true;
    // Nothing moved: the assignment is already nearest-centre for these centres.
    if (shift === 0) break;
    const last = converged || iterations >= maxIterations;

    // The largest and second-largest moves, for the lower bounds in the sweep.
    let most = 0;
    let mostAt = -1;
    let secondMost = 0;
    for (let c = 0; c < k; c++) {
      const m = moved[c];
      if (m > most) {
        secondMost = most;
        most = m;
        mostAt = c;
      } else if (m > secondMost) {
        secondMost = m;
      }
    }
    params[PARAM_MOST] = most;
    params[PARAM_SECOND_MOST] = secondMost;
    params[PARAM_MOST_AT] = mostAt;

    // Half the distance from each centre to its nearest other centre.
    for (let c = 0; c < k; c++) halfGap[c] = Infinity;
    for (let c = 0; c < k; c++) {
      const cb = c * d;
      for (let e = c + 1; e < k; e++) {
        const eb = e * d;
        let s = 0;
        for (let j = 0; j < d; j++) {
          const diff = centres[cb + j] - centres[eb + j];
          s += diff * diff;
        }
        const h = 0.5 * Math.sqrt(s);
        if (h < halfGap[c]) halfGap[c] = h;
        if (h < halfGap[e]) halfGap[e] = h;
      }
    }

    // After the last centre update the sweep runs once more, so the result is nearest-centre
    // for the final centres.
    if (mem.pairScan) interleaveInPairs(mem.paddedCentres, mem.centresPaired, mem.paddedCentres.length / d, d);
    team.run(Phase.Sweep);
    if (last) break;
  }
  return { iterations, converged, trace: traceValues };
}

/**
 * Centres to the means of their rows from the blocks' sums and counts (added in block order).
 * With `moved`, also how far each centre moved from `mem.previous`; returns the summed squared move.
 */
export function centresFromSums(mem: KmeansMemory, moved?: Float64Array): number {
  const { d, k, blocks } = mem.layout;
  const { sums, counts, centres, previous } = mem;
  let shift = 0;
  for (let c = 0; c < k; c++) {
    const inv = 1 / acrossBlocks(counts, blocks, k, c);
    const cb = c * d;
    let s = 0;
    for (let j = 0; j < d; j++) {
      const v = acrossBlocks(sums, blocks, k * d, cb + j) * inv;
      const diff = v - previous[cb + j];
      s += diff * diff;
      centres[cb + j] = v;
    }
    if (moved) moved[c] = Math.sqrt(s);
    shift += s;
  }
  return shift;
}

/** Rows per segment over all blocks. */
export function segmentSizes(mem: KmeansMemory): number[] {
  const { k, blocks } = mem.layout;
  return Array.from({ length: k }, (_, c) => acrossBlocks(mem.counts, blocks, k, c));
}

/**
 * Give every empty segment one row, deterministically: rows are taken by decreasing distance to
 * their current centre (ties: lower row first), skipping rows whose segment would go empty in
 * turn; the empty centre then sits on that row. The moved row's bounds are reset so it is
 * looked at again. Serial (rare); keeps the blocks' sums and counts in step.
 */
export function repairEmpty(mem: KmeansMemory): number {
  const { n, d, k, blocks } = mem.layout;
  const sizes = segmentSizes(mem);
  let empty = 0;
  for (let c = 0; c < k; c++) if (sizes[c] === 0) empty++;
  if (empty === 0) return 0;
  const { rows, centres, assignment, sums, counts, upper, lower } = mem;
  const rowDistance = new Float64Array(n);
  for (let i = 0; i < n; i++) rowDistance[i] = squaredDistance(rows, i * d, centres, assignment[i] * d, d);
  const sorted = Array.from({ length: n }, (_, i) => i).sort((a, b) => rowDistance[b] - rowDistance[a] || a - b);
  let next = 0;
  for (let c = 0; c < k; c++) {
    if (sizes[c] !== 0) continue;
    while (next < n && sizes[assignment[sorted[next]]] <= 1) next++;
    if (next >= n) break; // cannot happen when k ≤ distinct rows, which the caller checks
    const i = sorted[next++];
    const from = assignment[i];
    const own = blockOf(mem.layout, i);
    const ib = i * d;
    for (let b = 0; b < blocks; b++) {
      // The empty segment's sums restart from this one row (clearing any rounding residue).
      const cb = (b * k + c) * d;
      for (let j = 0; j < d; j++) sums[cb + j] = b === own ? rows[ib + j] : 0;
    }
    const fb = (own * k + from) * d;
    for (let j = 0; j < d; j++) {
      sums[fb + j] -= rows[ib + j];
      centres[c * d + j] = rows[ib + j];
    }
    counts[own * k + from]--;
    counts[own * k + c] = 1;
    sizes[from]--;
    sizes[c] = 1;
    assignment[i] = c;
    upper[i] = Infinity;
    lower[i] = 0;
  }
  return empty;
}
