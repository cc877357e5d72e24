// Prediction strength (Tibshirani & Walther 2005): split the rows in two halves at random, segment
// each half with k-means, and assign the rows of the test half to the centres found on the
// training half. For each test segment, the share of its pairs of rows that the training centres
// also put together; the smallest share over the test segments is the prediction strength of that
// split. The mean over several splits is reported. The paper recommends the largest k whose
// prediction strength is at least 0.8 to 0.9; we read from 0.8 (common practice after the paper).
import type { Matrix } from '../core/matrix';
import { takeRows } from '../core/matrix';
import { countDistinctRows } from '../methods/partition/distinct-rows';
import { kmeans } from '../methods/partition/kmeans';
import type { Random } from '../random';

export const PREDICTION_STRENGTH_FROM = 0.8;

export interface PredictionStrengthOptions {
  /** Random halvings of the rows. */
  splits: number;
  restarts: number;
  random: Random;
}

/** Mean prediction strength at each k of `ks` over `splits` random halvings of the rows of `m`. */
export function predictionStrengthAcrossK(m: Matrix, ks: readonly number[], options: PredictionStrengthOptions): number[] {
  const n = m.rows;
  const half = Math.floor(n / 2);
  const sums = new Float64Array(ks.length);
  for (let s = 0; s < options.splits; s++) {
    const random = options.random.fork(`split ${s}`);
    const order = random.shuffle(Int32Array.from({ length: n }, (_, i) => i));
    const test = takeRows(m, order.subarray(0, half));
    const training = takeRows(m, order.subarray(half));
    ks.forEach((k, t) => {
      const kFit = Math.min(k, countDistinctRows(test, k), countDistinctRows(training, k));
      if (kFit < 2) return; // a half too small to split: strength 0 for this k
      const seed = random.uint32();
      const own = kmeans(test, { k: kFit, seed, restarts: options.restarts }).assignment;
      const centres = kmeans(training, { k: kFit, seed, restarts: options.restarts }).centers;
      sums[t] += strength(test, own, kFit, nearestCentre(test, centres));
    });
  }
  return Array.from(sums, (v) => v / options.splits);
}

function nearestCentre(m: Matrix, centres: number[][]): Int32Array {
  const { rows, cols, data } = m;
  const out = new Int32Array(rows);
  for (let i = 0; i < rows; i++) {
    let best = Infinity;
    for (let c = 0; c < centres.length; c++) {
      let d = 0;
      for (let j = 0; j < cols; j++) {
        const t = data[i * cols + j] - centres[c][j];
        d += t * t;
      }
      if (d < best) {
        best = d;
        out[i] = c;
      }
    }
  }
  return out;
}

/** min over test segments of the share of their row pairs that `predicted` also keeps together. */
function strength(m: Matrix, own: Int32Array, k: number, predicted: Int32Array): number {
  const counts = new Float64Array(k * k);
  const sizes = new Float64Array(k);
  for (let i = 0; i < m.rows; i++) {
    counts[own[i] * k + predicted[i]]++;
    sizes[own[i]]++;
  }
  let lowest = 1;
  for (let a = 0; a < k; a++) {
    if (sizes[a] < 2) continue; // a segment of one row has no pairs (the paper skips it too)
    let together = 0;
    for (let b = 0; b < k; b++) together += (counts[a * k + b] * (counts[a * k + b] - 1)) / 2;
    lowest = Math.min(lowest, together / ((sizes[a] * (sizes[a] - 1)) / 2));
  }
  return lowest;
}
