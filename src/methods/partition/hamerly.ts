// Lloyd's k-means iterations accelerated with Hamerly's (2010) bounds: per row one upper bound
// on the distance to its own centre and one lower bound on the distance to any other centre.
// A row whose upper bound is below max(lower bound, half the distance from its centre to the
// nearest other centre) cannot change segment, so its distances are not computed at all.
// All state lives in flat typed arrays allocated once per k-means call and reused by restarts.
import type { SeedingState } from './seeding';

/** Scratch arrays for one k-means call (n rows, d columns, k centres). */
export interface LloydWorkspace {
  readonly n: number;
  readonly d: number;
  readonly k: number;
  readonly assignment: Int32Array;
  readonly upper: Float64Array;
  readonly lower: Float64Array;
  readonly sums: Float64Array;
  readonly counts: Float64Array;
  readonly previous: Float64Array;
  readonly moved: Float64Array;
  readonly halfGap: Float64Array;
  /** Rows by decreasing distance, used only when a segment goes empty. */
  readonly order: Int32Array;
  readonly rowDistance: Float64Array;
}

export function createWorkspace(n: number, d: number, k: number): LloydWorkspace {
  return {
    n,
    d,
    k,
    assignment: new Int32Array(n),
    upper: new Float64Array(n),
    lower: new Float64Array(n),
    sums: new Float64Array(k * d),
    counts: new Float64Array(k),
    previous: new Float64Array(k * d),
    moved: new Float64Array(k),
    halfGap: new Float64Array(k),
    order: new Int32Array(n),
    rowDistance: new Float64Array(n),
  };
}

// Spare workspaces kept between calls (at most two per thread: a restart runner's and the exact
// finish's): a notebook runs k-means again and again on rows of the same size, and fresh arrays
// pay their allocation and page faults each time. A taken workspace is no longer spare, so a
// nested call gets arrays of its own.
const spareWorkspaces: LloydWorkspace[] = [];

/** A workspace for n × d rows and k centres: a spare one of that shape, or a new one. Contents are arbitrary. */
export function takeWorkspace(n: number, d: number, k: number): LloydWorkspace {
  const at = spareWorkspaces.findIndex((ws) => ws.n === n && ws.d === d && ws.k === k);
  if (at < 0) return createWorkspace(n, d, k);
  return spareWorkspaces.splice(at, 1)[0];
}

/** Hands a workspace back for a later call; it must not be used afterwards. */
export function giveBackWorkspace(ws: LloydWorkspace): void {
  if (spareWorkspaces.includes(ws)) return;
  spareWorkspaces.push(ws);
  if (spareWorkspaces.length > 2) spareWorkspaces.shift();
}

export interface LloydRun {
  /** Centre updates made. */
  iterations: number;
  /** True when the centres stopped moving (within tolerance) before maxIterations. */
  converged: boolean;
  /** Within-SS after each centre update, when asked for (tests only). */
  trace?: number[];
}

/**
 * Run Lloyd iterations from the centres in `centers` (k × d, overwritten with the final ones).
 * The assignment is left in `ws.assignment`. Stops when the summed squared centre movement is at
 * most `tolerance` (an absolute value; the caller scales it), or after `maxIterations` updates.
 */
export function runHamerly(
  data: Float64Array,
  centers: Float64Array,
  ws: LloydWorkspace,
  maxIterations: number,
  tolerance: number,
  trace: boolean,
  seeded?: SeedingState,
): LloydRun {
  const { n, d, k, assignment, upper, lower, sums, counts, previous, moved, halfGap } = ws;
  const traceValues: number[] | undefined = trace ? [] : undefined;
  if (seeded) startFromSeeding(data, ws, seeded);
  else firstAssignment(data, centers, ws);

  let iterations = 0;
  let converged = false;
  for (;;) {
    // Centres to the means of their rows; how far each moved (from before any repair, so a
    // repaired centre's jump is counted in the bounds too).
    previous.set(centers);
    repairEmpty(data, centers, ws);
    let shift = 0;
    for (let c = 0; c < k; c++) {
      const cb = c * d;
      const inv = 1 / counts[c];
      let s = 0;
      for (let j = 0; j < d; j++) {
        const v = sums[cb + j] * inv;
        const diff = v - previous[cb + j];
        s += diff * diff;
        centers[cb + j] = v;
      }
      moved[c] = Math.sqrt(s);
      shift += s;
    }
    iterations++;
    if (traceValues) traceValues.push(withinFor(data, centers, assignment, n, d));
    if (shift <= tolerance) converged = true;
    // Nothing moved: the assignment is already nearest-centre for these centres.
    if (shift === 0) break;
    const last = converged || iterations >= maxIterations;

    // Bounds follow the centres: own centre's move widens the upper bound; the largest move of
    // any other centre narrows the lower bound (applied row by row in the assignment sweep).
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

    // Half the distance from each centre to its nearest other centre.
    for (let c = 0; c < k; c++) halfGap[c] = Infinity;
    for (let c = 0; c < k; c++) {
      const cb = c * d;
      for (let e = c + 1; e < k; e++) {
        const eb = e * d;
        let s = 0;
        for (let j = 0; j < d; j++) {
          const diff = centers[cb + j] - centers[eb + j];
          s += diff * diff;
        }
        const h = 0.5 * Math.sqrt(s);
        if (h < halfGap[c]) halfGap[c] = h;
        if (h < halfGap[e]) halfGap[e] = h;
      }
    }

    // Assignment step: only rows whose bounds allow a change are looked at. After the last
    // centre update it runs once more, so the result is nearest-centre for the final centres.
    // The skip test is strict, so a row that may be tied with another centre is looked at and
    // the tie goes to the lower segment number.
    for (let i = 0; i < n; i++) {
      const a = assignment[i];
      // The bound updates above, applied here in the same sweep over the rows.
      const up = upper[i] + moved[a];
      const low = lower[i] - (a === mostAt ? secondMost : most);
      lower[i] = low;
      const bound = halfGap[a] > low ? halfGap[a] : low;
      if (up < bound) {
        upper[i] = up;
        continue;
      }
      const ib = i * d;
      const ab = a * d;
      let own = 0;
      for (let j = 0; j < d; j++) {
        const diff = data[ib + j] - centers[ab + j];
        own += diff * diff;
      }
      own = Math.sqrt(own);
      upper[i] = own;
      if (own < bound) continue;
      let best = a;
      let bestD = own * own;
      let secondD = Infinity;
      for (let c = 0; c < k; c++) {
        if (c === a) continue;
        const cb = c * d;
        let s = 0;
        for (let j = 0; j < d; j++) {
          const diff = data[ib + j] - centers[cb + j];
          s += diff * diff;
        }
        if (s < bestD || (s === bestD && c < best)) {
          secondD = bestD;
          bestD = s;
          best = c;
        } else if (s < secondD) {
          secondD = s;
        }
      }
      upper[i] = Math.sqrt(bestD);
      lower[i] = Math.sqrt(secondD);
      if (best !== a) {
        assignment[i] = best;
        counts[a]--;
        counts[best]++;
        const bb = best * d;
        for (let j = 0; j < d; j++) {
          const v = data[ib + j];
          sums[ab + j] -= v;
          sums[bb + j] += v;
        }
      }
    }
    if (last) break;
  }
  return { iterations, converged, trace: traceValues };
}

/** First assignment from given or random centres: every distance, once. */
function firstAssignment(data: Float64Array, centers: Float64Array, ws: LloydWorkspace): void {
  const { n, d, k, assignment, upper, lower, sums, counts } = ws;
  sums.fill(0);
  counts.fill(0);
  for (let i = 0; i < n; i++) {
    const ib = i * d;
    let best = 0;
    let bestD = Infinity;
    let secondD = Infinity;
    for (let c = 0; c < k; c++) {
      const s = squaredDistance(data, ib, centers, c * d, d);
      if (s < bestD) {
        secondD = bestD;
        bestD = s;
        best = c;
      } else if (s < secondD) {
        secondD = s;
      }
    }
    assignment[i] = best;
    upper[i] = Math.sqrt(bestD);
    lower[i] = Math.sqrt(secondD);
    counts[best]++;
    const sb = best * d;
    for (let j = 0; j < d; j++) sums[sb + j] += data[ib + j];
  }
}

/** First assignment from what k-means++ already knows (nearest centre and bounds). */
function startFromSeeding(data: Float64Array, ws: LloydWorkspace, seeded: SeedingState): void {
  const { n, d, assignment, upper, lower, sums, counts } = ws;
  sums.fill(0);
  counts.fill(0);
  for (let i = 0; i < n; i++) {
    const a = seeded.nearest[i];
    assignment[i] = a;
    upper[i] = Math.sqrt(seeded.closest[i]);
    lower[i] = seeded.secondLower[i];
    counts[a]++;
    const ib = i * d;
    const sb = a * d;
    for (let j = 0; j < d; j++) sums[sb + j] += data[ib + j];
  }
}

/**
 * Give every empty segment one row, deterministically: rows are taken by decreasing distance to
 * their current centre (ties: lower row first), skipping rows whose segment would go empty in
 * turn; the empty centre then sits on that row. The moved row's bounds are reset so it is
 * looked at again.
 */
export function repairEmpty(data: Float64Array, centers: Float64Array, ws: LloydWorkspace): number {
  const { n, d, k, counts } = ws;
  let empty = 0;
  for (let c = 0; c < k; c++) if (counts[c] === 0) empty++;
  if (empty === 0) return 0;
  const { assignment, sums, upper, lower, order, rowDistance } = ws;
  for (let i = 0; i < n; i++) {
    rowDistance[i] = squaredDistance(data, i * d, centers, assignment[i] * d, d);
    order[i] = i;
  }
  const sorted = Array.from(order).sort((a, b) => rowDistance[b] - rowDistance[a] || a - b);
  let next = 0;
  for (let c = 0; c < k; c++) {
    if (counts[c] !== 0) continue;
    while (next < n && counts[assignment[sorted[next]]] <= 1) next++;
    if (next >= n) break; // cannot happen when k ≤ distinct rows, which the caller checks
    const i = sorted[next++];
    const from = assignment[i];
    const ib = i * d;
    const fb = from * d;
    const cb = c * d;
    for (let j = 0; j < d; j++) {
      const v = data[ib + j];
      sums[fb + j] -= v;
      sums[cb + j] = v;
      centers[cb + j] = v;
    }
    counts[from]--;
    counts[c] = 1;
    assignment[i] = c;
    upper[i] = Infinity;
    lower[i] = 0;
  }
  return empty;
}

export function squaredDistance(a: Float64Array, ab: number, b: Float64Array, bb: number, d: number): number {
  let s = 0;
  for (let j = 0; j < d; j++) {
    const diff = a[ab + j] - b[bb + j];
    s += diff * diff;
  }
  return s;
}

/**
 * Within-SS of an assignment against given centres, summed segment by segment and then over
 * segments (the same order as the reported per-segment figures, so the totals agree to the bit).
 */
export function withinFor(data: Float64Array, centers: Float64Array, assignment: Int32Array, n: number, d: number, bySegment?: number[]): number {
  const k = centers.length / d;
  const parts = bySegment ?? new Array<number>(k);
  parts.fill(0);
  for (let i = 0; i < n; i++) {
    const a = assignment[i];
    parts[a] += squaredDistance(data, i * d, centers, a * d, d);
  }
  let total = 0;
  for (let c = 0; c < k; c++) total += parts[c];
  return total;
}
