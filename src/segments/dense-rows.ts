// The nearest-dense-row rule of density definitions: a new row takes the segment of the nearest
// stored training row that is in a segment (under the stored metric, in the prepared space), and
// is noise when its distance to that row is larger than that row's core distance (its reach), i.e.
// when it is not inside the stored row's dense neighbourhood. Ties: the lower stored position (the
// rows are stored in training order) — the same rule the SQL text uses.
import { KinsortError } from '../core/errors';
import { pointToCenter } from './assign-nearest';
import type { DefinitionMetric } from './definition-types';

/** Every training row in a segment, as the definition stores them. */
export interface DenseRows {
  /** Prepared values, one array per stored row. */
  readonly values: number[][];
  /** Core distance of each stored row (under the definition's metric). */
  readonly reach: number[];
  /** Segment of each stored row, 1..k. */
  readonly segment: number[];
}

/**
 * Most rows a definition may store: each costs its values plus two numbers in the file (about
 * 20 bytes per number as JSON), so 20,000 rows of 10 features is about 5 MB, and every new row is
 * compared with all of them (in memory and in SQL).
 */
export const DENSE_ROW_LIMIT = 20_000;

export function checkDenseRowCount(count: number, where: string): void {
  if (count > DENSE_ROW_LIMIT) {
    throw new KinsortError(
      `${where}: a density definition stores every training row in a segment; ${count.toLocaleString('en-US')} rows is more than ` +
        `the ${DENSE_ROW_LIMIT.toLocaleString('en-US')} allowed (file size, and each new row is compared with all of them). ` +
        'Fit the density segments on a sample of the rows, or use k-means / k-medoids for a compact definition.',
      'too-large',
    );
  }
}

export interface DenseResult {
  /** 1..k, or 0 for noise. */
  readonly segment: Int32Array;
  /** Distance to the nearest stored row. */
  readonly distance: Float64Array;
  /** 1 when the row is noise (beyond the nearest stored row's reach). */
  readonly noise: Uint8Array;
}

/** The rule on `rows` prepared rows (row-major, `dims` wide). O(rows × stored × dims). */
export function nearestDenseRows(data: Float64Array, rows: number, dims: number, dense: DenseRows, metric: DefinitionMetric): DenseResult {
  const stored = dense.values.length;
  const flat = Float64Array.from(dense.values.flat());
  const segment = new Int32Array(rows);
  const distance = new Float64Array(rows);
  const noise = new Uint8Array(rows);
  // Euclidean compared as squares (as the SQL does), the root taken once at the end.
  const compareAs: DefinitionMetric = metric === 'euclidean' ? 'sqeuclidean' : metric;
  for (let i = 0; i < rows; i++) {
    let best = 0;
    let bestD = Infinity;
    for (let r = 0; r < stored; r++) {
      const d = pointToCenter(data, i, flat, r, dims, compareAs);
      if (d < bestD) {
        bestD = d;
        best = r;
      }
    }
    const reach = metric === 'euclidean' ? dense.reach[best] * dense.reach[best] : dense.reach[best];
    const isNoise = bestD > reach;
    noise[i] = isNoise ? 1 : 0;
    segment[i] = isNoise ? 0 : dense.segment[best];
    distance[i] = metric === 'euclidean' ? Math.sqrt(bestD) : bestD;
  }
  return { segment, distance, noise };
}
