// The condensed tree (Campello, Moulavi & Sander 2013): walk the single-linkage hierarchy from the
// top; at each merge, read downwards as a split at density λ = 1 / height. A side with fewer than
// `minSize` rows is not a segment: its rows leave the current cluster at λ. When both sides have
// at least `minSize` rows, the cluster ends and two new clusters are born at λ. A height of 0
// (identical rows) gives λ = Infinity. O(n) time and memory.
//
// Each row also gets the level that excess of mass and GLOSH read (`rowLevel`). The published
// definitions take the λ at which the row leaves its cluster; R dbscan's `hdbscan`, our reference,
// follows a row that falls out inside a small group down to where it becomes a single row, but no
// further than the λ at which its cluster ends by splitting in two. Measured on hand-made cases and
// on every fixture case; with the λ of leaving, both the scores and some partitions differ from R.
import { NumberedMerges } from '../hierarchy/merges';

export interface CondensedTree {
  /** Clusters in the order they were born (0 is the root, every row at λ = 0). */
  readonly clusterCount: number;
  /** Parent cluster of each cluster (-1 for the root); a parent always has a smaller number. */
  readonly parent: Int32Array;
  /** λ at which each cluster was born. */
  readonly birth: Float64Array;
  /** Rows in each cluster when it was born. */
  readonly rows: Int32Array;
  /** For each row: the last cluster it belonged to … */
  readonly rowCluster: Int32Array;
  /** … and the λ at which it left that cluster (fell out as too small a group, or as a single row). */
  readonly rowLeaves: Float64Array;
  /**
   * The λ of each row's own level: 1 / the height at which it first joins another row. A row that
   * falls out inside a small group is still denser than the group's λ up to this level.
   */
  readonly rowJoins: Float64Array;
  /** λ at which each cluster splits into two clusters; Infinity when it never does (a leaf). */
  readonly ends: Float64Array;
  /** The level of each row: min(rowJoins, ends of its cluster) — see the header. */
  readonly rowLevel: Float64Array;
}

export function condenseTree(n: number, merges: NumberedMerges, minSize: number): CondensedTree {
  const nodes = 2 * n - 1;
  // Per node of the hierarchy: the cluster it belongs to, and whether (and at which λ) it fell out.
  const nodeCluster = new Int32Array(nodes);
  const fellAt = new Float64Array(nodes).fill(NaN);
  const rowCluster = new Int32Array(n);
  const rowLeaves = new Float64Array(n);
  const parent: number[] = [-1];
  const birth: number[] = [0];
  const rows: number[] = [n];
  const ends: number[] = [Infinity];
  const sizeOf = (node: number) => (node < n ? 1 : merges.size[node - n]);
  const place = (node: number, cluster: number, lambda: number) => {
    if (node < n) {
      rowCluster[node] = cluster;
      rowLeaves[node] = lambda;
    } else {
      nodeCluster[node] = cluster;
      fellAt[node] = lambda;
    }
  };
  if (n === 1) {
    rowCluster[0] = 0;
    rowLeaves[0] = Infinity;
  }
  nodeCluster[nodes - 1] = 0;
  // Merge i is node n + i; its children have smaller numbers, so descending order is top-down.
  for (let i = n - 2; i >= 0; i--) {
    const node = n + i;
    const cluster = nodeCluster[node];
    const left = merges.left[i];
    const right = merges.right[i];
    if (!Number.isNaN(fellAt[node])) {
      // Already fallen out: everything below leaves at the same λ from the same cluster.
      place(left, cluster, fellAt[node]);
      place(right, cluster, fellAt[node]);
      continue;
    }
    const lambda = 1 / merges.height[i];
    const bigLeft = sizeOf(left) >= minSize;
    const bigRight = sizeOf(right) >= minSize;
    if (bigLeft && bigRight) {
      ends[cluster] = lambda;
      for (const child of [left, right]) {
        parent.push(cluster);
        ends.push(Infinity);
        birth.push(lambda);
        rows.push(sizeOf(child));
        nodeCluster[child] = parent.length - 1;
      }
    } else {
      continueOrFall(left, bigLeft);
      continueOrFall(right, bigRight);
    }
    function continueOrFall(child: number, big: boolean): void {
      if (big) nodeCluster[child] = cluster;
      else place(child, cluster, lambda);
    }
  }
  // A row never split off (a leaf child of a continuing branch cannot exist: size 1 < minSize,
  // minSize ≥ 2), so every row has been placed above.
  const rowJoins = new Float64Array(n);
  if (n === 1) rowJoins[0] = Infinity;
  for (let i = 0; i < n - 1; i++) {
    if (merges.left[i] < n) rowJoins[merges.left[i]] = 1 / merges.height[i];
    if (merges.right[i] < n) rowJoins[merges.right[i]] = 1 / merges.height[i];
  }
  const rowLevel = new Float64Array(n);
  for (let r = 0; r < n; r++) {
    const end = ends[rowCluster[r]];
    rowLevel[r] = rowJoins[r] < end ? rowJoins[r] : end;
  }
  return {
    clusterCount: parent.length,
    parent: Int32Array.from(parent),
    birth: Float64Array.from(birth),
    rows: Int32Array.from(rows),
    rowCluster,
    rowLeaves,
    rowJoins,
    ends: Float64Array.from(ends),
    rowLevel,
  };
}
