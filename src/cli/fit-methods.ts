// The three fitting routes of `kinsort fit`, on the functional core. Each returns what the
// definition needs (centres or medoids, the assignment) and one figure for the summary.
import { centroids } from '../assess/segment-centres';
import { KinsortError, checkChoice } from '../core/errors';
import type { Matrix } from '../core/matrix';
import { kmeans, kmedoids } from '../methods/partition';
import { agglomerate, LINKAGE_METHODS } from '../methods/hierarchy';
import type { LinkageMethod } from '../methods/hierarchy';
import type { DefinitionMetric, DefinitionMethodName } from '../segments/definition-types';

export interface FitChoice {
  method: DefinitionMethodName;
  k: number;
  seed?: number;
  restarts?: number;
  linkage?: string;
  metric?: DefinitionMetric;
}

export interface FitOutcome {
  assignment: Int32Array;
  centers?: number[][];
  medoids?: number[];
  metric: DefinitionMetric;
  /** Options as stored in the definition (only those that shaped the result). */
  options: Record<string, unknown>;
  /** Summary line about fit quality. */
  figure: string;
}

/** Segment means and the within-segment sum of squares of an assignment. */
export function segmentMeans(m: Matrix, assignment: Int32Array, k: number): { centers: number[][]; withinSS: number } {
  const d = m.cols;
  const flat = centroids(m, assignment, k);
  let withinSS = 0;
  for (let i = 0; i < m.rows; i++) {
    const c = assignment[i] * d;
    for (let j = 0; j < d; j++) {
      const diff = m.data[i * d + j] - flat[c + j];
      withinSS += diff * diff;
    }
  }
  const centers = Array.from({ length: k }, (_, s) => Array.from(flat.subarray(s * d, (s + 1) * d)));
  return { centers, withinSS };
}

function round(v: number): string {
  return Number(v.toPrecision(6)).toString();
}

export function fitMatrix(m: Matrix, choice: FitChoice): FitOutcome {
  const { method, k } = choice;
  if (method === 'kmeans') {
    if (choice.metric !== undefined && choice.metric !== 'euclidean') {
      throw new KinsortError(`fit: k-means works with euclidean distance only; drop --metric or use --method kmedoids.`, 'bad-option');
    }
    const seed = choice.seed ?? 0;
    const restarts = choice.restarts ?? 10;
    const r = kmeans(m, { k, seed, restarts });
    return {
      assignment: r.assignment,
      centers: r.centers,
      metric: 'euclidean',
      options: { k, seed, restarts },
      figure: `within-segment sum of squares: ${round(r.withinSS)}`,
    };
  }
  if (method === 'hierarchy') {
    const linkage = checkChoice(choice.linkage ?? 'ward', LINKAGE_METHODS, 'linkage') as LinkageMethod;
    const metric = choice.metric ?? 'euclidean';
    const tree = agglomerate(m, { method: linkage, metric });
    const assignment = tree.cut({ k });
    const { centers, withinSS } = segmentMeans(m, assignment, k);
    return {
      assignment,
      centers,
      // Documented rule for a cut: nearest segment mean in the prepared space, Euclidean.
      metric: 'euclidean',
      options: { k, linkage, metric },
      figure: `within-segment sum of squares: ${round(withinSS)}`,
    };
  }
  // k-medoids (PAM) is deterministic: no seed shapes it, so none is stored.
  const metric = choice.metric ?? 'euclidean';
  const r = kmedoids(m, { k, metric });
  return {
    assignment: r.assignment,
    medoids: Array.from(r.medoids),
    metric,
    options: { k, metric },
    figure: `total distance to the medoids: ${round(r.cost)}`,
  };
}
