// Single linkage on the mutual reachability distance max(core(i), core(j), d(i, j)), through its
// minimum spanning tree: Prim on the dense graph, O(n²) time, O(n) memory beyond the rows; the
// distances are computed when needed, no n × n matrix is built. Ties: Prim starts at row 0 and,
// among equal candidates, takes the remaining row with the smallest index (as the hierarchy's own
// single linkage does); merges are then sorted by height, equal heights kept in discovery order.
import { NumberedMerges, createRawMerges, relabelSorted } from '../hierarchy/merges';
import { MergeTick } from '../hierarchy/ticker';
import { mutualReachability } from './mutual-reachability';
import { PairSource } from './pair-source';

export function spanningHierarchy(source: PairSource, core: Float64Array, tick?: MergeTick): NumberedMerges {
  const n = source.size;
  const raw = createRawMerges(n);
  const best = new Float64Array(n).fill(Infinity);
  const from = new Int32Array(n);
  // Rows not yet in the tree, kept in increasing order so ties go to the smallest index.
  const remaining = new Int32Array(n - 1);
  for (let i = 1; i < n; i++) remaining[i - 1] = i;
  const distances = new Float64Array(n - 1);
  let count = n - 1;
  let x = 0;
  for (let k = 0; k < n - 1; k++) {
    source.fill(x, remaining, count, distances);
    const cx = core[x];
    let position = 0;
    let min = Infinity;
    for (let p = 0; p < count; p++) {
      const i = remaining[p];
      const d = mutualReachability(distances[p], cx, core[i]);
      if (d < best[i]) {
        best[i] = d;
        from[i] = x;
      }
      if (best[i] < min) {
        min = best[i];
        position = p;
      }
    }
    const y = remaining[position];
    remaining.copyWithin(position, position + 1, count);
    count--;
    raw.a[k] = from[y];
    raw.b[k] = y;
    raw.height[k] = min;
    x = y;
    if (tick) tick(k + 1);
  }
  return relabelSorted(n, raw);
}
