// One assignment sweep of Lloyd's k-means with Hamerly's bounds, and the first assignment that
// sets the bounds up: per row an upper bound on the distance to its own centre and a lower bound
// on the distance to every other centre. A row whose upper bound is below max(lower bound, half
// the distance from its centre to the nearest other centre) cannot change segment, so its
// distances are not computed at all. Each block keeps its own segment sums and counts, updated
// as rows move.
//
// Reference: G. Hamerly, "Making k-means even faster", Proceedings of the 2010 SIAM International
// Conference on Data Mining, 130–140, doi:10.1137/1.9781611972801.12.
import { fourDistances, twoByFour } from '../../measure/squared-distance';
import { blockSums } from './centre-update';
import { forEachBlock, PARAM_MOST, PARAM_MOST_AT, PARAM_SECOND_MOST, type KmeansMemory } from './kmeans-memory';

const quad = new Float64Array(8);

/**
 * Where the first assignment and bounds come from: what k-means++ already knows ('seeded':
 * nearest centre, its distance and a lower bound on the others), measuring every centre
 * ('centres'), or the assignment and bounds already in `mem`, valid for its centres ('kept').
 */
export type StartFrom = 'seeded' | 'centres' | 'kept';

/** The first assignment and bounds, then every block's segment sums and counts. */
export function firstAssignment(mem: KmeansMemory, from: StartFrom): void {
  forEachBlock(mem, (lo, hi, b) => {
    if (from === 'seeded') startSeeded(mem, lo, hi);
    else if (from === 'centres') startFromCentres(mem, lo, hi);
    blockSums(mem, lo, hi, b);
  });
}

/** One Hamerly sweep over every block (the centre moves and half gaps are in `mem`). */
export function hamerlySweep(mem: KmeansMemory): void {
  const { d, k } = mem.layout;
  forEachBlock(mem, (lo, hi, b) =>
    sweep(mem, lo, hi, b, mem.sums.subarray(b * k * d, (b + 1) * k * d), mem.counts.subarray(b * k, (b + 1) * k)),
  );
}

/** First assignment from what k-means++ already knows (nearest centre and bounds). */
function startSeeded(mem: KmeansMemory, lo: number, hi: number): void {
  const { nearest, closest, secondLower, assignment, upper, lower } = mem;
  for (let i = lo; i < hi; i++) {
    assignment[i] = nearest[i];
    upper[i] = Math.sqrt(closest[i]);
    // Kept squared while seeding (the square root of the smallest is the smallest square root).
    lower[i] = Math.sqrt(secondLower[i]);
  }
}

/** First assignment from given or random centres: every distance, once. */
function startFromCentres(mem: KmeansMemory, lo: number, hi: number): void {
  const { rows, paddedCentres, assignment, upper, lower } = mem;
  const { d, k } = mem.layout;
  for (let i = lo; i < hi; i++) {
    const ib = i * d;
    let best = 0;
    let bestD = Infinity;
    let secondD = Infinity;
    for (let c = 0; c < k; c += 4) {
      fourDistances(rows, ib, ib, ib, ib, paddedCentres, c * d, (c + 1) * d, (c + 2) * d, (c + 3) * d, d, quad);
      for (let q = 0; q < 4; q++) {
        const s = quad[q];
        if (s < bestD) {
          secondD = bestD;
          bestD = s;
          best = c + q;
        } else if (s < secondD) {
          secondD = s;
        }
      }
    }
    assignment[i] = best;
    upper[i] = Math.sqrt(bestD);
    lower[i] = Math.sqrt(secondD);
  }
}

/**
 * Assignment step: only rows whose bounds allow a change are looked at. A row whose upper bound
 * is below max(lower bound, half the distance from its centre to the nearest other centre)
 * cannot change segment. The bound updates for the last centre move (own centre's move widens
 * the upper bound; the largest move of any other centre narrows the lower bound) are applied in
 * the same sweep. The skip test is strict, so a row that may be tied with another centre is
 * looked at and the tie goes to the lower segment number.
 */
function sweep(mem: KmeansMemory, lo: number, hi: number, b: number, sums: Float64Array, counts: Float64Array): void {
  const { rows, centres, paddedCentres, assignment, upper, lower, moved, halfGap, params } = mem;
  const d = mem.layout.d;
  const most = params[PARAM_MOST];
  const secondMost = params[PARAM_SECOND_MOST];
  const mostAt = params[PARAM_MOST_AT];
  const k4 = paddedCentres.length / d;
  // Rows whose bounds fail are measured against every centre two at a time (twice the
  // independent sums of one row; as WebAssembly where the memory has it); the first waits here
  // for a partner. Rows in between only touch their own bounds, so the segment sums still change
  // in row order.
  const distances = mem.pairScan ? mem.scan.subarray(b * 2 * k4, (b + 1) * 2 * k4) : new Float64Array(2 * k4);
  if (mem.boundPass) {
    // The bound pass as WebAssembly lists the rows to scan, in row order; they pair up the same way.
    const { at } = mem.layout;
    const listed = mem.boundPass(
      at.assignment + lo * 4, at.upper + lo * 8, at.lower + lo * 8, at.rows + lo * d * 8, at.centres, at.moved, at.halfGap,
      hi - lo, d * 8, mostAt, lo, at.listed + lo * 4, most, secondMost,
    ); // prettier-ignore
    const list = mem.listed;
    for (let p = lo; p < lo + listed; p += 2) {
      const i0 = list[p];
      const i1 = p + 1 < lo + listed ? list[p + 1] : i0;
      scanPair(mem, i0, i1, b, distances);
      moveToNearest(mem, i0, distances, 0, sums, counts);
      if (i1 !== i0) moveToNearest(mem, i1, distances, k4, sums, counts);
    }
    return;
  }
  let waiting = -1;
  for (let i = lo; i < hi; i++) {
    const a = assignment[i];
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
      const diff = rows[ib + j] - centres[ab + j];
      own += diff * diff;
    }
    own = Math.sqrt(own);
    upper[i] = own;
    if (own < bound) continue;
    if (waiting < 0) {
      waiting = i;
      continue;
    }
    scanPair(mem, waiting, i, b, distances);
    moveToNearest(mem, waiting, distances, 0, sums, counts);
    moveToNearest(mem, i, distances, k4, sums, counts);
    waiting = -1;
  }
  if (waiting >= 0) {
    // A last row without a partner is measured as its own partner.
    scanPair(mem, waiting, waiting, b, distances);
    moveToNearest(mem, waiting, distances, 0, sums, counts);
  }
}

/** Squared distances of rows i0 and i1 to every padded centre, into distances[0..k4) and [k4..2·k4). */
function scanPair(mem: KmeansMemory, i0: number, i1: number, b: number, distances: Float64Array): void {
  const { rows, paddedCentres, pairScan } = mem;
  const { d, at } = mem.layout;
  const k4 = paddedCentres.length / d;
  if (pairScan) {
    const out = at.scan + b * 2 * k4 * 8;
    pairScan(at.rows + i0 * d * 8, at.rows + i1 * d * 8, at.centresPaired, k4 / 4, d * 8, out, out + k4 * 8);
    return;
  }
  for (let c = 0; c < k4; c += 4) {
    twoByFour(rows, i0 * d, i1 * d, paddedCentres, c * d, d, quad);
    for (let q = 0; q < 4; q++) {
      distances[c + q] = quad[q];
      distances[k4 + c + q] = quad[4 + q];
    }
  }
}

/**
 * Row i (whose upper bound holds its exact distance to its own centre) goes to the nearest
 * centre, from its squared distances to every centre at distances[from..]: compared in centre
 * order against the own distance (ties: the lower segment number), bounds reset to the nearest
 * and second-nearest distances, and the block's segment sums and counts follow a move.
 */
function moveToNearest(
  mem: KmeansMemory,
  i: number,
  distances: Float64Array,
  from: number,
  sums: Float64Array,
  counts: Float64Array,
): void {
  const { rows, assignment, upper, lower } = mem;
  const { d, k } = mem.layout;
  const a = assignment[i];
  const own = upper[i];
  let best = a;
  let bestD = own * own;
  let secondD = Infinity;
  for (let e = 0; e < k; e++) {
    if (e === a) continue;
    const s = distances[from + e];
    if (s < bestD || (s === bestD && e < best)) {
      secondD = bestD;
      bestD = s;
      best = e;
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
    const ib = i * d;
    const ab = a * d;
    const bb = best * d;
    for (let j = 0; j < d; j++) {
      const v = rows[ib + j];
      sums[ab + j] -= v;
      sums[bb + j] += v;
    }
  }
}
