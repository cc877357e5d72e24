// The condensed dissimilarity: pairs i < j in row-major order (the same layout as SciPy's
// `pdist`), so an n-row matrix holds n(n-1)/2 values.
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';

export interface Dissimilarity {
  readonly kind: 'dissimilarity';
  /** Number of rows (entities). */
  readonly size: number;
  /** n(n-1)/2 values, pairs (0,1), (0,2), …, (0,n-1), (1,2), … */
  readonly condensed: Float64Array;
  /** The metric that produced it ("euclidean", "gower", …, or "given"). */
  readonly metric: string;
  /** Optional row labels (ids). */
  readonly labels?: readonly string[];
  /** d(i, j); 0 on the diagonal. */
  get(i: number, j: number): number;
}

/** Position of pair (i, j), i ≠ j, in the condensed array of an n-row matrix. */
export function condensedIndex(n: number, i: number, j: number): number {
  if (i > j) {
    const t = i;
    i = j;
    j = t;
  }
  return n * i - (i * (i + 1)) / 2 + (j - i - 1);
}

/** Number of rows n for a condensed array of `length` values, or -1 when none fits. */
export function sizeFromCondensedLength(length: number): number {
  const n = Math.round((1 + Math.sqrt(1 + 8 * length)) / 2);
  return (n * (n - 1)) / 2 === length ? n : -1;
}

export function isDissimilarity(value: unknown): value is Dissimilarity {
  return (
    typeof value === 'object' &&
    value !== null &&
    (value as Dissimilarity).kind === 'dissimilarity' &&
    (value as Dissimilarity).condensed instanceof Float64Array
  );
}

/** Wrap a condensed array (taken as is, not copied) as a Dissimilarity. No validation. */
export function makeDissimilarity(size: number, condensed: Float64Array, metric: string, labels?: readonly string[]): Dissimilarity {
  return {
    kind: 'dissimilarity',
    size,
    condensed,
    metric,
    labels,
    get(i: number, j: number): number {
      if (i === j) return 0;
      return condensed[condensedIndex(size, i, j)];
    },
  };
}

/**
 * Wrap a condensed array given by the caller (e.g. computed elsewhere). Checks that its length
 * fits some n, that values are finite and non-negative, and that labels match n.
 */
export function fromCondensed(values: ArrayLike<number>, options?: { labels?: readonly string[]; metric?: string }): Dissimilarity {
  const opts = checkOptions(options, ['labels', 'metric'], 'fromCondensed');
  const n = sizeFromCondensedLength(values.length);
  if (n < 2) {
    throw new KinsortError(
      `fromCondensed: ${values.length} values is not n(n-1)/2 for any n ≥ 2 (1, 3, 6, 10, … values for 2, 3, 4, 5, … rows).`,
      'bad-dissimilarity',
    );
  }
  const condensed = values instanceof Float64Array ? values : Float64Array.from(values);
  for (let k = 0; k < condensed.length; k++) {
    const v = condensed[k];
    if (!Number.isFinite(v) || v < 0) {
      const [i, j] = pairOf(n, k);
      throw new KinsortError(
        `fromCondensed: the dissimilarity between rows ${i + 1} and ${j + 1} is ${v}; dissimilarities must be finite and ≥ 0.`,
        'bad-dissimilarity',
      );
    }
  }
  if (opts.labels !== undefined && opts.labels.length !== n) {
    throw new KinsortError(`fromCondensed: ${opts.labels.length} labels for ${n} rows.`, 'bad-dissimilarity');
  }
  return makeDissimilarity(n, condensed, opts.metric ?? 'given', opts.labels);
}

/** The pair (i, j), i < j, stored at condensed position k of an n-row matrix. */
export function pairOf(n: number, k: number): [number, number] {
  let i = 0;
  let rowStart = 0;
  while (rowStart + (n - i - 1) <= k) {
    rowStart += n - i - 1;
    i++;
  }
  return [i, i + 1 + (k - rowStart)];
}

/** Default budget for one n × n allocation: half the machine's memory, within typed-array limits. */
let pairBudgetBytes = defaultBudget();

function defaultBudget(): number {
  let total = 8 * 1024 ** 3;
  try {
    total = require('os').totalmem();
  } catch {
    /* not in Node: keep the fixed default */
  }
  return Math.min(total / 2, 2 ** 32 * 8 - 1);
}

/** Change the budget for pairwise allocations (bytes). Returns the previous budget. */
export function setPairBudget(bytes: number): number {
  const previous = pairBudgetBytes;
  pairBudgetBytes = bytes;
  return previous;
}

function formatBytes(bytes: number): string {
  const units = ['bytes', 'KB', 'MB', 'GB', 'TB'];
  let value = bytes;
  let u = 0;
  while (value >= 1024 && u < units.length - 1) {
    value /= 1024;
    u++;
  }
  return `${value.toFixed(value >= 100 || u === 0 ? 0 : 1)} ${units[u]}`;
}

/**
 * Refuse, before allocating, a pairwise matrix for n rows that would exceed the budget. The
 * message says how large it would be and what to do instead.
 */
export function guardPairwise(n: number, where: string, bytesPerPair = 8): void {
  const pairs = (n * (n - 1)) / 2;
  const bytes = pairs * bytesPerPair;
  if (bytes > pairBudgetBytes) {
    throw new KinsortError(
      `${where}: a dissimilarity matrix for ${n.toLocaleString('en-US')} rows holds ` +
        `${pairs.toLocaleString('en-US')} pairs (${formatBytes(bytes)}), more than the ${formatBytes(pairBudgetBytes)} allowed. ` +
        `Alternatives: Ward, centroid or median linkage straight from the rows (no matrix), k-means, ` +
        `or k-medoids on a sample of the rows.`,
      'too-large',
    );
  }
}
