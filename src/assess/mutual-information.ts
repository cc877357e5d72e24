// Normalised mutual information between two assignments: mutual information divided by an
// average of the two entropies (natural logarithms; the base cancels). 1 = identical partitions.
import { AssignmentInput } from '../core/assignment';
import { checkChoice } from '../core/errors';
import { checkOptions } from '../core/options';
import { flatContingency } from './contingency';

export const MUTUAL_INFORMATION_AVERAGES = ['arithmetic', 'geometric', 'min', 'max'] as const;
export type MutualInformationAverage = (typeof MUTUAL_INFORMATION_AVERAGES)[number];

export interface NormalizedMutualInfoOptions {
  /** How the two entropies are averaged into the normaliser. Default 'arithmetic'. */
  average?: MutualInformationAverage;
}

function entropy(sizes: Float64Array, n: number): number {
  let h = 0;
  for (let i = 0; i < sizes.length; i++) {
    const p = sizes[i] / n;
    if (p > 0) h -= p * Math.log(p);
  }
  return h;
}

/** NMI of two assignments of the same rows, in [0, 1]; labels may be any whole numbers. */
export function normalizedMutualInfo(a: AssignmentInput, b: AssignmentInput, options?: NormalizedMutualInfoOptions): number {
  const opts = checkOptions(options, ['average'], 'normalizedMutualInfo');
  const average = checkChoice(opts.average ?? 'arithmetic', MUTUAL_INFORMATION_AVERAGES, 'normalizedMutualInfo average');
  const t = flatContingency(a, b, 'normalizedMutualInfo');
  // One segment on both sides: the partitions are the same (and every entropy is 0).
  if (t.ka === 1 && t.kb === 1) return 1;
  const n = t.n;
  let mi = 0;
  for (let r = 0; r < t.ka; r++) {
    for (let c = 0; c < t.kb; c++) {
      const nrc = t.counts[r * t.kb + c];
      if (nrc > 0) mi += (nrc / n) * Math.log((n * nrc) / (t.rowSums[r] * t.colSums[c]));
    }
  }
  if (mi <= 0) return 0;
  const ha = entropy(t.rowSums, n);
  const hb = entropy(t.colSums, n);
  const normaliser =
    average === 'arithmetic'
      ? (ha + hb) / 2
      : average === 'geometric'
        ? Math.sqrt(ha * hb)
        : average === 'min'
          ? Math.min(ha, hb)
          : Math.max(ha, hb);
  // Rounding can push the ratio a hair above 1.
  return Math.min(1, mi / normaliser);
}
