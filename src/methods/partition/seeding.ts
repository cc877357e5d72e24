// Starting centres for k-means: k-means++ (Arthur & Vassilvitskii 2007) and plain random rows.
// The sweeps over the rows are phases of kmeans-blocks.ts; the draws and choices here are serial.
import type { Random } from '../../random';
import { Phase } from './kmeans-blocks';
import { acrossBlocks, blockRange, interleaveInPairs, PARAM_SEEDING_WASM, releaseKmeansMemory, takeKmeansMemory, type KmeansMemory } from './kmeans-memory';
import { localTeam, type KmeansTeam } from './kmeans-team';

/** Greedy trials per new centre: 2 + floor(ln k) (common practice). */
export function defaultTrials(k: number): number {
  return 2 + Math.floor(Math.log(k));
}

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
export function seedPlusPlusOn(team: KmeansTeam, mem: KmeansMemory, random: Random): void {
  const { n, d, k, padded, blocks } = mem.layout;
  const { rows, centres, candidates, candidatesPaired, totals, blockValue } = mem;
  const trials = defaultTrials(k);
  const picked = new Int32Array(trials);
  const totalOf = new Float64Array(trials);
  mem.params[PARAM_SEEDING_WASM] = seedingWasmWanted ? 1 : 0;

  copyRow(rows, random.int(n), d, centres, 0);
  team.run(Phase.SeedFirst);
  let potential = acrossBlocks(blockValue, blocks, 1, 0);
  for (let c = 1; c < k; c++) {
    for (let t = 0; t < trials; t++) picked[t] = potential > 0 ? drawWeighted(mem, random.next() * potential) : random.int(n);
    // Trial rows side by side, padded to a multiple of four with copies of the last one, and
    // interleaved in pairs (0 and 1, 2 and 3 of each four) for the WebAssembly sweep.
    for (let t = 0; t < padded; t++) copyRow(rows, picked[t < trials ? t : trials - 1], d, candidates, t * d);
    interleaveInPairs(candidates, candidatesPaired, padded, d);
    team.run(Phase.Trials, trials);
    for (let t = 0; t < trials; t++) totalOf[t] = acrossBlocks(totals, blocks, padded, t);
    // Strictly lower: ties keep the earlier candidate.
    let best = 0;
    for (let t = 1; t < trials; t++) if (totalOf[t] < totalOf[best]) best = t;
    copyRow(rows, picked[best], d, centres, c * d);
    team.run(Phase.Take, c, best);
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

/** k-means++ centres for `data` on the calling thread alone (mini-batch k-means seeds from a sample this way). */
export function seedPlusPlus(data: Float64Array, n: number, d: number, k: number, random: Random, out: Float64Array): void {
  const mem = takeKmeansMemory(data, n, d, k, 'plain');
  seedPlusPlusOn(localTeam(mem), mem, random);
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
