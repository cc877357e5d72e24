// Starting centres for k-means: k-means++ with greedy trials, and plain random rows.
//
// References:
//   D. Arthur and S. Vassilvitskii, "k-means++: the advantages of careful seeding", Proceedings of
//   the 18th ACM-SIAM Symposium on Discrete Algorithms (SODA 2007), 1027–1035,
//   doi:10.5555/1283383.1283494.
//   The greedy variant (several candidates per step, keep the one that lowers the potential most)
//   is described in the same paper's discussion; 2 + floor(ln k) trials is common practice.
//
// The passes over the rows run block by block (kmeans-memory.ts); each returns its block's total
// and the totals are added in block order. The draws and choices between passes are serial.
import type { Random } from '../../random';
import { distancesToPoint, squaredDistance, twoByFour } from '../../measure/squared-distance';
import {
  acrossBlocks,
  blockRange,
  forEachBlock,
  interleaveInPairs,
  releaseKmeansMemory,
  takeKmeansMemory,
  type KmeansMemory,
} from './kmeans-memory';
import { defaultTrials } from './seeding-trials';

let seedingWasmWanted = true;

/** @internal Run the k-means++ sweep as WebAssembly (default, where available) or JavaScript (tests compare them). Returns the previous setting. */
export function setSeedingWasm(use: boolean): boolean {
  const previous = seedingWasmWanted;
  seedingWasmWanted = use;
  return previous;
}

/**
 * k-means++ with greedy trials: for each new centre, draw `trials` candidates with probability
 * proportional to the squared distance to the nearest chosen centre and keep the one that lowers
 * the total the most (2 + floor(ln k) trials is common practice). The centres go to
 * `mem.centres`; `mem.nearest`, `closest` and `secondLower` are left for the first Lloyd step.
 */
export function seedPlusPlusOn(mem: KmeansMemory, random: Random): void {
  const { n, d, k, padded, blocks } = mem.layout;
  const { rows, centres, candidates, candidatesPaired, totals, blockValue } = mem;
  const trials = defaultTrials(k);
  const picked = new Int32Array(trials);
  const totalOf = new Float64Array(trials);
  const wasm = seedingWasmWanted && mem.sweep !== undefined && mem.take !== undefined;

  copyRow(rows, random.int(n), d, centres, 0);
  forEachBlock(mem, (lo, hi, b) => (blockValue[b] = seedFirst(mem, lo, hi)));
  let potential = acrossBlocks(blockValue, blocks, 1, 0);
  for (let c = 1; c < k; c++) {
    for (let t = 0; t < trials; t++) picked[t] = potential > 0 ? drawWeighted(mem, random.next() * potential) : random.int(n);
    // Trial rows side by side, padded to a multiple of four with copies of the last one, and
    // interleaved in pairs (0 and 1, 2 and 3 of each four) for the WebAssembly sweep.
    for (let t = 0; t < padded; t++) copyRow(rows, picked[t < trials ? t : trials - 1], d, candidates, t * d);
    interleaveInPairs(candidates, candidatesPaired, padded, d);
    forEachBlock(mem, (lo, hi, b) => (wasm ? trialsByWasm(mem, lo, hi, b, trials) : measureTrials(mem, lo, hi, b, trials)));
    for (let t = 0; t < trials; t++) totalOf[t] = acrossBlocks(totals, blocks, padded, t);
    // Strictly lower: ties keep the earlier candidate.
    let best = 0;
    for (let t = 1; t < trials; t++) if (totalOf[t] < totalOf[best]) best = t;
    copyRow(rows, picked[best], d, centres, c * d);
    forEachBlock(mem, (lo, hi, b) => (blockValue[b] = wasm ? takeByWasm(mem, lo, hi, c, best) : takeCandidate(mem, lo, hi, c, best)));
    potential = acrossBlocks(blockValue, blocks, 1, 0);
  }
}

/**
 * The row a weighted draw lands on: the block whose share of the potential holds `target`, then
 * the first row of that block whose running weight exceeds what is left (rows of weight 0 are
 * never drawn).
 */
function drawWeighted(mem: KmeansMemory, target: number): number {
  const { layout, blockValue, cumulative } = mem;
  let b = 0;
  while (b < layout.blocks - 1 && target >= blockValue[b]) {
    target -= blockValue[b];
    b++;
  }
  const [lo, hi] = blockRange(layout, b);
  let low = lo;
  let high = hi - 1;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (cumulative[mid] > target) high = mid;
    else low = mid + 1;
  }
  return low;
}

/** k-means++ centres for `data` on plain arrays (mini-batch k-means seeds from a sample this way). */
export function seedPlusPlus(data: Float64Array, n: number, d: number, k: number, random: Random, out: Float64Array): void {
  const mem = takeKmeansMemory(data, n, d, k, 'plain');
  seedPlusPlusOn(mem, random);
  out.set(mem.centres);
  releaseKmeansMemory(mem);
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

function copyRow(data: Float64Array, i: number, d: number, out: Float64Array, at: number): void {
  for (let j = 0; j < d; j++) out[at + j] = data[i * d + j];
}

// ---- the passes over one block of rows ----

/** Distances to the first centre (centres[0..d)); running totals within the block; returns the block's potential. */
function seedFirst(mem: KmeansMemory, lo: number, hi: number): number {
  const { rows, centres, closest, nearest, secondLower, cumulative } = mem;
  distancesToPoint(rows, mem.layout.d, lo, hi, centres, 0, closest);
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
 * takeCandidate. The WebAssembly twin is trialsByWasm; this loop is its test oracle and the
 * path where WebAssembly is missing.
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
 * measureTrials as WebAssembly (kernels/trial-totals.wat), four trials per call: the same
 * distances, stored the same way, and the same totals. The block starts at an even row, so its
 * pairs are the JavaScript loop's pairs; an odd last row is measured here and added last.
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

/** takeCandidate as WebAssembly (kernels/take.wat): the same numbers. */
function takeByWasm(mem: KmeansMemory, lo: number, hi: number, c: number, chosen: number): number {
  const { padded, at } = mem.layout;
  return mem.take!(
    at.closest + lo * 8,
    at.nearest + lo * 4,
    at.secondLower + lo * 8,
    at.cumulative + lo * 8,
    at.stored + (lo * padded + chosen) * 8,
    hi - lo,
    padded * 8,
    c,
  );
}
