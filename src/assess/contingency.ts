// The contingency table of two assignments of the same rows: counts of rows in segment r of the
// first and segment c of the second. Basis of the adjusted Rand index and mutual information.
import { compactLabels, AssignmentInput } from '../core/assignment';
import { KinsortError } from '../core/errors';

export interface ContingencyTable {
  /** The first assignment's labels, one per table row (sorted increasing). */
  readonly rowsLabels: number[];
  /** The second assignment's labels, one per table column (sorted increasing). */
  readonly colsLabels: number[];
  /** counts[r][c]: rows with label rowsLabels[r] in the first and colsLabels[c] in the second. */
  readonly counts: number[][];
}

/** Flat form used by the agreement measures. */
export interface FlatContingency {
  readonly n: number;
  readonly ka: number;
  readonly kb: number;
  /** ka × kb, row-major. */
  readonly counts: Float64Array;
  readonly rowSums: Float64Array;
  readonly colSums: Float64Array;
  readonly aLabels: readonly number[];
  readonly bLabels: readonly number[];
}

export function flatContingency(a: AssignmentInput, b: AssignmentInput, what: string): FlatContingency {
  if (a === null || typeof a !== 'object' || typeof a.length !== 'number') {
    throw new KinsortError(`${what}: the first assignment must be an array of segment numbers.`, 'bad-assignment');
  }
  if (a.length === 0) throw new KinsortError(`${what}: the assignments are empty.`, 'empty');
  const first = compactLabels(a, a.length, `${what} (first assignment)`);
  const second = compactLabels(b, a.length, `${what} (second assignment)`, 'the first assignment');
  const ka = first.k;
  const kb = second.k;
  const counts = new Float64Array(ka * kb);
  for (let i = 0; i < a.length; i++) counts[first.labels[i] * kb + second.labels[i]]++;
  return {
    n: a.length,
    ka,
    kb,
    counts,
    rowSums: Float64Array.from(first.sizes),
    colSums: Float64Array.from(second.sizes),
    aLabels: first.original,
    bLabels: second.original,
  };
}

/** Cross-tabulate two assignments of the same rows (labels may be any whole numbers). */
export function contingencyTable(a: AssignmentInput, b: AssignmentInput): ContingencyTable {
  const t = flatContingency(a, b, 'contingencyTable');
  const counts: number[][] = [];
  for (let r = 0; r < t.ka; r++) counts.push(Array.from(t.counts.subarray(r * t.kb, (r + 1) * t.kb)));
  return { rowsLabels: t.aLabels.slice(), colsLabels: t.bLabels.slice(), counts };
}
