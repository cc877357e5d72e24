// The mutual reachability distance: max(core(i), core(j), d(i, j)). Rows in sparse regions are
// pushed apart, so single linkage on it follows density instead of chaining through noise.
// A scalar function the spanning tree's loop calls per pair (small enough to be inlined).
export function mutualReachability(distance: number, coreI: number, coreJ: number): number {
  const m = coreI > coreJ ? coreI : coreJ;
  return distance > m ? distance : m;
}
