// The exact end of a k-means run: every row to its nearest centre (ties: lower segment number),
// centres recomputed as the means of their rows, and the sums of squares from scratch — so the
// reported figures do not carry rounding drift from the incremental updates of the iterations.
// Sums over rows are taken block by block and added in block order (kmeans-memory.ts).
import { centresFromSums, repairEmpty, runHamerly, segmentSizes } from './hamerly';
import { Phase } from './kmeans-blocks';
import { acrossBlocks, type KmeansMemory } from './kmeans-memory';
import type { KmeansTeam } from './kmeans-team';

/** Centres to the means of their rows, sums from scratch (an empty segment is repaired first). */
export function centresToMeans(team: KmeansTeam, mem: KmeansMemory): void {
  team.run(Phase.Sums);
  repairEmpty(mem);
  centresFromSums(mem);
}

/** Within-SS of `mem.assignment` about `mem.centres`, summed segment by segment and then over segments. */
export function withinOn(team: KmeansTeam, mem: KmeansMemory, bySegment?: number[]): number {
  const { k, blocks } = mem.layout;
  team.run(Phase.Within);
  let total = 0;
  for (let c = 0; c < k; c++) {
    const part = acrossBlocks(mem.parts, blocks, k, c);
    if (bySegment) bySegment[c] = part;
    total += part;
  }
  return total;
}

/** The grand mean of the rows and the total sum of squares about it. */
export interface GrandSpread {
  grand: Float64Array;
  totalSS: number;
}

export function grandSpread(team: KmeansTeam, mem: KmeansMemory): GrandSpread {
  const { n, d, blocks } = mem.layout;
  team.run(Phase.ColumnSums);
  const grand = new Float64Array(d);
  for (let j = 0; j < d; j++) {
    grand[j] = acrossBlocks(mem.grand, blocks, d, j) / n;
  }
  mem.grand.set(grand);
  team.run(Phase.SpreadAbout);
  return { grand, totalSS: acrossBlocks(mem.blockValue, blocks, 1, 0) };
}

export interface PartitionFigures {
  sizes: number[];
  withinSS: number;
  withinSSBySegment: number[];
  betweenSS: number;
  totalSS: number;
}

/** Sizes and sums of squares of `mem.assignment`, whose centres (`mem.centres`) are the means of their rows. */
export function partitionFigures(team: KmeansTeam, mem: KmeansMemory, spread: GrandSpread): PartitionFigures {
  const { d, k } = mem.layout;
  const { grand, totalSS } = spread;
  team.run(Phase.Sums);
  const sizes = segmentSizes(mem);
  const bySegment = new Array<number>(k);
  const withinSS = withinOn(team, mem, bySegment);
  let betweenSS = 0;
  for (let c = 0; c < k; c++) {
    let s = 0;
    for (let j = 0; j < d; j++) {
      const diff = mem.centres[c * d + j] - grand[j];
      s += diff * diff;
    }
    betweenSS += sizes[c] * s;
  }
  return { sizes, withinSS, withinSSBySegment: bySegment, betweenSS, totalSS };
}

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
export function settleExactly(team: KmeansTeam, mem: KmeansMemory, maxSteps: number): number {
  team.run(Phase.Nearest);
  if (acrossBlocks(mem.blockValue, mem.layout.blocks, 1, 0) === 0) return 0;
  let steps = runHamerly(team, mem, maxSteps, 0, false, false).iterations;
  for (;;) {
    centresToMeans(team, mem);
    if (steps >= maxSteps) break;
    team.run(Phase.Nearest);
    if (acrossBlocks(mem.blockValue, mem.layout.blocks, 1, 0) === 0) break;
    steps++;
  }
  return steps;
}
