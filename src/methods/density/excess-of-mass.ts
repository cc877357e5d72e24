// Excess of mass (Campello, Moulavi & Sander 2013): each cluster's stability is the sum over its
// rows of (λ at which the row leaves it − λ at which it was born); a child cluster's rows count
// up to the child's birth. A row that split off inside a group too small to be a segment counts
// up to its level (CondensedTree.rowLevel), not the λ where the group split off: R dbscan's
// convention (measured: the stabilities it reports agree with this reading), kept because R's
// `hdbscan` is our reference. Bottom-up, a cluster is chosen when its own stability is at least
// the sum of its chosen descendants' (ties keep the larger cluster). The root is never chosen, so
// the result always holds at least one split or only noise (as R dbscan's `hdbscan` does).
//
// Identical rows (distance 0, λ = Infinity) make a stability infinite. R reports it as NaN, and
// a comparison with NaN never prefers the children, so the parent of such a cluster is kept whole
// (measured on hand-made cases: a parent of stability 3.96 kept over children with a duplicated
// pair and 1998). We do the same by storing NaN, which the `>` below reads the same way.
// O(clusters + n).
import { CondensedTree } from './condensed-tree';

export interface Selection {
  /** Stability of each cluster of the condensed tree. */
  readonly stability: Float64Array;
  /** 1 for chosen clusters. */
  readonly chosen: Uint8Array;
  /** For each row: its chosen cluster, or -1 (noise). */
  readonly rowChosen: Int32Array;
}

export function selectByExcessOfMass(tree: CondensedTree): Selection {
  const { clusterCount, parent, birth, rowCluster, rowLevel } = tree;
  const stability = new Float64Array(clusterCount);
  for (let r = 0; r < rowCluster.length; r++) {
    const c = rowCluster[r];
    stability[c] += span(birth[c], rowLevel[r]);
  }
  for (let c = 1; c < clusterCount; c++) stability[parent[c]] += tree.rows[c] * span(birth[parent[c]], birth[c]);
  for (let c = 0; c < clusterCount; c++) if (stability[c] === Infinity) stability[c] = NaN;
  const best = Float64Array.from(stability);
  const childSum = new Float64Array(clusterCount);
  const hasChild = new Uint8Array(clusterCount);
  const chosen = new Uint8Array(clusterCount);
  // Children have larger numbers than their parents: descending order is bottom-up.
  for (let c = clusterCount - 1; c >= 1; c--) {
    if (hasChild[c] && childSum[c] > stability[c]) best[c] = childSum[c];
    else chosen[c] = 1;
    childSum[parent[c]] += best[c];
    hasChild[parent[c]] = 1;
  }
  // Top-down: the first chosen cluster on each path wins; those below it are dropped.
  const owner = new Int32Array(clusterCount).fill(-1);
  for (let c = 1; c < clusterCount; c++) {
    const above = owner[parent[c]];
    if (above >= 0) {
      owner[c] = above;
      chosen[c] = 0;
    } else if (chosen[c]) owner[c] = c;
  }
  const rowChosen = new Int32Array(rowCluster.length);
  for (let r = 0; r < rowCluster.length; r++) rowChosen[r] = owner[rowCluster[r]];
  return { stability, chosen, rowChosen };
}

/** to − from, with Infinity − Infinity read as 0 (identical rows born and leaving together). */
function span(from: number, to: number): number {
  return to === from ? 0 : to - from;
}
