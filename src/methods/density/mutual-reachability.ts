// The mutual reachability distance: max(core(i), core(j), d(i, j)). Rows in sparse regions are
// pushed apart, so single linkage on it follows density instead of chaining through noise.
import { PairSource } from './pair-source';

export function mutualReachability(source: PairSource, core: Float64Array): (i: number, j: number) => number {
  return (i, j) => {
    const d = source.pair(i, j);
    const a = core[i];
    const b = core[j];
    const m = a > b ? a : b;
    return d > m ? d : m;
  };
}
