// Does the definition's rule (nearest centre / medoid) give every training row the segment the fit
// gave it? For k-means we make it so (settleKmeans: Lloyd steps until centres and segments are a
// fixed point under the very loop assign runs); for a hierarchy cut or k-medoids we count how many
// rows it reproduces, and can relabel the segmentation by its own rule on request.
import type { Matrix } from '../core/matrix';
import { centroids } from '../assess/segment-centres';
import { nearestCenters } from '../segments/assign-nearest';
import type { DefinitionMetric } from '../segments/definition-types';

/** How far the stored rule reproduces the training segments. */
export interface RuleAgreement {
  /** 'nearest-center', 'nearest-medoid' or 'highest-posterior' (mixtures): the rule a definition stores. */
  readonly rule: 'nearest-center' | 'nearest-medoid' | 'highest-posterior';
  readonly rows: number;
  /** Training rows the rule gives the segment the fit gave them. */
  readonly reproduced: number;
  /** Per segment (0-based): members the rule keeps in it. */
  readonly perSegment: readonly number[];
  /** The rule's own segment for every training row (0-based). */
  readonly ruleAssignment: Int32Array;
}

/** Most Lloyd steps settleKmeans takes before reporting how far it got. */
export const SETTLE_MAX_STEPS = 1000;

function flat(centers: readonly (readonly number[])[]): Float64Array {
  return Float64Array.from(centers.flat());
}

export function ruleAgreement(
  m: Matrix,
  assignment: Int32Array,
  centers: readonly (readonly number[])[],
  metric: DefinitionMetric,
  rule: 'nearest-center' | 'nearest-medoid',
): RuleAgreement {
  const k = centers.length;
  const near = nearestCenters(m.data, m.rows, flat(centers), k, m.cols, metric);
  const perSegment = new Array<number>(k).fill(0);
  let reproduced = 0;
  for (let i = 0; i < m.rows; i++) {
    if (near.segment[i] === assignment[i]) {
      reproduced++;
      perSegment[assignment[i]]++;
    }
  }
  return { rule, rows: m.rows, reproduced, perSegment, ruleAssignment: near.segment };
}

export interface Settled {
  assignment: Int32Array;
  centers: number[][];
  /** Lloyd steps taken after the fit (0 when it was already a fixed point). */
  steps: number;
  /** Rows whose segment changed from the fit's. */
  moved: number;
  /** False when SETTLE_MAX_STEPS passed, or a step would have emptied a segment. */
  fixedPoint: boolean;
}

/**
 * Lloyd steps from the fit's assignment: centres = segment means, then every row to its nearest
 * centre by the same loop (and tie rule) assign and the SQL use, until nothing moves. The centres
 * returned are the means of the segments returned, and the rule reproduces every row when fixedPoint.
 */
export function settleKmeans(m: Matrix, fitted: Int32Array, k: number): Settled {
  const d = m.cols;
  let assignment = Int32Array.from(fitted);
  let centres = centroids(m, assignment, k);
  let steps = 0;
  let fixedPoint = false;
  for (; steps <= SETTLE_MAX_STEPS; steps++) {
    const near = nearestCenters(m.data, m.rows, centres, k, d, 'euclidean');
    let changed = false;
    for (let i = 0; i < m.rows && !changed; i++) if (near.segment[i] !== assignment[i]) changed = true;
    if (!changed) {
      fixedPoint = true;
      break;
    }
    const sizes = new Int32Array(k);
    for (let i = 0; i < m.rows; i++) sizes[near.segment[i]]++;
    if (sizes.some((s) => s === 0)) break; // a step would empty a segment: stop and say so
    assignment = Int32Array.from(near.segment);
    centres = centroids(m, assignment, k);
  }
  let moved = 0;
  for (let i = 0; i < m.rows; i++) if (assignment[i] !== fitted[i]) moved++;
  const centers = Array.from({ length: k }, (_, c) => Array.from(centres.subarray(c * d, (c + 1) * d)));
  return { assignment, centers, steps, moved, fixedPoint };
}
