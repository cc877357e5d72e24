// Starting centres for k-means: k-means++ (Arthur & Vassilvitskii 2007) and plain random rows.
import type { Random } from '../../random';
import type { SeedingArena } from './seedingWasm';

/**
 * What k-means++ learns about every row on the way, handed to the iterations so their first
 * assignment costs nothing: the nearest chosen centre, the squared distance to it, and a lower
 * bound on the distance to any other chosen centre.
 */
export interface SeedingState {
  readonly nearest: Int32Array;
  readonly closest: Float64Array;
  readonly secondLower: Float64Array;
  /** Scratch: running totals of `closest` for the weighted draws. */
  readonly cumulative: Float64Array;
  /** Where the trial sweep runs as WebAssembly: `closest` and `nearest` then live in its memory. */
  readonly arena?: SeedingArena;
}

export function createSeedingState(n: number, arena?: SeedingArena): SeedingState {
  if (arena && arena.n === n) {
    return {
      nearest: new Int32Array(arena.memory.buffer, arena.nearestAt, n),
      closest: new Float64Array(arena.memory.buffer, arena.closestAt, n),
      secondLower: new Float64Array(arena.memory.buffer, arena.secondLowerAt, n),
      cumulative: new Float64Array(arena.memory.buffer, arena.cumulativeAt, n),
      arena,
    };
  }
  return { nearest: new Int32Array(n), closest: new Float64Array(n), secondLower: new Float64Array(n), cumulative: new Float64Array(n) };
}

/** Greedy trials per new centre: 2 + floor(ln k) (common practice). */
export function defaultTrials(k: number): number {
  return 2 + Math.floor(Math.log(k));
}

/**
 * k-means++ with greedy trials: for each new centre, draw `trials` candidates with probability
 * proportional to the squared distance to the nearest chosen centre and keep the one that lowers
 * the total the most (2 + floor(ln k) trials is common practice). Writes k × d values into `out`.
 *
 * Every row is measured against every candidate (a flat sweep is cheaper here than skipping
 * rows by the triangle inequality).
 */
export function seedPlusPlus(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  random: Random,
  out: Float64Array,
  state: SeedingState = createSeedingState(n),
  trials = defaultTrials(k),
): void {
  const { nearest, closest, secondLower, cumulative } = state;
  const candidates = new Int32Array(trials);
  const totals = new Float64Array(trials);
  const paddedTrials = 4 * Math.ceil(trials / 4);
  const candidateRows = new Float64Array(paddedTrials * d);
  const arena = state.arena;
  const onArena = arena !== undefined && arena.source === data && arena.n === n && arena.d === d && arena.k === k && arena.padded === paddedTrials;
  const stored = onArena ? new Float64Array(arena.memory.buffer, arena.storedAt, paddedTrials * n) : new Float64Array(paddedTrials * n);

  const first = random.int(n);
  copyRow(data, first, d, out, 0);
  for (let i = 0; i < n; i++) {
    closest[i] = squaredDistanceRows(data, i * d, out, 0, d);
    nearest[i] = 0;
    secondLower[i] = Infinity;
  }

  let potential = 0;
  for (let i = 0; i < n; i++) {
    potential += closest[i];
    cumulative[i] = potential;
  }
  for (let c = 1; c < k; c++) {
    for (let t = 0; t < trials; t++) {
      const candidate = potential > 0 ? drawWeighted(cumulative, random.next() * potential) : random.int(n);
      candidates[t] = candidate;
      totals[t] = 0;
    }
    // Candidate rows side by side, padded to a multiple of four with copies of the last one.
    for (let t = 0; t < paddedTrials; t++) copyRow(data, candidates[t < trials ? t : trials - 1], d, candidateRows, t * d);
    if (onArena) measureTrialsOnArena(arena, trials, candidateRows, totals);
    else measureTrials(data, n, d, trials, candidateRows, closest, totals, stored, paddedTrials);
    // Strictly lower: ties keep the earlier candidate.
    let bestTrial = 0;
    for (let t = 1; t < trials; t++) if (totals[t] < totals[bestTrial]) bestTrial = t;
    copyRow(data, candidates[bestTrial], d, out, c * d);
    // The running total for the next centre's draws is summed in the same pass (same order, same numbers).
    potential = takeCandidate(n, c, stored, paddedTrials, bestTrial, closest, nearest, secondLower, cumulative);
  }
}

/**
 * The totals of all trials in one sweep over the rows, two rows against four candidates at a
 * time: eight independent sums keep the adder busy and each loaded value serves several pairs,
 * while every pair is still summed in column order (the same number as measured alone). Every
 * row is measured against every candidate (no triangle-inequality skip: the exact distance gives
 * takeCandidate a tighter bound and a branch-free update, and the WebAssembly sweep measures all
 * rows anyway). Each total is summed in row order. The distances are kept row by row
 * (`stored[i × padded + t]`, one contiguous stream) for takeCandidate.
 */
function measureTrials(
  data: Float64Array,
  n: number,
  d: number,
  trials: number,
  candidateRows: Float64Array,
  closest: Float64Array,
  totals: Float64Array,
  stored: Float64Array,
  padded: number,
): void {
  const sums = new Float64Array(8);
  for (let i = 0; i < n; i += 2) {
    // An odd last row is paired with itself; the copy's results are not used.
    const pair = i + 1 < n;
    const i1 = pair ? i + 1 : i;
    const own0 = closest[i];
    const own1 = closest[i1];
    const a0 = i * d;
    const a1 = i1 * d;
    for (let t0 = 0; t0 < trials; t0 += 4) {
      const tEnd = t0 + 4 < trials ? t0 + 4 : trials;
      const c0 = t0 * d;
      const c1 = c0 + d;
      const c2 = c1 + d;
      const c3 = c2 + d;
      let s00 = 0, s01 = 0, s02 = 0, s03 = 0; // prettier-ignore
      let s10 = 0, s11 = 0, s12 = 0, s13 = 0; // prettier-ignore
      for (let j = 0; j < d; j++) {
        const x = data[a0 + j];
        const y = data[a1 + j];
        const v0 = candidateRows[c0 + j];
        const v1 = candidateRows[c1 + j];
        const v2 = candidateRows[c2 + j];
        const v3 = candidateRows[c3 + j];
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
      sums[0] = s00;
      sums[1] = s01;
      sums[2] = s02;
      sums[3] = s03;
      sums[4] = s10;
      sums[5] = s11;
      sums[6] = s12;
      sums[7] = s13;
      const o0 = i * padded + t0;
      stored[o0] = s00;
      stored[o0 + 1] = s01;
      stored[o0 + 2] = s02;
      stored[o0 + 3] = s03;
      if (pair) {
        stored[o0 + padded] = s10;
        stored[o0 + padded + 1] = s11;
        stored[o0 + padded + 2] = s12;
        stored[o0 + padded + 3] = s13;
      }
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
 * stored the same way, and the same totals. Candidates go in interleaved by pairs.
 */
function measureTrialsOnArena(arena: SeedingArena, trials: number, candidateRows: Float64Array, totals: Float64Array): void {
  const { view, n, d, padded } = arena;
  const cand = arena.candAt / 8;
  const sums = arena.totalsAt / 8;
  for (let t0 = 0; t0 < trials; t0 += 4) {
    for (let j = 0; j < d; j++) {
      view[cand + 2 * j] = candidateRows[t0 * d + j];
      view[cand + 2 * j + 1] = candidateRows[(t0 + 1) * d + j];
      view[cand + 2 * d + 2 * j] = candidateRows[(t0 + 2) * d + j];
      view[cand + 2 * d + 2 * j + 1] = candidateRows[(t0 + 3) * d + j];
    }
    arena.totals(arena.rowsAt, arena.candAt, arena.gapsAt, arena.closestAt, arena.nearestAt, n >> 1, d * 8, arena.storedAt + t0 * 8, padded * 8, arena.totalsAt);
    for (let t = t0; t < trials && t < t0 + 4; t++) totals[t] = view[sums + t - t0];
    if (n % 2 === 1) {
      // The sweep takes rows in pairs: an odd last row is measured here, added last (row order).
      const i = n - 1;
      const own = view[arena.closestAt / 8 + i];
      for (let t = t0; t < t0 + 4; t++) {
        const s = squaredDistanceRows(view, arena.rowsAt / 8 + i * d, candidateRows, t * d, d);
        view[arena.storedAt / 8 + i * padded + t] = s;
        if (t < trials) totals[t] += s < own ? s : own;
      }
    }
  }
}

/**
 * Centre c becomes the chosen candidate: rows it wins (strictly closer; ties keep the earlier,
 * lower-numbered centre) move to it, and every row's lower bound on the distance to its other
 * centres takes the new centre in: the larger of the old and new nearest distances. The same
 * pass writes the running total of the new nearest distances (row order) into `cumulative` and
 * returns the grand total: the weights of the next centre's draws.
 */
function takeCandidate(
  n: number,
  c: number,
  stored: Float64Array,
  padded: number,
  chosen: number,
  closest: Float64Array,
  nearest: Int32Array,
  secondLower: Float64Array,
  cumulative: Float64Array,
): number {
  let running = 0;
  for (let i = 0; i < n; i++) {
    const own = closest[i];
    const s = stored[i * padded + chosen];
    // Plain branches measure faster here than Math.min / Math.max (which must handle NaN and −0).
    if (s < own) {
      nearest[i] = c;
      closest[i] = s;
      running += s;
      const bound = Math.sqrt(own);
      if (bound < secondLower[i]) secondLower[i] = bound;
    } else {
      running += own;
      const bound = Math.sqrt(s);
      if (bound < secondLower[i]) secondLower[i] = bound;
    }
    cumulative[i] = running;
  }
  return running;
}

/** k distinct rows drawn uniformly (partial Fisher–Yates on the row indices). */
export function seedRandomRows(data: Float64Array, n: number, d: number, k: number, random: Random, out: Float64Array): void {
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  for (let c = 0; c < k; c++) {
    const j = c + random.int(n - c);
    const t = order[c];
    order[c] = order[j];
    order[j] = t;
    copyRow(data, order[c], d, out, c * d);
  }
}

/** First index whose cumulative weight exceeds `target`: rows of weight 0 are never drawn. */
function drawWeighted(cumulative: Float64Array, target: number): number {
  let low = 0;
  let high = cumulative.length - 1;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (cumulative[mid] > target) high = mid;
    else low = mid + 1;
  }
  return low;
}

function copyRow(data: Float64Array, i: number, d: number, out: Float64Array, at: number): void {
  for (let j = 0; j < d; j++) out[at + j] = data[i * d + j];
}

function squaredDistanceRows(a: Float64Array, ab: number, b: Float64Array, bb: number, d: number): number {
  let s = 0;
  for (let j = 0; j < d; j++) {
    const diff = a[ab + j] - b[bb + j];
    s += diff * diff;
  }
  return s;
}
