// The 'highest-posterior' rule of a mixture definition: every new row goes to the component with
// the highest posterior probability w_c N(x | μ_c, Σ_c) / Σ_j w_j N(x | μ_j, Σ_j). The arithmetic
// is written once here and repeated term for term by the SQL (sql-mixture.ts), so that the two
// agree on every row:
//   z_c,j  = Σ_{l ≤ j} W_c,jl · (x_l − μ_c,l)          (W_c = L_c⁻¹, Σ_c = L_c L_cᵀ; zero W skipped)
//   q_c    = Σ_j z_c,j²                                 (squared Mahalanobis distance)
//   cost_c = q_c · 0.5 − constant_c                     (−ln of w_c N(x | …); lower is better)
//   segment: the least cost, ties to the lower number; distance: √q of that segment;
//   probability: 1 / Σ_c e^(least − cost_c), with e^t taken as 0 for t < −745, and none when the
//   least cost is 1e300 or more;
//   far: q_c > farBeyond_c² for every c.
import { componentConstant } from '../methods/mixture';
import type { DefinitionSegment } from './definition-types';

/** Below this exponent e^t is taken as 0 (JavaScript gives 0 from about −745.13; PostgreSQL refuses an exp that underflows). */
export const EXP_ZERO_BELOW = -745;
/**
 * A row whose least cost is at or above this (its distances overflow: a feature near 1e154 or
 * beyond) gets no probability (NaN here, NULL in SQL and in assign): ∞ − ∞ has no common meaning
 * across engines.
 */
export const COST_WITHOUT_PROBABILITY = 1e300;

export interface MixtureScores {
  /** 0-based segment per row. */
  readonly segment: Int32Array;
  /** Mahalanobis distance to that segment's component. */
  readonly distance: Float64Array;
  /** Posterior probability of that segment (NaN when the distances overflow, see COST_WITHOUT_PROBABILITY). */
  readonly probability: Float64Array;
  /** 1 when the row is beyond every segment's farBeyond (in Mahalanobis distance). */
  readonly far: Uint8Array;
}

/** The figures of the rule, flat: means (k × d), lower triangles of W (k × d × d), constants. */
export interface MixtureFigures {
  readonly k: number;
  readonly d: number;
  readonly means: Float64Array;
  readonly whitening: Float64Array;
  readonly constant: Float64Array;
}

/** The rule's figures from a definition's segments (which carry weight and whitening). */
export function mixtureFigures(segments: readonly DefinitionSegment[], d: number): MixtureFigures {
  const k = segments.length;
  const means = new Float64Array(k * d);
  const whitening = new Float64Array(k * d * d);
  const constant = new Float64Array(k);
  segments.forEach((s, c) => {
    means.set(s.center, c * d);
    s.whitening!.forEach((row, j) => whitening.set(row, c * d * d + j * d));
    constant[c] = componentConstant(s.weight!, whitening, c * d * d, d);
  });
  return { k, d, means, whitening, constant };
}

/** Squared Mahalanobis distance of row `x` (offset in `data`) to component c, in the rule's order. */
export function ruleSquare(data: ArrayLike<number>, x: number, f: MixtureFigures, c: number, diff: Float64Array): number {
  const { d, means, whitening } = f;
  const m = c * d;
  const w = c * d * d;
  for (let l = 0; l < d; l++) diff[l] = data[x + l] - means[m + l];
  let q = 0;
  for (let j = 0; j < d; j++) {
    let z = 0;
    let first = true;
    for (let l = 0; l <= j; l++) {
      const coefficient = whitening[w + j * d + l];
      if (coefficient === 0) continue;
      const term = diff[l] * coefficient;
      z = first ? term : z + term;
      first = false;
    }
    q += z * z;
  }
  return q;
}

/** Score `rows` prepared rows by the rule; `farBeyond` per segment (omitted while building). */
export function scoreMixture(data: Float64Array, rows: number, f: MixtureFigures, farBeyond?: ArrayLike<number>): MixtureScores {
  const { k, d, constant } = f;
  const segment = new Int32Array(rows);
  const distance = new Float64Array(rows);
  const probability = new Float64Array(rows);
  const far = new Uint8Array(rows);
  const diff = new Float64Array(d);
  const q = new Float64Array(k);
  const cost = new Float64Array(k);
  const limits = farBeyond ? Float64Array.from(farBeyond, (t) => t * t) : undefined;
  for (let i = 0; i < rows; i++) {
    let best = 0;
    let farFromAll = 1;
    for (let c = 0; c < k; c++) {
      q[c] = ruleSquare(data, i * d, f, c, diff);
      cost[c] = q[c] * 0.5 - constant[c];
      if (cost[c] < cost[best]) best = c;
      if (limits && !(q[c] - limits[c] > 0)) farFromAll = 0;
    }
    let sum = 0;
    for (let c = 0; c < k; c++) {
      const t = cost[best] - cost[c];
      sum += t < EXP_ZERO_BELOW ? 0 : Math.exp(t);
    }
    segment[i] = best;
    distance[i] = Math.sqrt(q[best]);
    probability[i] = cost[best] < COST_WITHOUT_PROBABILITY ? 1 / sum : NaN;
    far[i] = limits ? farFromAll : 0;
  }
  return { segment, distance, probability, far };
}
