// classificationTree(): the documented behaviour beyond the rpart comparison — missing values
// follow the larger child, depth and minimum leaf hold, ties resolve the same way every time,
// splits that change no prediction are pruned, many levels and ordinal columns, refusals.
import { describe, expect, it } from 'vitest';
import { classificationTree, leafOf, type RuleColumn, type RuleTreeNode } from '../../../src/methods/rules';
import { createRandom } from '../../../src/random';

const num = (name: string, values: number[]): RuleColumn => ({ name, kind: 'numeric', values: Float64Array.from(values) });

function leaves(node: RuleTreeNode, out: RuleTreeNode[] = []): RuleTreeNode[] {
  if (!node.split) out.push(node);
  else {
    leaves(node.left!, out);
    leaves(node.right!, out);
  }
  return out;
}

describe('classificationTree behaviour', () => {
  it('chooses the split on rows with a value; missing rows follow the child with more rows', () => {
    // x < 5 → class 0 (3 rows), x ≥ 5 → class 1 (6 rows); two rows without x are class 0.
    const x = [1, 2, 3, 6, 7, 8, 9, 10, 11, NaN, NaN];
    const target = Int32Array.from([0, 0, 0, 1, 1, 1, 1, 1, 1, 0, 0]);
    const tree = classificationTree([num('x', x)], target, { depth: 1, minLeaf: 1 });
    const split = tree.root.split!;
    expect(split.kind === 'threshold' && split.threshold).toBe(4.5);
    expect(split.missingGoesLeft).toBe(false);
    expect(tree.root.right!.size).toBe(8);
    expect(leafOf(tree, () => NaN).prediction).toBe(1);
  });

  it('respects depth and minimum leaf size', () => {
    const rng = createRandom(2);
    const n = 400;
    const a = Array.from({ length: n }, () => rng.normal());
    const b = Array.from({ length: n }, () => rng.normal());
    const target = Int32Array.from(a.map((v, i) => (v + 0.5 * b[i] > 0 ? 1 : 0) + (b[i] > 1 ? 1 : 0)));
    for (const [depth, minLeaf] of [
      [1, 1],
      [2, 30],
      [4, 15],
    ]) {
      const tree = classificationTree([num('a', a), num('b', b)], target, { depth, minLeaf });
      for (const leaf of leaves(tree.root)) {
        expect(leaf.depth).toBeLessThanOrEqual(depth);
        expect(leaf.size).toBeGreaterThanOrEqual(minLeaf);
      }
    }
  });

  it('ties: of two columns that split equally well, the first given wins; rerunning gives the same tree', () => {
    const x = [1, 2, 3, 4, 5, 6];
    const target = Int32Array.from([0, 0, 0, 1, 1, 1]);
    const first = classificationTree([num('p', x), num('q', x)], target, { depth: 1, minLeaf: 1 });
    expect(first.root.split!.column).toBe(0);
    const swapped = classificationTree([num('q', x), num('p', x)], target, { depth: 1, minLeaf: 1 });
    expect(swapped.root.split!.column).toBe(0);
    expect(JSON.stringify(classificationTree([num('p', x), num('q', x)], target, { depth: 1, minLeaf: 1 }))).toBe(JSON.stringify(first));
  });

  it('prunes a split whose children predict the same class (complexity 0)', () => {
    // Left of 5: 4 of class 0, 1 of class 1; right: 3 of class 0, 2 of class 1. Gini improves, errors do not.
    const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const target = Int32Array.from([0, 0, 1, 0, 0, 0, 1, 0, 1, 0]);
    const tree = classificationTree([num('x', x)], target, { depth: 3, minLeaf: 1 });
    // No internal node has two leaf children that predict the same class.
    const check = (node: RuleTreeNode) => {
      if (!node.split) return;
      if (!node.left!.split && !node.right!.split) expect(node.left!.prediction).not.toBe(node.right!.prediction);
      check(node.left!);
      check(node.right!);
    };
    check(tree.root);
  });

  it('groups many unordered levels: 20 levels, two classes, the optimal grouping (levels by class share)', () => {
    const levels = Array.from({ length: 20 }, (_, i) => `L${i}`);
    const values: number[] = [];
    const target: number[] = [];
    levels.forEach((_, code) => {
      for (let r = 0; r < 10; r++) {
        values.push(code);
        target.push(code % 3 === 0 ? 1 : 0);
      }
    });
    const tree = classificationTree(
      [{ name: 'zone', kind: 'categorical', values: Float64Array.from(values), levels }],
      Int32Array.from(target),
      { depth: 1, minLeaf: 1 },
    );
    const split = tree.root.split!;
    expect(split.kind).toBe('levels');
    if (split.kind === 'levels') {
      const side = new Set(split.left.includes(0) ? split.left : split.right);
      expect([...side].sort((a, b) => a - b)).toEqual([0, 3, 6, 9, 12, 15, 18]);
    }
  });

  it('ordinal columns split between ranks', () => {
    const levels = ['low', 'mid', 'high', 'top'];
    const values = [0, 0, 1, 1, 2, 2, 3, 3];
    const target = Int32Array.from([0, 0, 0, 0, 1, 1, 1, 1]);
    const tree = classificationTree([{ name: 'band', kind: 'ordinal', values: Float64Array.from(values), levels }], target, {
      depth: 1,
      minLeaf: 1,
    });
    const split = tree.root.split!;
    expect(split.kind === 'threshold' && split.threshold).toBe(1.5);
  });

  it('refuses bad options and classes', () => {
    expect(() => classificationTree([num('x', [1, 2])], Int32Array.from([0, 1]), { depth: 0 })).toThrow(/depth/);
    expect(() => classificationTree([num('x', [1, 2])], Int32Array.from([0, 1]), { minLeaf: 5 })).toThrow(/minLeaf/);
    expect(() => classificationTree([num('x', [1, 2, 3])], Int32Array.from([0, 1]))).toThrow(/3 values for 2 rows/);
    expect(() => classificationTree([num('x', [1, 2])], Int32Array.from([0, -1]))).toThrow(/row 2 has class -1/);
    expect(() => classificationTree([num('x', [1, 2])], Int32Array.from([0, 1]), { deep: 2 } as never)).toThrow(/unknown option "deep"/);
  });
});
