// What a mixture fit hands to its Segmentation beyond centres and an assignment: the weights,
// covariances and membership probabilities, and how sure a row must be to count as certain.
import type { Matrix } from '../core/matrix';
import type { CovarianceShape } from '../methods/mixture';
import { storedComponents } from '../segments/definition-mixture';
import { mixtureFigures, scoreMixture } from '../segments/mixture-rule';
import type { RuleAgreement } from './reproduce';

/** Below this top membership probability a row's segment is called uncertain (default of `uncertainBelow`). */
export const UNCERTAIN_BELOW = 0.8;

export interface MixtureParts {
  readonly covariance: CovarianceShape;
  readonly weights: readonly number[];
  readonly covariances: readonly (readonly (readonly number[])[])[];
  /** n × k membership probabilities, row-major. */
  readonly membership: Float64Array;
  /** Rows whose highest membership probability is below this are shown as uncertain. */
  readonly uncertainBelow: number;
}

/** What `seg.membership()` gives: the probabilities and, per row, the top one and whether it is uncertain. */
export interface MembershipTable {
  readonly k: number;
  readonly ids: readonly string[];
  /** n × k, row-major: probability of segment c + 1 for row i is probabilities[i × k + c]. */
  readonly probabilities: Float64Array;
  /** The highest probability of each row (that of its segment). */
  readonly top: Float64Array;
  /** 1 where top < uncertainBelow. */
  readonly uncertain: Uint8Array;
  readonly uncertainBelow: number;
  /** The probabilities of one row, by id, segment 1 first. */
  of(id: string): number[];
}

export function membershipTable(parts: MixtureParts, ids: readonly string[], k: number): MembershipTable {
  const n = ids.length;
  const top = new Float64Array(n);
  const uncertain = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    let best = 0;
    for (let c = 0; c < k; c++) best = Math.max(best, parts.membership[i * k + c]);
    top[i] = best;
    uncertain[i] = best < parts.uncertainBelow ? 1 : 0;
  }
  const index = new Map(ids.map((id, i) => [id, i]));
  return {
    k,
    ids,
    probabilities: parts.membership,
    top,
    uncertain,
    uncertainBelow: parts.uncertainBelow,
    of(id: string) {
      const i = index.get(String(id));
      if (i === undefined) return [];
      return Array.from(parts.membership.subarray(i * k, (i + 1) * k));
    },
  };
}

/** How many training rows the stored highest-posterior rule gives their fitted segment. */
export function mixtureAgreement(
  m: Matrix,
  assignment: Int32Array,
  centers: readonly (readonly number[])[],
  parts: MixtureParts,
): RuleAgreement {
  const k = centers.length;
  const components = storedComponents({ weights: parts.weights, covariances: parts.covariances }, k, m.cols, 'mixture');
  const figures = mixtureFigures(
    components.map((p, c) => ({ number: c + 1, size: 0, farBeyond: 0, center: [...centers[c]], ...p })),
    m.cols,
  );
  const scores = scoreMixture(m.data, m.rows, figures);
  const perSegment = new Array<number>(k).fill(0);
  let reproduced = 0;
  for (let i = 0; i < m.rows; i++) {
    if (scores.segment[i] === assignment[i]) {
      reproduced++;
      perSegment[assignment[i]]++;
    }
  }
  return { rule: 'highest-posterior', rows: m.rows, reproduced, perSegment, ruleAssignment: scores.segment };
}
