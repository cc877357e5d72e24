// The exact end of a k-means run: every row to its nearest centre (ties: lower segment number),
// centres recomputed as the means of their rows, and the sums of squares from scratch — so the
// reported figures do not carry rounding drift from the incremental updates of the iterations.
import { createWorkspace, repairEmpty, squaredDistance, type LloydWorkspace } from './hamerly';

/** Assign every row to its nearest centre; returns how many rows changed segment. Fills counts. */
export function assignNearest(data: Float64Array, centers: Float64Array, ws: LloydWorkspace): number {
  const { n, d, k, assignment, counts } = ws;
  counts.fill(0);
  let changed = 0;
  for (let i = 0; i < n; i++) {
    const ib = i * d;
    let best = 0;
    let bestD = Infinity;
    for (let c = 0; c < k; c++) {
      const s = squaredDistance(data, ib, centers, c * d, d);
      if (s < bestD) {
        bestD = s;
        best = c;
      }
    }
    if (assignment[i] !== best) changed++;
    assignment[i] = best;
    counts[best]++;
  }
  return changed;
}

/** Sums per segment from scratch (counts must be filled). */
export function sumsFromScratch(data: Float64Array, ws: LloydWorkspace): void {
  const { n, d, assignment, sums } = ws;
  sums.fill(0);
  for (let i = 0; i < n; i++) {
    const ib = i * d;
    const sb = assignment[i] * d;
    for (let j = 0; j < d; j++) sums[sb + j] += data[ib + j];
  }
}

/** Centres to the means of their rows (an empty segment is repaired first). */
export function centresToMeans(data: Float64Array, centers: Float64Array, ws: LloydWorkspace): void {
  sumsFromScratch(data, ws);
  repairEmpty(data, centers, ws);
  const { d, k, sums, counts } = ws;
  for (let c = 0; c < k; c++) {
    const inv = 1 / counts[c];
    for (let j = 0; j < d; j++) centers[c * d + j] = sums[c * d + j] * inv;
  }
}

export interface PartitionFigures {
  sizes: number[];
  withinSS: number;
  withinSSBySegment: number[];
  betweenSS: number;
  totalSS: number;
}

/** Sizes and sums of squares of an assignment whose centres are the means of their rows. */
export function partitionFigures(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  assignment: Int32Array,
  centers: Float64Array,
): PartitionFigures {
  const grand = new Float64Array(d);
  for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) grand[j] += data[i * d + j];
  for (let j = 0; j < d; j++) grand[j] /= n;
  const sizes = new Array<number>(k).fill(0);
  const bySegment = new Array<number>(k).fill(0);
  let totalSS = 0;
  for (let i = 0; i < n; i++) {
    const a = assignment[i];
    sizes[a]++;
    bySegment[a] += squaredDistance(data, i * d, centers, a * d, d);
    totalSS += squaredDistance(data, i * d, grand, 0, d);
  }
  let withinSS = 0;
  let betweenSS = 0;
  for (let c = 0; c < k; c++) {
    withinSS += bySegment[c];
    betweenSS += sizes[c] * squaredDistance(centers, c * d, grand, 0, d);
  }
  return { sizes, withinSS, withinSSBySegment: bySegment, betweenSS, totalSS };
}

/** Mean over columns of the column variances (population), which scales the tolerance. */
export function meanColumnVariance(data: Float64Array, n: number, d: number): number {
  let total = 0;
  for (let j = 0; j < d; j++) {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += data[i * d + j];
    mean /= n;
    let s = 0;
    for (let i = 0; i < n; i++) {
      const diff = data[i * d + j] - mean;
      s += diff * diff;
    }
    total += s / n;
  }
  return d > 0 ? total / d : 0;
}

export { createWorkspace };
