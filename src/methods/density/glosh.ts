// GLOSH outlier scores (Campello, Moulavi, Zimek & Sander 2015): score(x) = 1 − λ(x) / λ_max(C),
// where C is the condensed-tree cluster x last belonged to, λ(x) the row's level (see
// CondensedTree.rowLevel: R dbscan's reading, which follows a row in a small group to where it
// becomes a single row, but not past the λ at which its cluster splits in two) and λ_max(C) the
// largest such level among the rows of C and of the clusters below it. 0 for a row as dense as
// the densest part of its cluster, towards 1 for a row far outside it. With identical rows λ can
// be Infinity: a row at Infinity scores 0, a finite row under an Infinity maximum scores 1.
// When the root never splits (every row is noise), λ_max is taken as Infinity, so every row with a
// finite level scores 1: there is no cluster to measure against, and R dbscan does the same.
// Matched to R dbscan's `hdbscan` to 1e-9 on every fixture case. O(clusters + n).
import { CondensedTree } from './condensed-tree';

export function gloshScores(tree: CondensedTree): Float64Array {
  const { clusterCount, parent, rowCluster, rowLevel } = tree;
  const n = rowCluster.length;
  const top = new Float64Array(clusterCount);
  for (let r = 0; r < n; r++) if (rowLevel[r] > top[rowCluster[r]]) top[rowCluster[r]] = rowLevel[r];
  // Children have larger numbers than their parents: descending order is bottom-up.
  for (let c = clusterCount - 1; c >= 1; c--) if (top[c] > top[parent[c]]) top[parent[c]] = top[c];
  if (clusterCount === 1) top[0] = Infinity;
  const scores = new Float64Array(n);
  for (let r = 0; r < n; r++) {
    const max = top[rowCluster[r]];
    const lambda = rowLevel[r];
    if (lambda === Infinity) scores[r] = 0;
    else if (max === Infinity) scores[r] = 1;
    else scores[r] = max > 0 ? 1 - lambda / max : 0;
  }
  return scores;
}
