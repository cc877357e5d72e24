// The best Gini split of one node on one column (CART, Breiman et al. 1984, ch. 4): thresholds
// midway between neighbouring distinct values; for unordered levels every grouping into two sides
// up to 12 levels, beyond that the prefixes of the levels ordered by each class's share.
// Ties keep the first candidate met (lowest threshold, lowest subset number), so results are
// deterministic; two candidates within 1e-9 rows of improvement count as tied.
import type { RuleColumn, RuleSplit } from './types';

export const TIE = 1e-9;
const EXHAUSTIVE_LEVELS = 12;

/** Σ count² / total over classes: the part of n·(1 − Gini) the improvement needs. */
function purity(counts: Float64Array, total: number): number {
  if (total === 0) return 0;
  let s = 0;
  for (let c = 0; c < counts.length; c++) s += counts[c] * counts[c];
  return s / total;
}

/**
 * `rows`: the node's rows. `sorted`: for numeric and ordinal columns, the node's rows that have a
 * value, ordered by value then row (kept in order from the root down, so no node sorts again).
 */
export function bestSplitOn(
  column: RuleColumn,
  columnIndex: number,
  rows: Int32Array,
  sorted: Int32Array | undefined,
  target: Int32Array,
  classes: number,
  minLeaf: number,
): RuleSplit | undefined {
  return column.kind === 'categorical'
    ? bestLevelSplit(column, columnIndex, rows, target, classes, minLeaf)
    : bestThreshold(column, columnIndex, sorted!, target, classes, minLeaf);
}

/** Rows with a value in `values`, ordered by value then row: the root's sorted list. */
export function sortedPresent(values: Float64Array): Int32Array {
  const present: number[] = [];
  for (let r = 0; r < values.length; r++) if (!Number.isNaN(values[r])) present.push(r);
  present.sort((a, b) => values[a] - values[b] || a - b);
  return Int32Array.from(present);
}

function bestThreshold(
  column: RuleColumn,
  j: number,
  present: Int32Array,
  target: Int32Array,
  classes: number,
  minLeaf: number,
): RuleSplit | undefined {
  const v = column.values;
  const n = present.length;
  if (n < 2 * minLeaf) return undefined;
  const all = new Float64Array(classes);
  for (const r of present) all[target[r]]++;
  const base = purity(all, n);
  const left = new Float64Array(classes);
  const right = Float64Array.from(all);
  let best = TIE;
  let at = -1;
  for (let i = 0; i < n - 1; i++) {
    const c = target[present[i]];
    left[c]++;
    right[c]--;
    const nl = i + 1;
    if (nl < minLeaf) continue;
    if (n - nl < minLeaf) break;
    if (v[present[i]] === v[present[i + 1]]) continue;
    const gain = purity(left, nl) + purity(right, n - nl) - base;
    if (gain > best + TIE) {
      best = gain;
      at = i;
    }
  }
  if (at < 0) return undefined;
  return {
    kind: 'threshold',
    column: j,
    threshold: (v[present[at]] + v[present[at + 1]]) / 2,
    missingGoesLeft: at + 1 >= n - (at + 1),
    improvement: best,
  };
}

function bestLevelSplit(
  column: RuleColumn,
  j: number,
  rows: Int32Array,
  target: Int32Array,
  classes: number,
  minLeaf: number,
): RuleSplit | undefined {
  const v = column.values;
  // Class counts per level present at this node.
  const byLevel = new Map<number, Float64Array>();
  let n = 0;
  for (const r of rows) {
    if (Number.isNaN(v[r])) continue;
    let counts = byLevel.get(v[r]);
    if (!counts) byLevel.set(v[r], (counts = new Float64Array(classes)));
    counts[target[r]]++;
    n++;
  }
  const levels = [...byLevel.keys()].sort((a, b) => a - b);
  const L = levels.length;
  if (L < 2 || n < 2 * minLeaf) return undefined;
  const sizeOf = (lv: number) => byLevel.get(lv)!.reduce((s, x) => s + x, 0);
  const all = new Float64Array(classes);
  for (const lv of levels) byLevel.get(lv)!.forEach((x, c) => (all[c] += x));
  const base = purity(all, n);
  let best = TIE;
  let bestLeft: number[] | undefined;
  const tryLeft = (leftLevels: number[]) => {
    const left = new Float64Array(classes);
    let nl = 0;
    for (const lv of leftLevels) {
      byLevel.get(lv)!.forEach((x, c) => (left[c] += x));
      nl += sizeOf(lv);
    }
    if (nl < minLeaf || n - nl < minLeaf) return;
    const right = all.map((x, c) => x - left[c]);
    const gain = purity(left, nl) + purity(right, n - nl) - base;
    if (gain > best + TIE) {
      best = gain;
      bestLeft = leftLevels;
    }
  };
  if (L <= EXHAUSTIVE_LEVELS) {
    // Subsets of all levels but the last (which always sits right): each grouping once.
    for (let mask = 1; mask < 1 << (L - 1); mask++) tryLeft(levels.filter((_, t) => t < L - 1 && mask & (1 << t)));
  } else {
    for (let c = 0; c < classes; c++) {
      const share = (lv: number) => byLevel.get(lv)![c] / sizeOf(lv);
      const ordered = [...levels].sort((a, b) => share(a) - share(b) || a - b);
      for (let t = 1; t < L; t++) tryLeft(ordered.slice(0, t).sort((a, b) => a - b));
    }
  }
  if (!bestLeft) return undefined;
  const leftSet = new Set(bestLeft);
  const right = levels.filter((lv) => !leftSet.has(lv));
  let nl = 0;
  for (const lv of bestLeft) nl += sizeOf(lv);
  return { kind: 'levels', column: j, left: bestLeft, right, missingGoesLeft: nl >= n - nl, improvement: best };
}
