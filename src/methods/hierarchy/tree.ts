// The tree result: merges in the published numbering plus the operations people need on it
// (leaf order for drawing, cuts, cophenetic dissimilarities, their correlation with the input).
import { KinsortError } from '../../core/errors';
import { checkOptions, describe } from '../../core/options';
import { Dissimilarity, condensedIndex, guardPairwise, makeDissimilarity } from '../../measure/condensed';
import { NumberedMerges } from './merges';

export type LinkageMethod = 'single' | 'complete' | 'average' | 'weighted' | 'centroid' | 'median' | 'ward';

export interface TreeMerge {
  /** Smaller node id of the two joined (leaf 0..n-1 or merge node n+i). */
  readonly left: number;
  /** Larger node id of the two joined. */
  readonly right: number;
  /** Dissimilarity at which they join (distance scale for ward / centroid / median). */
  readonly height: number;
  /** Rows under the new node. */
  readonly size: number;
}

export interface HeightInversion {
  /** Index of the merge that sits lower than one of its children. */
  readonly merge: number;
  readonly height: number;
  /** The higher child merge's height. */
  readonly childHeight: number;
}

export interface MonotonicReport {
  /** True when no merge is lower than a merge beneath it. */
  readonly ok: boolean;
  readonly inversions: readonly HeightInversion[];
}

/** `{ k }`: exactly k segments. `{ height }`: join everything that joins at or below this height. */
export type CutSpec = { readonly k: number } | { readonly height: number };

export interface Tree {
  readonly kind: 'tree';
  /** Number of leaves (rows). */
  readonly size: number;
  readonly method: LinkageMethod;
  readonly metric: string;
  /** n-1 merges; merge i creates node n+i. Non-decreasing heights unless `monotonic.ok` is false. */
  readonly merges: readonly TreeMerge[];
  /** Leaves left to right as a dendrogram draws them (depth-first, `left` first). */
  readonly order: readonly number[];
  readonly labels?: readonly string[];
  readonly monotonic: MonotonicReport;
  /**
   * Segment of every row, 0..k-1. Segments are numbered by their smallest row: the segment
   * holding row 1 is 0, the next segment met in row order is 1, and so on.
   * `{ k }` undoes the last n-k merges, so ties in height are broken by merge order and the
   * count is always exactly k. `{ height }` keeps a merge when it and every merge beneath it
   * are at or below the height (the same rule on trees with inversions).
   */
  cut(spec: CutSpec): Int32Array;
  /** Height at which each pair of rows first shares a node, as a condensed dissimilarity. */
  cophenetic(): Dissimilarity;
  /**
   * Pearson correlation between the cophenetic and the original dissimilarities. Without an
   * argument the original is the tree's own input (rows: recomputed pair by pair with the
   * metric, no matrix stored). NaN when either side has no spread (e.g. two rows, or all heights equal).
   */
  copheneticCorrelation(original?: Dissimilarity): number;
}

/** Where the original dissimilarity of a pair comes from, for the cophenetic correlation. */
export type PairSource =
  | { readonly kind: 'dissimilarity'; readonly dissimilarity: Dissimilarity }
  | { readonly kind: 'pairs'; pair(i: number, j: number): number };

export function buildTree(
  merged: NumberedMerges,
  n: number,
  method: LinkageMethod,
  metric: string,
  source: PairSource,
  labels?: readonly string[],
): Tree {
  const { left, right, height, size } = merged;
  const m = n - 1;
  const nodeSize = (node: number) => (node < n ? 1 : size[node - n]);

  // Each node covers a contiguous stretch of the leaf order; parents have larger ids than
  // children, so one pass from the root down places every node.
  const start = new Int32Array(2 * n - 1);
  for (let i = m - 1; i >= 0; i--) {
    const s = start[n + i];
    start[left[i]] = s;
    start[right[i]] = s + nodeSize(left[i]);
  }
  const orderArray = new Int32Array(n);
  for (let leaf = 0; leaf < n; leaf++) orderArray[start[leaf]] = leaf;

  const merges: TreeMerge[] = new Array(m);
  for (let i = 0; i < m; i++) merges[i] = { left: left[i], right: right[i], height: height[i], size: size[i] };

  // Highest merge at or beneath each merge: equals its height on monotone trees.
  const reach = new Float64Array(m);
  const inversions: HeightInversion[] = [];
  for (let i = 0; i < m; i++) {
    const l = left[i] >= n ? reach[left[i] - n] : -Infinity;
    const r = right[i] >= n ? reach[right[i] - n] : -Infinity;
    const child = l > r ? l : r;
    const below = Math.max(left[i] >= n ? height[left[i] - n] : -Infinity, right[i] >= n ? height[right[i] - n] : -Infinity);
    if (height[i] < below) inversions.push({ merge: i, height: height[i], childHeight: below });
    reach[i] = height[i] > child ? height[i] : child;
  }

  const segmentsFromMerges = (included: (i: number) => boolean): Int32Array => {
    // Top-down: a node inherits the top of its segment from its parent; an included merge
    // whose parent is not included starts a segment.
    const top = new Int32Array(2 * n - 1).fill(-1);
    for (let i = m - 1; i >= 0; i--) {
      const node = n + i;
      let t = top[node];
      if (t === -1 && included(i)) t = node;
      top[left[i]] = t;
      top[right[i]] = t;
    }
    const assignment = new Int32Array(n);
    const number = new Map<number, number>();
    for (let row = 0; row < n; row++) {
      const t = top[row] === -1 ? row : top[row];
      let c = number.get(t);
      if (c === undefined) {
        c = number.size;
        number.set(t, c);
      }
      assignment[row] = c;
    }
    return assignment;
  };

  // A cut into k undoes the last k-1 merges; undoing one at height 0 would put leaves at
  // dissimilarity 0 (identical rows) into different segments, which no reading can justify.
  const refuseSplittingIdentical = (k: number, keep: number): void => {
    let atZero = 0;
    let undoneAtZero = false;
    for (let i = 0; i < merges.length; i++) {
      if (merges[i].height > 0) continue;
      atZero++;
      if (i >= keep) undoneAtZero = true;
    }
    if (undoneAtZero) {
      throw new KinsortError(
        `cut: k = ${k} would split leaves that join at height 0 (identical rows) into different segments; ` +
          `the ${n} leaves hold only ${n - atZero} distinct ones, so k can be at most ${n - atZero}.`,
        'bad-k',
      );
    }
  };

  const cut = (spec: CutSpec): Int32Array => {
    checkOptions(spec, ['k', 'height'], 'cut');
    const hasK = spec !== null && typeof spec === 'object' && 'k' in spec && spec.k !== undefined;
    const hasHeight = spec !== null && typeof spec === 'object' && 'height' in spec && spec.height !== undefined;
    if (hasK === hasHeight) {
      throw new KinsortError(
        `cut: give either { k } (number of segments, 1 to ${n}) or { height } (a height ≥ 0), not ${hasK ? 'both' : 'neither'}.`,
        'bad-option',
      );
    }
    if (hasK) {
      const k = (spec as { k: unknown }).k;
      if (typeof k !== 'number' || !Number.isInteger(k) || k < 1 || k > n) {
        throw new KinsortError(`cut: k must be a whole number from 1 to ${n} (the number of rows); got ${describe(k)}.`, 'bad-k');
      }
      const keep = n - k;
      refuseSplittingIdentical(k, keep);
      return segmentsFromMerges((i) => i < keep);
    }
    const given = (spec as { height: unknown }).height;
    if (typeof given !== 'number' || Number.isNaN(given) || given < 0) {
      let top = 0;
      for (const merge of merges) top = Math.max(top, merge.height);
      throw new KinsortError(
        `cut: height must be a number ≥ 0 (this tree's merges lie between 0 and ${top}); got ${describe(given)}.`,
        'bad-option',
      );
    }
    const h = given;
    return segmentsFromMerges((i) => reach[i] <= h);
  };

  const cophenetic = (): Dissimilarity => {
    guardPairwise(n, 'cophenetic');
    const condensed = new Float64Array((n * (n - 1)) / 2);
    forEachJoinedPair((i, j, h) => {
      condensed[condensedIndex(n, i, j)] = h;
    });
    return makeDissimilarity(n, condensed, 'cophenetic', labels);
  };

  /** Visit every pair once, with the height of the node where it joins. */
  const forEachJoinedPair = (visit: (i: number, j: number, h: number) => void) => {
    for (let k = 0; k < m; k++) {
      const h = height[k];
      const ls = start[left[k]];
      const le = ls + nodeSize(left[k]);
      const rs = start[right[k]];
      const re = rs + nodeSize(right[k]);
      for (let a = ls; a < le; a++) {
        const i = orderArray[a];
        for (let b = rs; b < re; b++) visit(i, orderArray[b], h);
      }
    }
  };

  const copheneticCorrelation = (original?: Dissimilarity): number => {
    let pair: (i: number, j: number) => number;
    if (original !== undefined) {
      if (original === null || typeof original !== 'object' || !(original.condensed instanceof Float64Array)) {
        throw new KinsortError('copheneticCorrelation: the argument must be a Dissimilarity (see fromCondensed).', 'bad-dissimilarity');
      }
      if (original.size !== n) {
        throw new KinsortError(
          `copheneticCorrelation: the dissimilarity has ${original.size} rows but the tree has ${n} leaves.`,
          'bad-dissimilarity',
        );
      }
      const d = original;
      pair = (i, j) => d.condensed[condensedIndex(n, i, j)];
    } else if (source.kind === 'dissimilarity') {
      const d = source.dissimilarity;
      pair = (i, j) => d.condensed[condensedIndex(n, i, j)];
    } else {
      pair = source.pair;
    }
    // One pass with sums shifted by a typical height, which keeps cancellation small.
    let shift = 0;
    for (let k = 0; k < m; k++) shift += height[k];
    shift /= m;
    let count = 0;
    let sc = 0;
    let so = 0;
    let scc = 0;
    let soo = 0;
    let sco = 0;
    forEachJoinedPair((i, j, h) => {
      const c = h - shift;
      const o = pair(i, j) - shift;
      count++;
      sc += c;
      so += o;
      scc += c * c;
      soo += o * o;
      sco += c * o;
    });
    const cov = sco - (sc * so) / count;
    const vc = scc - (sc * sc) / count;
    const vo = soo - (so * so) / count;
    return cov / Math.sqrt(vc * vo);
  };

  return {
    kind: 'tree',
    size: n,
    method,
    metric,
    merges,
    order: Array.from(orderArray),
    labels,
    monotonic: { ok: inversions.length === 0, inversions },
    cut,
    cophenetic,
    copheneticCorrelation,
  };
}
