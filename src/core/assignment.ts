// Assignments: one segment label per row. The core numbers segments 0..k-1; labels given by a
// caller may be any integers and are compacted here, in increasing order of their values.
import { KinsortError } from './errors';

export type AssignmentInput = ArrayLike<number>;

export interface CompactLabels {
  /** Labels 0..k-1, one per row. */
  readonly labels: Int32Array;
  /** Number of distinct labels. */
  readonly k: number;
  /** The caller's original label for each compact label (sorted increasing). */
  readonly original: readonly number[];
  /** Rows per compact label. */
  readonly sizes: Int32Array;
}

/**
 * Validate an assignment for `n` rows and compact its labels. `what` names the caller in
 * messages; `expected` says what the length must match ("the rows", "the dissimilarity").
 */
export function compactLabels(assignment: AssignmentInput, n: number, what: string, expected = 'the rows'): CompactLabels {
  if (assignment === null || typeof assignment !== 'object' || typeof assignment.length !== 'number') {
    throw new KinsortError(`${what}: the assignment must be an array of segment numbers.`, 'bad-assignment');
  }
  if (assignment.length !== n) {
    throw new KinsortError(
      `${what}: the assignment has ${assignment.length} entries but ${expected} ${/^the (rows|dissimilarities)$/.test(expected) ? 'have' : 'has'} ${n}; give one segment number per row.`,
      'bad-assignment',
    );
  }
  const distinct = new Set<number>();
  for (let i = 0; i < n; i++) {
    const v = assignment[i];
    if (typeof v !== 'number' || !Number.isInteger(v)) {
      throw new KinsortError(
        `${what}: assignment entry ${i + 1} is ${JSON.stringify(v)}; segment numbers must be whole numbers.`,
        'bad-assignment',
      );
    }
    distinct.add(v);
  }
  const original = Array.from(distinct).sort((a, b) => a - b);
  const index = new Map<number, number>();
  original.forEach((v, c) => index.set(v, c));
  const labels = new Int32Array(n);
  const sizes = new Int32Array(original.length);
  for (let i = 0; i < n; i++) {
    const c = index.get(assignment[i])!;
    labels[i] = c;
    sizes[c]++;
  }
  return { labels, k: original.length, original, sizes };
}

/** Refuse fewer than `min` segments where a measure needs them. */
export function requireSegments(k: number, min: number, what: string): void {
  if (k < min) {
    throw new KinsortError(
      `${what} needs at least ${min} segments, but the assignment has ${k}.` +
        (min === 2 ? ' A single segment has nothing to compare against.' : ''),
      'bad-assignment',
    );
  }
}
