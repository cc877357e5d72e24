// Starting centres for k-means: k-means++ (Arthur & Vassilvitskii 2007) and plain random rows.
import type { Random } from '../../random';

/**
 * k-means++ with greedy trials: for each new centre, draw `trials` candidates with probability
 * proportional to the squared distance to the nearest chosen centre and keep the one that lowers
 * the total the most. 2 + floor(ln k) trials is common practice. Writes k × d values into `out`.
 */
export function seedPlusPlus(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  random: Random,
  out: Float64Array,
  trials = 2 + Math.floor(Math.log(k)),
): void {
  const closest = new Float64Array(n);
  const cumulative = new Float64Array(n);
  let bestTrial = new Float64Array(n);
  let trial = new Float64Array(n);

  const first = random.int(n);
  copyRow(data, first, d, out, 0);
  let potential = 0;
  for (let i = 0; i < n; i++) {
    closest[i] = squaredToRow(data, i, d, out, 0);
    potential += closest[i];
  }

  for (let c = 1; c < k; c++) {
    let running = 0;
    for (let i = 0; i < n; i++) {
      running += closest[i];
      cumulative[i] = running;
    }
    potential = running;
    let bestPotential = Infinity;
    let bestIndex = -1;
    for (let t = 0; t < trials; t++) {
      const candidate = potential > 0 ? drawWeighted(cumulative, random.next() * potential) : random.int(n);
      let total = 0;
      const cb = candidate * d;
      for (let i = 0; i < n; i++) {
        let s = 0;
        const ib = i * d;
        for (let j = 0; j < d; j++) {
          const diff = data[ib + j] - data[cb + j];
          s += diff * diff;
        }
        const v = s < closest[i] ? s : closest[i];
        trial[i] = v;
        total += v;
      }
      // Strictly lower: ties keep the earlier candidate.
      if (total < bestPotential) {
        bestPotential = total;
        bestIndex = candidate;
        const swap = bestTrial;
        bestTrial = trial;
        trial = swap;
      }
    }
    copyRow(data, bestIndex, d, out, c * d);
    closest.set(bestTrial);
  }
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

function squaredToRow(data: Float64Array, i: number, d: number, centers: Float64Array, at: number): number {
  let s = 0;
  const ib = i * d;
  for (let j = 0; j < d; j++) {
    const diff = data[ib + j] - centers[at + j];
    s += diff * diff;
  }
  return s;
}
