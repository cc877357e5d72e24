// Adjusted Rand index (Hubert & Arabie 1985): pair agreement between two assignments, corrected
// for the agreement expected by chance under fixed segment sizes. 1 = identical partitions.
import { AssignmentInput } from '../core/assignment';
import { flatContingency } from './contingency';

function pairs(m: number): number {
  return (m * (m - 1)) / 2;
}

/** ARI of two assignments of the same rows; labels may be any whole numbers. */
export function adjustedRandIndex(a: AssignmentInput, b: AssignmentInput): number {
  const t = flatContingency(a, b, 'adjustedRandIndex');
  let index = 0;
  for (let p = 0; p < t.counts.length; p++) index += pairs(t.counts[p]);
  let rowPairs = 0;
  for (let r = 0; r < t.ka; r++) rowPairs += pairs(t.rowSums[r]);
  let colPairs = 0;
  for (let c = 0; c < t.kb; c++) colPairs += pairs(t.colSums[c]);
  const all = pairs(t.n);
  const expected = all === 0 ? 0 : (rowPairs * colPairs) / all;
  const maximum = (rowPairs + colPairs) / 2;
  // Equal maximum and expectation happens only when both are trivial in the same way (one segment
  // each, or all singletons each): the partitions then agree fully.
  if (maximum === expected) return 1;
  return (index - expected) / (maximum - expected);
}
