// The nearest-neighbour chain (Müllner 2011, Fig. 4) shared by the reducible linkages on a
// condensed matrix, on a full matrix and Ward from vectors: grow a chain of nearest neighbours
// until its last two are each other's nearest, merge them, and go on from what is left of the
// chain. Ties: a chain never leaves its predecessor for an equal candidate (that is what
// guarantees termination); otherwise the active cluster with the smallest index wins. Merging
// clusters x < y keeps the name y. Each algorithm supplies only its nearest search and its
// merge update.
import { RawMerges, createRawMerges } from './merges';
import { MergeTick } from './ticker';

export interface ChainClusters {
  /** Rows in each cluster (0 once merged away). */
  readonly size: Float64Array;
  /** Active cluster names in increasing order: the first `count`. */
  readonly active: Int32Array;
  count: number;
}

export interface ChainSteps {
  /**
   * The nearest active cluster to x. With a predecessor (≥ 0) the search starts from it, so an
   * equal candidate never replaces it; otherwise from Infinity, scanning in increasing order and
   * keeping the first smallest. Returns the candidate and writes its dissimilarity to `found.value`.
   */
  nearest(clusters: ChainClusters, x: number, predecessor: number, found: { value: number }): number;
  /** Clusters x < y, at dissimilarity `value`, become one named y (sizes still as before); returns the merge height. */
  merge(clusters: ChainClusters, x: number, y: number, value: number): number;
}

export function nnChain(n: number, steps: ChainSteps, tick?: MergeTick): RawMerges {
  const raw = createRawMerges(n);
  const clusters: ChainClusters = { size: new Float64Array(n).fill(1), active: new Int32Array(n), count: n };
  const { size, active } = clusters;
  for (let i = 0; i < n; i++) active[i] = i;
  const chain = new Int32Array(n);
  let chainLength = 0;
  const found = { value: 0 };

  for (let k = 0; k < n - 1; k++) {
    if (chainLength === 0) chain[chainLength++] = active[0];
    let x: number;
    let y: number;
    for (;;) {
      x = chain[chainLength - 1];
      const predecessor = chainLength > 1 ? chain[chainLength - 2] : -1;
      y = steps.nearest(clusters, x, predecessor, found);
      if (y === predecessor) break;
      chain[chainLength++] = y;
    }
    chainLength -= 2;
    if (x > y) {
      const t = x;
      x = y;
      y = t;
    }
    raw.a[k] = x;
    raw.b[k] = y;
    raw.height[k] = steps.merge(clusters, x, y, found.value);
    size[y] += size[x];
    size[x] = 0;
    // Drop x from the active list (O(n) per merge, cheap beside the scans).
    let q = 0;
    while (active[q] !== x) q++;
    active.copyWithin(q, q + 1, clusters.count);
    clusters.count--;
    if (tick) tick(k + 1);
  }
  return raw;
}
