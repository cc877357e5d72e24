// Starting centres for k-means: k-means++ (Arthur & Vassilvitskii 2007) and plain random rows.
import type { Random } from '../../random';

/**
 * What k-means++ learns about every row on the way, handed to the iterations so their first
 * assignment costs nothing: the nearest chosen centre, the squared distance to it, and a lower
 * bound on the distance to any other chosen centre.
 */
export interface SeedingState {
  readonly nearest: Int32Array;
  readonly closest: Float64Array;
  readonly secondLower: Float64Array;
}

export function createSeedingState(n: number): SeedingState {
  return { nearest: new Int32Array(n), closest: new Float64Array(n), secondLower: new Float64Array(n) };
}

/**
 * k-means++ with greedy trials: for each new centre, draw `trials` candidates with probability
 * proportional to the squared distance to the nearest chosen centre and keep the one that lowers
 * the total the most (2 + floor(ln k) trials is common practice). Writes k × d values into `out`.
 *
 * The triangle inequality skips rows that a candidate cannot win: if the candidate is at least
 * twice as far from a row's nearest centre as the row is, the row keeps its nearest centre.
 */
export function seedPlusPlus(
  data: Float64Array,
  n: number,
  d: number,
  k: number,
  random: Random,
  out: Float64Array,
  state: SeedingState = createSeedingState(n),
  trials = 2 + Math.floor(Math.log(k)),
): void {
  const { nearest, closest, secondLower } = state;
  const cumulative = new Float64Array(n);
  // Per trial: distances to its candidate (−1 where the triangle inequality skipped the row),
  // so the chosen candidate's update needs no second pass of distance evaluations.
  const trialDistances = new Float64Array(trials * n);
  const toCentres = new Float64Array(trials * k);
  const candidates = new Int32Array(trials);
  const totals = new Float64Array(trials);

  const first = random.int(n);
  copyRow(data, first, d, out, 0);
  for (let i = 0; i < n; i++) {
    closest[i] = squaredDistanceRows(data, i * d, out, 0, d);
    nearest[i] = 0;
    secondLower[i] = Infinity;
  }

  for (let c = 1; c < k; c++) {
    let running = 0;
    for (let i = 0; i < n; i++) {
      running += closest[i];
      cumulative[i] = running;
    }
    const potential = running;
    for (let t = 0; t < trials; t++) {
      const candidate = potential > 0 ? drawWeighted(cumulative, random.next() * potential) : random.int(n);
      candidates[t] = candidate;
      for (let e = 0; e < c; e++) toCentres[t * k + e] = squaredDistanceRows(data, candidate * d, out, e * d, d);
      totals[t] = 0;
    }
    // All trials in one sweep over the rows: each row is read once.
    for (let i = 0; i < n; i++) {
      const own = closest[i];
      const near = nearest[i];
      const ib = i * d;
      for (let t = 0; t < trials; t++) {
        if (toCentres[t * k + near] >= 4 * own) {
          trialDistances[t * n + i] = -1;
          totals[t] += own;
          continue;
        }
        const cb = candidates[t] * d;
        let s = 0;
        for (let j = 0; j < d; j++) {
          const diff = data[ib + j] - data[cb + j];
          s += diff * diff;
        }
        trialDistances[t * n + i] = s;
        totals[t] += s < own ? s : own;
      }
    }
    // Strictly lower: ties keep the earlier candidate.
    let bestTrial = 0;
    for (let t = 1; t < trials; t++) if (totals[t] < totals[bestTrial]) bestTrial = t;
    copyRow(data, candidates[bestTrial], d, out, c * d);
    const gapBase = bestTrial * k;
    const distBase = bestTrial * n;
    for (let i = 0; i < n; i++) {
      const own = closest[i];
      const s = trialDistances[distBase + i];
      if (s < 0) {
        const bound = Math.sqrt(toCentres[gapBase + nearest[i]]) - Math.sqrt(own);
        if (bound < secondLower[i]) secondLower[i] = bound;
        continue;
      }
      // Strictly closer: ties keep the earlier (lower-numbered) centre.
      if (s < own) {
        const previous = Math.sqrt(own);
        if (previous < secondLower[i]) secondLower[i] = previous;
        closest[i] = s;
        nearest[i] = c;
      } else {
        const root = Math.sqrt(s);
        if (root < secondLower[i]) secondLower[i] = root;
      }
    }
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

function squaredDistanceRows(a: Float64Array, ab: number, b: Float64Array, bb: number, d: number): number {
  let s = 0;
  for (let j = 0; j < d; j++) {
    const diff = a[ab + j] - b[bb + j];
    s += diff * diff;
  }
  return s;
}
