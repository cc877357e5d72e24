// What the training rows looked like, kept in the definition so that drift can be measured on new
// rows without the training data: for each prepared feature, cut points at the training deciles
// and the share of training rows between them, and the share of training rows flagged far.
/** Ten bins at the training deciles (fewer when a feature has many ties, e.g. a 0/1 indicator). */
export const DRIFT_BINS = 10;

/** An empty bin's share is raised to this before the logarithm (common practice: 0.0001). */
export const SHARE_FLOOR = 1e-4;

/** Readings of the population stability index; the cut points are common practice, not theory. */
export const STABILITY_READINGS = [
  { below: 0.1, reading: 'little change' },
  { below: 0.25, reading: 'some change' },
  { below: Infinity, reading: 'large change' },
] as const;

export interface FeatureDistribution {
  /** Increasing cut points: bin b holds values v with cuts[b-1] < v <= cuts[b] (first and last open). */
  readonly cuts: number[];
  /** Share of training rows per bin (cuts.length + 1 values, summing to 1). */
  readonly shares: number[];
}

export interface TrainingDistributions {
  /** One per prepared feature, in the definition's feature order. */
  readonly features: FeatureDistribution[];
  /** Share of training rows farther than every segment's farBeyond. */
  readonly farShare: number;
}

/** Bin of value v: the number of cut points strictly below it. */
export function binOf(cuts: readonly number[], v: number): number {
  let lo = 0;
  let hi = cuts.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (v > cuts[mid]) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Share of `values` in each bin of `cuts`. */
export function binShares(cuts: readonly number[], values: ArrayLike<number>): number[] {
  const counts = new Array<number>(cuts.length + 1).fill(0);
  for (let i = 0; i < values.length; i++) counts[binOf(cuts, values[i])]++;
  return counts.map((c) => (values.length === 0 ? 0 : c / values.length));
}

/**
 * Decile cut points of one feature, each an observed value (the order statistic at
 * floor((n − 1) q)), duplicates removed: tied values share a bin and a 0/1 indicator gets the one
 * cut 0, never a cut between its two values.
 */
export function decileCuts(values: ArrayLike<number>): number[] {
  const sorted = Float64Array.from(values).sort();
  const cuts: number[] = [];
  for (let q = 1; q < DRIFT_BINS; q++) {
    const c = sorted[Math.floor(((sorted.length - 1) * q) / DRIFT_BINS)];
    // A cut at the maximum would leave an empty last bin; at a repeated value, a bin of nothing.
    if (c < sorted[sorted.length - 1] && (cuts.length === 0 || c > cuts[cuts.length - 1])) cuts.push(c);
  }
  return cuts;
}

/**
 * Population stability index: the sum over bins of (new − training) × ln(new / training), each
 * share raised to SHARE_FLOOR first so an empty bin counts as a large change rather than infinity.
 */
export function stabilityIndex(training: readonly number[], fresh: readonly number[]): number {
  let total = 0;
  for (let b = 0; b < training.length; b++) {
    const t = Math.max(training[b], SHARE_FLOOR);
    const n = Math.max(fresh[b], SHARE_FLOOR);
    total += (n - t) * Math.log(n / t);
  }
  return total;
}

export function stabilityReading(index: number): string {
  return STABILITY_READINGS.find((r) => index < r.below)!.reading;
}

/** The distributions of the prepared training rows (row-major, `dims` columns). */
export function trainingDistributions(data: Float64Array, rows: number, dims: number, far: ArrayLike<number>): TrainingDistributions {
  const features: FeatureDistribution[] = [];
  const column = new Float64Array(rows);
  for (let j = 0; j < dims; j++) {
    for (let i = 0; i < rows; i++) column[i] = data[i * dims + j];
    const cuts = decileCuts(column);
    features.push({ cuts, shares: binShares(cuts, column) });
  }
  let flagged = 0;
  for (let i = 0; i < far.length; i++) flagged += far[i] ? 1 : 0;
  return { features, farShare: rows === 0 ? 0 : flagged / rows };
}
