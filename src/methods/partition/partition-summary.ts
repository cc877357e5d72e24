// The exact end of a k-means run: every row to its nearest centre (ties: lower segment number),
// centres recomputed as the means of their rows, and the sums of squares from scratch — so the
// reported figures do not carry rounding drift from the incremental updates of the iterations.
import { giveBackWorkspace, repairEmpty, takeWorkspace, squaredDistance, withinFor, type LloydWorkspace } from './hamerly';

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

/** The grand mean of the rows and the total sum of squares about it (each row's squared distance, in row order). */
export interface GrandSpread {
  grand: Float64Array;
  totalSS: number;
}

export function grandSpread(data: Float64Array, n: number, d: number): GrandSpread {
  const grand = new Float64Array(d);
  for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) grand[j] += data[i * d + j];
  for (let j = 0; j < d; j++) grand[j] /= n;
  let totalSS = 0;
  for (let i = 0; i < n; i++) totalSS += squaredDistance(data, i * d, grand, 0, d);
  return { grand, totalSS };
}

/**
 * Sizes and sums of squares of an assignment whose centres are the means of their rows. A caller
 * that already has the grand mean and total (`spread`) passes it in to save two passes.
 */
export function partitionFigures(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  assignment: Int32Array,
  centers: Float64Array,
  spread: GrandSpread = grandSpread(data, n, d),
): PartitionFigures {
  const { grand, totalSS } = spread;
  const sizes = new Array<number>(k).fill(0);
  const bySegment = new Array<number>(k);
  for (let i = 0; i < n; i++) sizes[assignment[i]]++;
  const withinSS = withinFor(data, centers, assignment, n, d, bySegment);
  let betweenSS = 0;
  for (let c = 0; c < k; c++) betweenSS += sizes[c] * squaredDistance(centers, c * d, grand, 0, d);
  return { sizes, withinSS, withinSSBySegment: bySegment, betweenSS, totalSS };
}

/**
 * The exact last word on a kept k-means result: every row to its nearest centre by a full scan
 * (ties: lower segment number), and while that moves any row, centres to the means and scan
 * again (at most `maxSteps` times). Returns the number of extra centre updates. Afterwards the
 * assignment is nearest-centre for centres that are the means of their rows, unless the cap hit.
 */
export function settleExactly(data: Float64Array, n: number, d: number, k: number, assignment: Int32Array, centers: Float64Array, maxSteps: number): number {
  const ws = takeWorkspace(n, d, k);
  ws.assignment.set(assignment);
  let steps = 0;
  for (;;) {
    const moved = assignNearest(data, centers, ws);
    if (moved === 0 || steps >= maxSteps) break;
    centresToMeans(data, centers, ws);
    steps++;
  }
  if (steps > 0) centresToMeans(data, centers, ws);
  assignment.set(ws.assignment);
  giveBackWorkspace(ws);
  return steps;
}

/**
 * Every row to its nearest centre by a full scan; returns how many rows changed segment. Fills
 * counts. Two rows against four centres at a time (eight independent sums keep the adder busy;
 * each distance is still summed in column order) and then compared in centre order, so ties go
 * to the lower segment number exactly as one centre at a time would.
 */
function assignNearest(data: Float64Array, centers: Float64Array, ws: LloydWorkspace): number {
  const { n, d, k, assignment, counts } = ws;
  counts.fill(0);
  let changed = 0;
  const grouped = k - (k % 4);
  for (let i = 0; i < n; i += 2) {
    // An odd last row is paired with itself; the copy's result is not used.
    const pair = i + 1 < n;
    const i1 = pair ? i + 1 : i;
    const ib = i * d;
    const jb = i1 * d;
    let best0 = 0;
    let bestD0 = Infinity;
    let best1 = 0;
    let bestD1 = Infinity;
    let c = 0;
    for (; c < grouped; c += 4) {
      const c0 = c * d;
      const c1 = c0 + d;
      const c2 = c1 + d;
      const c3 = c2 + d;
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0; // prettier-ignore
      let t0 = 0, t1 = 0, t2 = 0, t3 = 0; // prettier-ignore
      for (let j = 0; j < d; j++) {
        const x = data[ib + j];
        const y = data[jb + j];
        const v0 = centers[c0 + j];
        const v1 = centers[c1 + j];
        const v2 = centers[c2 + j];
        const v3 = centers[c3 + j];
        let e = x - v0;
        s0 += e * e;
        e = x - v1;
        s1 += e * e;
        e = x - v2;
        s2 += e * e;
        e = x - v3;
        s3 += e * e;
        e = y - v0;
        t0 += e * e;
        e = y - v1;
        t1 += e * e;
        e = y - v2;
        t2 += e * e;
        e = y - v3;
        t3 += e * e;
      }
      if (s0 < bestD0) {
        bestD0 = s0;
        best0 = c;
      }
      if (s1 < bestD0) {
        bestD0 = s1;
        best0 = c + 1;
      }
      if (s2 < bestD0) {
        bestD0 = s2;
        best0 = c + 2;
      }
      if (s3 < bestD0) {
        bestD0 = s3;
        best0 = c + 3;
      }
      if (t0 < bestD1) {
        bestD1 = t0;
        best1 = c;
      }
      if (t1 < bestD1) {
        bestD1 = t1;
        best1 = c + 1;
      }
      if (t2 < bestD1) {
        bestD1 = t2;
        best1 = c + 2;
      }
      if (t3 < bestD1) {
        bestD1 = t3;
        best1 = c + 3;
      }
    }
    for (; c < k; c++) {
      const s = squaredDistance(data, ib, centers, c * d, d);
      if (s < bestD0) {
        bestD0 = s;
        best0 = c;
      }
      const t = squaredDistance(data, jb, centers, c * d, d);
      if (t < bestD1) {
        bestD1 = t;
        best1 = c;
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
