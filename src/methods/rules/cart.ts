// classificationTree(): a shallow CART tree (Breiman, Friedman, Olshen & Stone 1984) with Gini
// impurity, grown to a fixed depth and then pruned at complexity 0 (ch. 3): a split whose subtree
// does not lower the number of misclassified training rows is removed, so no rule ends in two
// leaves that say the same thing. The same rules as R's rpart(method = "class", cp = 0).
//
// Deterministic: columns are tried in the order given and a later column must beat an earlier
// one by more than 1e-9 rows of improvement; see best-split.ts for ties within a column.
// Missing values: a split is chosen on the rows that have a value; rows without one (and, when
// the tree is applied, levels never seen in training) follow the child with more training rows.
import { KinsortError } from '../../core/errors';
import { checkInteger, checkOptions } from '../../core/options';
import { TIE, bestSplitOn, sortedPresent } from './best-split';
import type { RuleColumn, RuleSplit, RuleTree, RuleTreeNode } from './types';

export interface ClassificationTreeOptions {
  /** Most conditions in one rule (root at depth 0). Default 3. */
  depth?: number;
  /** Fewest training rows in a leaf. Default 1% of the rows, at least 1. */
  minLeaf?: number;
  /** Fewest training rows in a node that may be split. Default 2 × minLeaf. */
  minSplit?: number;
}

const WHERE = 'classificationTree';

/** Which child a row goes to at a split: true for left. */
export function goesLeft(split: RuleSplit, value: number): boolean {
  if (Number.isNaN(value)) return split.missingGoesLeft;
  if (split.kind === 'threshold') return value < split.threshold;
  if (split.left.includes(value)) return true;
  if (split.right.includes(value)) return false;
  return split.missingGoesLeft; // a level this node never saw
}

/** The leaf a row reaches; `valueOf(column)` gives the row's value (NaN when missing). */
export function leafOf(tree: RuleTree, valueOf: (column: number) => number): RuleTreeNode {
  let node = tree.root;
  while (node.split) node = goesLeft(node.split, valueOf(node.split.column)) ? node.left! : node.right!;
  return node;
}

export function classificationTree(columns: readonly RuleColumn[], target: Int32Array, options: ClassificationTreeOptions = {}): RuleTree {
  const opts = checkOptions(options, ['depth', 'minLeaf', 'minSplit'], WHERE);
  const n = target.length;
  if (n < 2) throw new KinsortError(`${WHERE}: ${n} row(s); a tree needs at least 2.`, 'empty');
  if (columns.length === 0) throw new KinsortError(`${WHERE}: no columns to split on.`, 'empty');
  columns.forEach((c) => {
    if (c.values.length !== n)
      throw new KinsortError(`${WHERE}: column "${c.name}" has ${c.values.length} values for ${n} rows.`, 'bad-input');
  });
  const depth = checkInteger(opts.depth ?? 3, `${WHERE}: depth`, 1, 30);
  const minLeaf = checkInteger(opts.minLeaf ?? Math.max(1, Math.round(n / 100)), `${WHERE}: minLeaf`, 1, n);
  const minSplit = checkInteger(opts.minSplit ?? 2 * minLeaf, `${WHERE}: minSplit`, 2, Number.MAX_SAFE_INTEGER);
  let classes = 0;
  for (let i = 0; i < n; i++) {
    const t = target[i];
    if (!Number.isInteger(t) || t < 0)
      throw new KinsortError(`${WHERE}: row ${i + 1} has class ${t}; classes are 0, 1, 2, …`, 'bad-assignment');
    if (t + 1 > classes) classes = t + 1;
  }

  // Which child each row of the node being split goes to (1 = left), reused at every node.
  const side = new Uint8Array(n);
  const grow = (rows: Int32Array, sorted: (Int32Array | undefined)[], id: number, level: number): RuleTreeNode => {
    const counts = new Array<number>(classes).fill(0);
    for (const r of rows) counts[target[r]]++;
    let prediction = 0;
    for (let c = 1; c < classes; c++) if (counts[c] > counts[prediction]) prediction = c;
    const node: RuleTreeNode = { id, depth: level, size: rows.length, counts, prediction };
    if (level >= depth || rows.length < minSplit || counts[prediction] === rows.length) return node;
    let best: RuleSplit | undefined;
    columns.forEach((column, j) => {
      const s = bestSplitOn(column, j, rows, sorted[j], target, classes, minLeaf);
      if (s && (!best || s.improvement > best.improvement + TIE)) best = s;
    });
    if (!best) return node;
    const split = best;
    const values = columns[split.column].values;
    const left: number[] = [];
    const right: number[] = [];
    for (const r of rows) {
      const l = goesLeft(split, values[r]);
      side[r] = l ? 1 : 0;
      (l ? left : right).push(r);
    }
    // Each sorted list splits into two, order kept (a stable partition).
    const sortedLeft: (Int32Array | undefined)[] = [];
    const sortedRight: (Int32Array | undefined)[] = [];
    for (const list of sorted) {
      if (!list) {
        sortedLeft.push(undefined);
        sortedRight.push(undefined);
        continue;
      }
      let nl = 0;
      for (const r of list) nl += side[r];
      const a = new Int32Array(nl);
      const b = new Int32Array(list.length - nl);
      let ia = 0;
      let ib = 0;
      for (const r of list) {
        if (side[r]) a[ia++] = r;
        else b[ib++] = r;
      }
      sortedLeft.push(a);
      sortedRight.push(b);
    }
    // Missing values may push a side under minLeaf only by the rows they add, never below it.
    node.split = split;
    node.left = grow(Int32Array.from(left), sortedLeft, 2 * id, level + 1);
    node.right = grow(Int32Array.from(right), sortedRight, 2 * id + 1, level + 1);
    return node;
  };

  const all = new Int32Array(n);
  for (let i = 0; i < n; i++) all[i] = i;
  const root = grow(
    all,
    columns.map((c) => (c.kind === 'categorical' ? undefined : sortedPresent(c.values))),
    1,
    0,
  );
  prune(root);
  return {
    kind: 'rule-tree',
    columns: columns.map((c) => ({ name: c.name, kind: c.kind, levels: c.levels })),
    classes,
    root,
    depth,
    minLeaf,
    minSplit,
  };
}

/** Misclassified training rows in the node's leaves, after pruning its subtree at complexity 0. */
function prune(node: RuleTreeNode): number {
  const own = node.size - node.counts[node.prediction];
  if (!node.left || !node.right) return own;
  const below = prune(node.left) + prune(node.right);
  if (below < own) return below;
  node.split = undefined;
  node.left = undefined;
  node.right = undefined;
  return own;
}
