// Stability of the k-means segments at every k of a comparison, after Hennig (2007): draw a
// bootstrap resample of rows, segment it again with k-means, and give each original segment the
// best Jaccard similarity it finds among the new segments, over the distinct rows drawn. The mean
// over resamples is the segment's stability; a k is only as stable as its weakest segment.
//
// Above `sampleRows` rows the resamples are drawn from one seeded simple random sample of the rows
// (the same sample the gap statistic uses), not from all of them. Jaccard compares proportions of
// rows, so its sampling error falls like 1/√(rows drawn): with 4,000 rows a segment of 5 % of
// them still has about 200 rows, enough to tell a segment that comes back (≥ 0.75) from one that
// dissolves (< 0.6), while the cost no longer grows with the size of the table.
import type { Matrix } from '../core/matrix';
import { takeRows } from '../core/matrix';
import { countDistinctRows } from '../methods/partition/distinct-rows';
import { kmeans } from '../methods/partition/kmeans';
import type { Random } from '../random';
import { bestJaccardBySegment } from './stability';

export interface KStability {
  readonly k: number;
  /** Mean over resamples of each segment's best Jaccard, one per segment (0..k-1). */
  readonly bySegment: number[];
  /** Mean of `bySegment`. */
  readonly mean: number;
  /** Lowest of `bySegment`. */
  readonly weakest: number;
}

export interface KStabilityOptions {
  /** Bootstrap resamples per k. */
  resamples: number;
  /** k-means restarts on each resample. */
  restarts: number;
  random: Random;
  /** Called after each k. */
  onK?: (k: number) => void;
}

/**
 * Stability of the segmentations `assignments[t]` (of the rows `sample` of `m`, or of all rows
 * when `sample` is undefined) with `ks[t]` segments.
 */
export function stabilityAcrossK(
  m: Matrix,
  sample: Int32Array | undefined,
  ks: readonly number[],
  assignments: readonly Int32Array[],
  options: KStabilityOptions,
): KStability[] {
  const rows = sample ? takeRows(m, sample) : m;
  const n = rows.rows;
  const indices = new Int32Array(n);
  const drawnAt = new Int32Array(n).fill(-1);
  let stamp = 0;
  return ks.map((k, t) => {
    // Original segments of the rows in the sample (relabelled 0..k-1 are already).
    const original = sample ? Int32Array.from(sample, (i) => assignments[t][i]) : assignments[t];
    const sums = new Float64Array(k);
    const counts = new Float64Array(k);
    const random = options.random.fork(`k = ${k}`);
    for (let b = 0; b < options.resamples; b++) {
      for (let r = 0; r < n; r++) indices[r] = random.int(n);
      const drawn = takeRows(rows, indices);
      // A small resample may hold fewer distinct rows than k: it is segmented into as many as it
      // can hold, and the segments it cannot separate count as not found again.
      const kFit = Math.min(k, countDistinctRows(drawn, k));
      const seed = random.uint32();
      const fit = kFit > 1 ? kmeans(drawn, { k: kFit, seed, restarts: options.restarts }).assignment : new Int32Array(n);
      const best = bestJaccardBySegment(original, k, indices, fit, kFit, drawnAt, stamp++);
      for (let c = 0; c < k; c++) {
        if (Number.isNaN(best[c])) continue;
        sums[c] += best[c];
        counts[c]++;
      }
    }
    const bySegment = Array.from(sums, (s, c) => (counts[c] > 0 ? s / counts[c] : NaN));
    const seen = bySegment.filter((v) => !Number.isNaN(v));
    options.onK?.(k);
    return {
      k,
      bySegment,
      mean: seen.reduce((s, v) => s + v, 0) / seen.length,
      weakest: Math.min(...seen),
    };
  });
}
