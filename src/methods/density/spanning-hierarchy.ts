// Single linkage on the mutual reachability distance, through its minimum spanning tree (Prim on
// the dense graph: O(n²) time, O(n) memory beyond the rows; no n × n matrix is built). Ties: Prim
// starts at row 0 and, among equal candidates, takes the remaining row with the smallest index;
// merges are then sorted by height, equal heights kept in the order Prim found them.
import { NumberedMerges, relabelSorted } from '../hierarchy/merges';
import { singleFromPairs } from '../hierarchy/single-mst';
import { MergeTick } from '../hierarchy/ticker';

export function spanningHierarchy(n: number, reach: (i: number, j: number) => number, tick?: MergeTick): NumberedMerges {
  return relabelSorted(n, singleFromPairs(n, reach, tick));
}
