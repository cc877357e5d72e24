// Mini-batch k-means (Sculley 2010): each step draws a small random batch of rows, assigns them
// to their nearest centre and pulls that centre towards them with a per-centre learning rate of
// 1 / (rows it has absorbed so far). For very large n it trades a little within-SS for far
// fewer distance evaluations. The reported assignment and figures are computed exactly on all
// rows at the end, as for kmeans.
//
// Reference: D. Sculley, "Web-scale k-means clustering", Proceedings of the 19th International
// Conference on World Wide Web (WWW 2010), 1177–1178, doi:10.1145/1772690.1772862.
import type { RowsInput } from '../../core/matrix';
import { checkInteger, checkOptions } from '../../core/options';
import { checkProgress, report, type ProgressCallback } from '../../core/progress';
import { createRandom, type Random, type Seed } from '../../random';
import { squaredDistance } from '../../measure/squared-distance';
import { centresToMeans } from './centre-update';
import { nearestAll } from './exact-finish';
import { grandSpread } from './grand-spread';
import { takeKmeansMemory } from './kmeans-memory';
import { nestedCentres, type KmeansResult } from './kmeans';
import { checkSegmentCount, partitionRows } from './partition-input';
import { partitionFigures } from './partition-figures';
import { seedPlusPlus } from './seeding';
import { withinOn } from './within-ss';

export interface KmeansMiniBatchOptions {
  k: number;
  /** Seed (default 0); restart r uses createRandom(seed).fork(r). */
  seed?: Seed;
  /** Rows per batch (default 1024; capped at the number of rows). */
  batchSize?: number;
  /** Most batches per restart (default 100). */
  maxIterations?: number;
  /**
   * Stop a restart once the smoothed batch within-SS has not improved for this many batches in a
   * row (default 10); the run then counts as converged.
   */
  patience?: number;
  /** Independent starts, the lowest exact within-SS kept (default 3). */
  restarts?: number;
  onProgress?: ProgressCallback;
}

const MINI_BATCH_OPTIONS = ['k', 'seed', 'batchSize', 'maxIterations', 'patience', 'restarts', 'onProgress'] as const;

/**
 * k-means by mini-batches. k-means++ starts are drawn on a random sample of 3 × batchSize rows
 * (or all rows when fewer). At the end every row goes to its nearest centre (ties: lower
 * segment number) and the centres become the means of their rows.
 */
export function kmeansMiniBatch(rows: RowsInput, options: KmeansMiniBatchOptions): KmeansResult {
  const where = 'kmeansMiniBatch';
  const opts = checkOptions(options, MINI_BATCH_OPTIONS, where);
  checkProgress(opts.onProgress, where);
  const m = partitionRows(rows, where);
  const k = checkSegmentCount(opts.k, m, where);
  const n = m.rows;
  const d = m.cols;
  const batchSize = Math.min(n, checkInteger(opts.batchSize ?? 1024, `${where}: batchSize`, 1));
  const maxIterations = checkInteger(opts.maxIterations ?? 100, `${where}: maxIterations`, 1);
  const patience = checkInteger(opts.patience ?? 10, `${where}: patience`, 1);
  const restarts = checkInteger(opts.restarts ?? 3, `${where}: restarts`, 1);
  const data = m.data;
  // The exact finish of each restart runs over plain arrays (no copy of the rows).
  const mem = takeKmeansMemory(data, n, d, k, 'finish');
  const root = createRandom(opts.seed ?? 0);
  const centers = new Float64Array(k * d);

  let best: { within: number; assignment: Int32Array; centers: Float64Array; iterations: number; converged: boolean } | undefined;
  const restartWithinSS: number[] = [];
  for (let r = 0; r < restarts; r++) {
    const random = root.fork(r);
    const run = miniBatchRun(data, n, d, k, batchSize, maxIterations, patience, random, centers);
    // Every row to its nearest centre, then centres to the means of their rows.
    mem.centres.set(centers);
    nearestAll(mem);
    centresToMeans(mem);
    const within = withinOn(mem);
    restartWithinSS.push(within);
    if (best === undefined || within < best.within) {
      best = { within, assignment: mem.assignment.slice(), centers: mem.centres.slice(), ...run };
    }
    report(opts.onProgress, { task: 'mini-batch k-means restarts', done: r + 1, total: restarts, detail: `k = ${k}` });
  }
  const kept = best!;
  mem.assignment.set(kept.assignment);
  mem.centres.set(kept.centers);
  const figures = partitionFigures(mem, grandSpread(mem));
  return {
    kind: 'kmeans',
    variant: 'mini-batch',
    k,
    assignment: kept.assignment,
    centers: nestedCentres(kept.centers, k, d),
    ...figures,
    iterations: kept.iterations,
    converged: kept.converged,
    restartsRun: restarts,
    refinedRows: 0,
    restartWithinSS,
  };
}

function miniBatchRun(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  batchSize: number,
  maxIterations: number,
  patience: number,
  random: Random,
  centers: Float64Array,
): { iterations: number; converged: boolean } {
  // Start: k-means++ on a sample of rows (distinct rows are guaranteed only for all rows, so a
  // sample with too few distinct ones falls back to all rows).
  const sampleSize = Math.min(n, Math.max(3 * batchSize, 3 * k));
  const sample = sampleRows(data, n, d, sampleSize, random);
  if (sampleSize < n && countDistinct(sample, sampleSize, d, k) < k) seedPlusPlus(data, n, d, k, random, centers);
  else seedPlusPlus(sample, sampleSize, d, k, random, centers);

  const absorbed = new Float64Array(k);
  const batch = new Int32Array(batchSize);
  const nearest = new Int32Array(batchSize);
  const smoothing = Math.min(1, (2 * batchSize) / (n + 1));
  let smoothed = Infinity;
  let bestSmoothed = Infinity;
  let stale = 0;
  let iterations = 0;
  let converged = false;
  while (iterations < maxIterations) {
    iterations++;
    let batchWithin = 0;
    for (let b = 0; b < batchSize; b++) {
      const i = random.int(n);
      batch[b] = i;
      let bestC = 0;
      let bestD = Infinity;
      for (let c = 0; c < k; c++) {
        const s = squaredDistance(data, i * d, centers, c * d, d);
        if (s < bestD) {
          bestD = s;
          bestC = c;
        }
      }
      nearest[b] = bestC;
      batchWithin += bestD;
    }
    // Centres move after the whole batch is assigned (Sculley's cached assignments).
    for (let b = 0; b < batchSize; b++) {
      const c = nearest[b];
      absorbed[c]++;
      const rate = 1 / absorbed[c];
      const ib = batch[b] * d;
      const cb = c * d;
      for (let j = 0; j < d; j++) centers[cb + j] += rate * (data[ib + j] - centers[cb + j]);
    }
    const perRow = batchWithin / batchSize;
    smoothed = smoothed === Infinity ? perRow : smoothed * (1 - smoothing) + perRow * smoothing;
    if (smoothed < bestSmoothed) {
      bestSmoothed = smoothed;
      stale = 0;
    } else if (++stale >= patience) {
      converged = true;
      break;
    }
  }
  return { iterations, converged };
}

function sampleRows(data: Float64Array, n: number, d: number, size: number, random: Random): Float64Array {
  if (size >= n) return data;
  // Partial Fisher–Yates: `size` distinct row indices.
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  const out = new Float64Array(size * d);
  for (let s = 0; s < size; s++) {
    const j = s + random.int(n - s);
    const t = order[s];
    order[s] = order[j];
    order[j] = t;
    out.set(data.subarray(order[s] * d, order[s] * d + d), s * d);
  }
  return out;
}

function countDistinct(sample: Float64Array, size: number, d: number, enough: number): number {
  const keys = new Set<string>();
  for (let s = 0; s < size && keys.size < enough; s++) keys.add(Array.from(sample.subarray(s * d, s * d + d)).join(','));
  return keys.size;
}
