// The figures the silhouette view draws, aggregated first so the drawing does not grow with the
// rows: per segment a histogram of the widths in fixed bins, quartiles, the mean, the share of rows
// below 0 and the neighbouring segment those rows lean to.
import { quantileSorted } from '../core/quantile';

/** Bin width of the per-segment histograms (40 bins over −1..1). */
export const SILHOUETTE_BIN = 0.05;

export interface SegmentSilhouette {
  /** 0-based segment. */
  readonly segment: number;
  readonly size: number;
  readonly mean: number;
  readonly q1: number;
  readonly median: number;
  readonly q3: number;
  /** Counts per bin; bin b covers [binStart + b·SILHOUETTE_BIN, … + SILHOUETTE_BIN). */
  readonly counts: readonly number[];
  /** Rows with a width below 0 (closer on average to another segment than to their own). */
  readonly below: number;
  /** The segment (0-based) most of the rows below 0 lean to, or null when none is below 0 or none is known. */
  readonly leansTo: number | null;
  /** How many of the rows below 0 lean to `leansTo`. */
  readonly leaning: number;
}

export interface SilhouetteSummary {
  readonly segments: readonly SegmentSilhouette[];
  readonly average: number;
  readonly min: number;
  readonly max: number;
  /** Lower edge of bin 0 (a multiple of SILHOUETTE_BIN at or below `min`). */
  readonly binStart: number;
  readonly bins: number;
}

export function summariseSilhouette(
  values: ArrayLike<number>,
  labels: Int32Array,
  k: number,
  average: number,
  neighbour?: ArrayLike<number>,
): SilhouetteSummary {
  const n = values.length;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    if (values[i] < min) min = values[i];
    if (values[i] > max) max = values[i];
  }
  const binStart = Math.floor(min / SILHOUETTE_BIN + 1e-9) * SILHOUETTE_BIN;
  // The highest value gets its own half-open bin [v, v + SILHOUETTE_BIN) when it sits on an edge.
  const bins = Math.floor((max - binStart) / SILHOUETTE_BIN + 1e-9) + 1;
  const counts = Array.from({ length: k }, () => new Array<number>(bins).fill(0));
  const bySegment: number[][] = Array.from({ length: k }, () => []);
  const lean = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  for (let i = 0; i < n; i++) {
    const s = labels[i];
    const v = values[i];
    bySegment[s].push(v);
    counts[s][Math.min(bins - 1, Math.floor((v - binStart) / SILHOUETTE_BIN + 1e-9))]++;
    if (v < 0 && neighbour) lean[s][neighbour[i]]++;
  }
  const segments = bySegment.map((list, s) => {
    const sorted = Float64Array.from(list).sort();
    let total = 0;
    let below = 0;
    for (const v of list) {
      total += v;
      if (v < 0) below++;
    }
    let leansTo: number | null = null;
    for (let t = 0; t < k; t++) if (lean[s][t] > 0 && (leansTo === null || lean[s][t] > lean[s][leansTo])) leansTo = t;
    return {
      segment: s,
      size: list.length,
      mean: list.length ? total / list.length : NaN,
      q1: quantileSorted(sorted, 0.25),
      median: quantileSorted(sorted, 0.5),
      q3: quantileSorted(sorted, 0.75),
      counts: counts[s],
      below,
      leansTo,
      leaning: leansTo === null ? 0 : lean[s][leansTo],
    };
  });
  return { segments, average, min, max, binStart, bins };
}
