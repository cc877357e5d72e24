// The row-parallel parts of k-means: each phase works on one block of rows and writes only that
// block's rows and that block's totals, so threads can run different blocks at once and the
// numbers are the same as running them one after the other. The serial steps between phases
// (draws, centre updates) are in seeding.ts and hamerly.ts.
import { sqeuclideanPair as squaredDistance } from '../../measure/metrics';
import { blockRange, PARAM_MOST, PARAM_MOST_AT, PARAM_SECOND_MOST, PARAM_SEEDING_WASM, type KmeansMemory } from './kmeans-memory';

export enum Phase {
  /** Column sums of the block (grand[b × d + j]). */
  ColumnSums = 1,
  /** Σ squared distance to the grand mean (in grand[0..d)) → blockValue. */
  SpreadAbout,
  /** k-means++ start: distances to centre 0 and their running totals → blockValue = potential. */
  SeedFirst,
  /** Distances to the trial rows, stored, and each trial's total (arg0 = trials). */
  Trials,
  /** Trial arg1 becomes centre arg0 → blockValue = potential. */
  Take,
  /** First Lloyd assignment from what k-means++ knows; segment sums and counts. */
  StartSeeded,
  /** First Lloyd assignment by measuring every centre; segment sums and counts. */
  StartFromCentres,
  /** One Hamerly assignment sweep. */
  Sweep,
  /** Segment sums and counts from scratch. */
  Sums,
  /** Within-SS per segment → parts. */
  Within,
  /** Every row to its nearest centre by a full scan; counts → blockValue = rows that changed. */
  Nearest,
}

export function runBlock(mem: KmeansMemory, phase: Phase, b: number, arg0: number, arg1: number): void {
  const [lo, hi] = blockRange(mem.layout, b);
  const { d, k } = mem.layout;
  const sums = mem.sums.subarray(b * k * d, (b + 1) * k * d);
  const counts = mem.counts.subarray(b * k, (b + 1) * k);
  switch (phase) {
    case Phase.ColumnSums:
      return columnSums(mem.rows, d, lo, hi, mem.grand.subarray(b * d, (b + 1) * d));
    case Phase.SpreadAbout:
      mem.blockValue[b] = spreadAbout(mem, lo, hi);
      return;
    case Phase.SeedFirst:
      mem.blockValue[b] = seedFirst(mem, lo, hi);
      return;
    case Phase.Trials:
      if (mem.params[PARAM_SEEDING_WASM] === 1 && mem.sweep) trialsByWasm(mem, lo, hi, b, arg0);
      else measureTrials(mem, lo, hi, b, arg0);
      return;
    case Phase.Take:
      mem.blockValue[b] = mem.params[PARAM_SEEDING_WASM] === 1 && mem.take ? takeByWasm(mem, lo, hi, arg0, arg1) : takeCandidate(mem, lo, hi, arg0, arg1);
      return;
    case Phase.StartSeeded:
      startSeeded(mem, lo, hi);
      return blockSums(mem, lo, hi, b, sums, counts);
    case Phase.StartFromCentres:
      return startFromCentres(mem, lo, hi, sums, counts);
    case Phase.Sweep:
      return sweep(mem, lo, hi, b, sums, counts);
    case Phase.Sums:
      return blockSums(mem, lo, hi, b, sums, counts);
    case Phase.Within:
      return withinParts(mem.rows, d, lo, hi, mem.assignment, mem.centres, mem.parts.subarray(b * k, (b + 1) * k));
    case Phase.Nearest:
      mem.blockValue[b] = nearestRows(mem.rows, d, k, lo, hi, mem.paddedCentres, mem.assignment, counts);
      return;
  }
}

// ---- kernels on plain arrays and row ranges ----

const quad = new Float64Array(8);

/**
 * Squared distances of the rows at a0 and a1 to the four rows of `others` from b0 on, into
 * out[0..3] and out[4..7]. Eight independent sums keep the adder busy and each loaded value
 * serves several pairs, while every distance is still summed in column order (the same number
 * as measured alone).
 */
function twoByFour(rows: Float64Array, a0: number, a1: number, others: Float64Array, b0: number, d: number, out: Float64Array): void {
  const b1 = b0 + d;
  const b2 = b1 + d;
  const b3 = b2 + d;
  let s00 = 0, s01 = 0, s02 = 0, s03 = 0; // prettier-ignore
  let s10 = 0, s11 = 0, s12 = 0, s13 = 0; // prettier-ignore
  for (let j = 0; j < d; j++) {
    const x = rows[a0 + j];
    const y = rows[a1 + j];
    const v0 = others[b0 + j];
    const v1 = others[b1 + j];
    const v2 = others[b2 + j];
    const v3 = others[b3 + j];
    let e = x - v0;
    s00 += e * e;
    e = x - v1;
    s01 += e * e;
    e = x - v2;
    s02 += e * e;
    e = x - v3;
    s03 += e * e;
    e = y - v0;
    s10 += e * e;
    e = y - v1;
    s11 += e * e;
    e = y - v2;
    s12 += e * e;
    e = y - v3;
    s13 += e * e;
  }
  out[0] = s00;
  out[1] = s01;
  out[2] = s02;
  out[3] = s03;
  out[4] = s10;
  out[5] = s11;
  out[6] = s12;
  out[7] = s13;
}

/**
 * Four squared distances at once, between rows of `a` (from a0 … a3) and rows of `b` (from
 * b0 … b3), into out[0..3]: four independent sums keep the adder busy where one would wait on
 * it at every column, and each is still summed in column order (the same number as alone).
 */
function fourDistances(
  a: Float64Array, a0: number, a1: number, a2: number, a3: number,
  b: Float64Array, b0: number, b1: number, b2: number, b3: number,
  d: number, out: Float64Array,
): void { // prettier-ignore
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0; // prettier-ignore
  for (let j = 0; j < d; j++) {
    let e = a[a0 + j] - b[b0 + j];
    s0 += e * e;
    e = a[a1 + j] - b[b1 + j];
    s1 += e * e;
    e = a[a2 + j] - b[b2 + j];
    s2 += e * e;
    e = a[a3 + j] - b[b3 + j];
    s3 += e * e;
  }
  out[0] = s0;
  out[1] = s1;
  out[2] = s2;
  out[3] = s3;
}

function columnSums(rows: Float64Array, d: number, lo: number, hi: number, out: Float64Array): void {
  out.fill(0);
  for (let i = lo; i < hi; i++) for (let j = 0; j < d; j++) out[j] += rows[i * d + j];
}

function spreadAbout(mem: KmeansMemory, lo: number, hi: number): number {
  // `closest` is free scratch before seeding.
  distancesToCentre(mem.rows, mem.layout.d, lo, hi, mem.grand, 0, mem.closest);
  let total = 0;
  for (let i = lo; i < hi; i++) total += mem.closest[i];
  return total;
}

/**
 * Squared distance of rows [lo, hi) to the one centre at `centres[at..at + d)`, into out[i],
 * four rows at a time (fourDistances).
 */
function distancesToCentre(rows: Float64Array, d: number, lo: number, hi: number, centres: Float64Array, at: number, out: Float64Array): void {
  let i = lo;
  for (; i + 3 < hi; i += 4) {
    const b0 = i * d;
    fourDistances(rows, b0, b0 + d, b0 + 2 * d, b0 + 3 * d, centres, at, at, at, at, d, quad);
    for (let q = 0; q < 4; q++) out[i + q] = quad[q];
  }
  for (; i < hi; i++) out[i] = squaredDistance(rows, i * d, centres, at, d);
}

/** Segment sums and counts of block b from scratch: as WebAssembly where the memory has it. */
function blockSums(mem: KmeansMemory, lo: number, hi: number, b: number, sums: Float64Array, counts: Float64Array): void {
  const { d, k, at } = mem.layout;
  if (!mem.segmentSums) return segmentSums(mem.rows, d, lo, hi, mem.assignment, sums, counts);
  sums.fill(0);
  counts.fill(0);
  mem.segmentSums(at.rows + lo * d * 8, at.assignment + lo * 4, at.sums + b * k * d * 8, at.counts + b * k * 8, hi - lo, d * 8, 16 * (d >> 1));
}

/** Segment sums and counts of rows [lo, hi) from scratch. */
function segmentSums(rows: Float64Array, d: number, lo: number, hi: number, assignment: Int32Array, sums: Float64Array, counts: Float64Array): void {
  sums.fill(0);
  counts.fill(0);
  for (let i = lo; i < hi; i++) {
    const a = assignment[i];
    counts[a]++;
    const ib = i * d;
    const sb = a * d;
    for (let j = 0; j < d; j++) sums[sb + j] += rows[ib + j];
  }
}

/** Within-SS of rows [lo, hi) per segment, into `parts` (cleared first). */
function withinParts(rows: Float64Array, d: number, lo: number, hi: number, assignment: Int32Array, centres: Float64Array, parts: Float64Array): void {
  parts.fill(0);
  let i = lo;
  // Four rows at a time (fourDistances); added to the parts in row order.
  for (; i + 3 < hi; i += 4) {
    const b0 = i * d;
    const a0 = assignment[i];
    const a1 = assignment[i + 1];
    const a2 = assignment[i + 2];
    const a3 = assignment[i + 3];
    fourDistances(rows, b0, b0 + d, b0 + 2 * d, b0 + 3 * d, centres, a0 * d, a1 * d, a2 * d, a3 * d, d, quad);
    parts[a0] += quad[0];
    parts[a1] += quad[1];
    parts[a2] += quad[2];
    parts[a3] += quad[3];
  }
  for (; i < hi; i++) {
    const a = assignment[i];
    parts[a] += squaredDistance(rows, i * d, centres, a * d, d);
  }
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

// ---- k-means++ (Arthur & Vassilvitskii 2007) ----

/** Distances to the first centre (centres[0..d)); running totals within the block; returns the block's potential. */
function seedFirst(mem: KmeansMemory, lo: number, hi: number): number {
  const { rows, centres, closest, nearest, secondLower, cumulative } = mem;
  const d = mem.layout.d;
  distancesToCentre(rows, d, lo, hi, centres, 0, closest);
  let running = 0;
  for (let i = lo; i < hi; i++) {
    nearest[i] = 0;
    secondLower[i] = Infinity;
    running += closest[i];
    cumulative[i] = running;
  }
  return running;
}

/**
 * The totals of all trials over the block's rows, two rows against four candidates at a time
 * (twoByFour). Every row is measured against every candidate (the exact distance gives
 * takeCandidate a tighter bound and a branch-free update). Each total is summed in row order.
 * The distances are kept row by row (`stored[i × padded + t]`, one contiguous stream) for
 * takeCandidate.
 */
function measureTrials(mem: KmeansMemory, lo: number, hi: number, b: number, trials: number): void {
  const { rows, candidates, closest, stored } = mem;
  const { d, padded } = mem.layout;
  const totals = mem.totals.subarray(b * padded, (b + 1) * padded);
  totals.fill(0);
  const sums = new Float64Array(8);
  for (let i = lo; i < hi; i += 2) {
    // An odd last row is paired with itself; the copy's results are not used.
    const pair = i + 1 < hi;
    const i1 = pair ? i + 1 : i;
    const own0 = closest[i];
    const own1 = closest[i1];
    const a0 = i * d;
    const a1 = i1 * d;
    for (let t0 = 0; t0 < trials; t0 += 4) {
      const tEnd = t0 + 4 < trials ? t0 + 4 : trials;
      twoByFour(rows, a0, a1, candidates, t0 * d, d, sums);
      const o0 = i * padded + t0;
      for (let t = 0; t < 4; t++) stored[o0 + t] = sums[t];
      if (pair) for (let t = 0; t < 4; t++) stored[o0 + padded + t] = sums[4 + t];
      for (let t = t0; t < tEnd; t++) {
        let s = sums[t - t0];
        totals[t] += s < own0 ? s : own0;
        if (!pair) continue;
        s = sums[4 + t - t0];
        totals[t] += s < own1 ? s : own1;
      }
    }
  }
}

/**
 * measureTrials as WebAssembly (seedingWasm.ts), four trials per call: the same distances,
 * stored the same way, and the same totals. The block starts at an even row, so its pairs are
 * the sweep's pairs; an odd last row is measured here and added last (row order).
 */
function trialsByWasm(mem: KmeansMemory, lo: number, hi: number, b: number, trials: number): void {
  const { layout, sweep, rows, candidates, closest, stored } = mem;
  const { d, padded, at } = layout;
  const totals = mem.totals.subarray(b * padded, (b + 1) * padded);
  const count = (hi - lo) >> 1;
  for (let t0 = 0; t0 < trials; t0 += 4) {
    sweep!(
      at.rows + lo * d * 8, at.candidatesPaired + t0 * d * 8, at.closest + lo * 8, count, d * 8,
      at.stored + (lo * padded + t0) * 8, padded * 8, at.totals + (b * padded + t0) * 8,
    ); // prettier-ignore
    if ((hi - lo) % 2 === 1) {
      const i = hi - 1;
      const own = closest[i];
      for (let t = t0; t < t0 + 4; t++) {
        const s = squaredDistance(rows, i * d, candidates, t * d, d);
        stored[i * padded + t] = s;
        if (t < trials) totals[t] += s < own ? s : own;
      }
    }
  }
}

/**
 * Centre c becomes the chosen trial: rows it wins (strictly closer; ties keep the earlier,
 * lower-numbered centre) move to it, and every row's lower bound on the distance to its other
 * centres takes the new centre in: the larger of the old and new nearest distances. The same
 * pass writes the running total of the new nearest distances (row order, within the block) and
 * returns the block's total: the weights of the next centre's draws.
 */
function takeCandidate(mem: KmeansMemory, lo: number, hi: number, c: number, chosen: number): number {
  const { stored, closest, nearest, secondLower, cumulative } = mem;
  const padded = mem.layout.padded;
  let running = 0;
  for (let i = lo; i < hi; i++) {
    const own = closest[i];
    const s = stored[i * padded + chosen];
    // Plain branches measure faster here than Math.min / Math.max (which must handle NaN and −0).
    if (s < own) {
      nearest[i] = c;
      closest[i] = s;
      running += s;
      if (own < secondLower[i]) secondLower[i] = own;
    } else {
      running += own;
      if (s < secondLower[i]) secondLower[i] = s;
    }
    cumulative[i] = running;
  }
  return running;
}

/** takeCandidate as WebAssembly (take-wasm.ts): the same numbers. */
function takeByWasm(mem: KmeansMemory, lo: number, hi: number, c: number, chosen: number): number {
  const { padded, at } = mem.layout;
  return mem.take!(at.closest + lo * 8, at.nearest + lo * 4, at.secondLower + lo * 8, at.cumulative + lo * 8, at.stored + (lo * padded + chosen) * 8, hi - lo, padded * 8, c);
}

// ---- Lloyd iterations with Hamerly's (2010) bounds ----

/** First assignment from what k-means++ already knows (nearest centre and bounds); the caller then takes the sums. */
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
function startFromCentres(mem: KmeansMemory, lo: number, hi: number, sums: Float64Array, counts: Float64Array): void {
  const { rows, paddedCentres, assignment, upper, lower } = mem;
  const { d, k } = mem.layout;
  sums.fill(0);
  counts.fill(0);
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
    counts[best]++;
    const sb = best * d;
    for (let j = 0; j < d; j++) sums[sb + j] += rows[ib + j];
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
function moveToNearest(mem: KmeansMemory, i: number, distances: Float64Array, from: number, sums: Float64Array, counts: Float64Array): void {
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
