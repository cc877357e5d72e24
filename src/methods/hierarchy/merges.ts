// Raw merge lists as the algorithms produce them, and their conversion to the tree's numbering.
//
// The algorithms name clusters by a representative row index (0..n-1) and record each merge as
// (a, b, height) in the order they find it. `relabelSorted` turns that into the published
// numbering: merges sorted by height (stable, so equal heights keep discovery order), leaves
// 0..n-1, merge i creating node n+i, left < right. `relabelInOrder` does the same without sorting,
// for the generic algorithm whose discovery order is the true merge order (centroid and median
// can merge below an earlier height, and sorting would build a different tree).

export interface RawMerges {
  /** Representative of one side of each merge. */
  readonly a: Int32Array;
  /** Representative of the other side. */
  readonly b: Int32Array;
  /** Height of each merge. */
  readonly height: Float64Array;
}

export interface NumberedMerges {
  readonly left: Int32Array;
  readonly right: Int32Array;
  readonly height: Float64Array;
  readonly size: Int32Array;
}

export function createRawMerges(n: number): RawMerges {
  return { a: new Int32Array(n - 1), b: new Int32Array(n - 1), height: new Float64Array(n - 1) };
}

/** Stable order of merges by height (ties keep discovery order). */
function stableHeightOrder(height: Float64Array): Int32Array {
  const m = height.length;
  const order = new Int32Array(m);
  for (let i = 0; i < m; i++) order[i] = i;
  // Sorting indices with a tie-break on the index itself makes any sort stable.
  return order.sort((p, q) => height[p] - height[q] || p - q);
}

/** Sort by height (stable) and number the nodes with a union-find over representatives. */
export function relabelSorted(n: number, raw: RawMerges): NumberedMerges {
  return relabel(n, raw, stableHeightOrder(raw.height));
}

/** Number the nodes in discovery order (no sorting). */
export function relabelInOrder(n: number, raw: RawMerges): NumberedMerges {
  const order = new Int32Array(n - 1);
  for (let i = 0; i < n - 1; i++) order[i] = i;
  return relabel(n, raw, order);
}

function relabel(n: number, raw: RawMerges, order: Int32Array): NumberedMerges {
  const m = n - 1;
  const left = new Int32Array(m);
  const right = new Int32Array(m);
  const height = new Float64Array(m);
  const size = new Int32Array(m);
  // Union-find over 2n-1 nodes: parent[x] = x for roots; node ids double as cluster names.
  const parent = new Int32Array(2 * n - 1);
  for (let i = 0; i < parent.length; i++) parent[i] = i;
  const nodeSize = new Int32Array(2 * n - 1);
  nodeSize.fill(1, 0, n);
  const find = (x: number): number => {
    let root = x;
    while (parent[root] !== root) root = parent[root];
    while (parent[x] !== root) {
      const next = parent[x];
      parent[x] = root;
      x = next;
    }
    return root;
  };
  for (let i = 0; i < m; i++) {
    const r = order[i];
    const x = find(raw.a[r]);
    const y = find(raw.b[r]);
    const lo = x < y ? x : y;
    const hi = x < y ? y : x;
    left[i] = lo;
    right[i] = hi;
    height[i] = raw.height[r];
    const node = n + i;
    nodeSize[node] = nodeSize[lo] + nodeSize[hi];
    size[i] = nodeSize[node];
    parent[lo] = node;
    parent[hi] = node;
  }
  return { left, right, height, size };
}
