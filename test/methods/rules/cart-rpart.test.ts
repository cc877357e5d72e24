// classificationTree() against R's rpart (fixture script test/reference/rules_rpart.R, rpart 4.1.19,
// method "class", Gini, cp = 0, xval = 0, minsplit = 2 × minbucket): the same splits (node,
// variable, threshold or level sides) and the same leaf for every row, on iris (Fisher 1936),
// mtcars (Henderson & Velleman 1981), warpbreaks (Tippett 1950) and CO2 (Potvin et al. 1990).
// Plus a synthetic case defined by two thresholds, recovered exactly at depth 2.
import { readFileSync } from 'fs';
import { join } from 'path';
import { describe, expect, it } from 'vitest';
import { classificationTree, leafOf, type RuleColumn, type RuleTreeNode } from '../../../src/methods/rules';
import { createRandom } from '../../../src/random';

interface Fixture {
  producedBy: string;
  trees: {
    dataset: string;
    depth: number;
    minLeaf: number;
    target: string[];
    columns: { name: string; values: (number | string)[] }[];
    splits: { node: number; column: string; threshold?: number; left?: string[]; right?: string[] }[];
    leafOfRow: number[];
  }[];
}
const fixture = JSON.parse(readFileSync(join(__dirname, '../../reference/fixtures/rules_rpart.json'), 'utf8')) as Fixture;

function codes(values: readonly string[]): { levels: string[]; codes: Float64Array } {
  // R factor levels sort in the C locale for these datasets' plain ASCII names.
  const levels = [...new Set(values)].sort();
  return { levels, codes: Float64Array.from(values.map((v) => levels.indexOf(v))) };
}

function inner(node: RuleTreeNode, out: RuleTreeNode[] = []): RuleTreeNode[] {
  if (node.split) {
    out.push(node);
    inner(node.left!, out);
    inner(node.right!, out);
  }
  return out;
}

describe(`classificationTree matches ${fixture.producedBy}`, () => {
  for (const t of fixture.trees) {
    it(`${t.dataset}, depth ${t.depth}, minimum leaf ${t.minLeaf}`, () => {
      const columns: RuleColumn[] = t.columns.map((c) => {
        if (typeof c.values[0] === 'number') return { name: c.name, kind: 'numeric', values: Float64Array.from(c.values as number[]) };
        const { levels, codes: values } = codes(c.values as string[]);
        return { name: c.name, kind: 'categorical', values, levels };
      });
      const target = codes(t.target);
      const tree = classificationTree(columns, Int32Array.from(target.codes), { depth: t.depth, minLeaf: t.minLeaf });
      const ours = inner(tree.root).map((node) => {
        const s = node.split!;
        const column = columns[s.column];
        if (s.kind === 'threshold') return { node: node.id, column: column.name, threshold: s.threshold };
        const names = (side: readonly number[]) => side.map((code) => column.levels![code]).sort();
        return { node: node.id, column: column.name, sides: [names(s.left), names(s.right)].sort() };
      });
      const theirs = t.splits.map((s) =>
        s.threshold !== undefined
          ? { node: s.node, column: s.column, threshold: s.threshold }
          : { node: s.node, column: s.column, sides: [[...s.left!].sort(), [...s.right!].sort()].sort() },
      );
      // Node numbers: rpart sends the "<" side left for these splits, as we do; compare sets of
      // children to be independent of that convention.
      const byNode = (a: { node: number }, b: { node: number }) => a.node - b.node;
      const canon = (list: { node: number }[]) => list.map((s) => ({ ...s, node: depthOf(s.node) })).sort(byNode);
      expect(
        canon(ours)
          .map((s) => JSON.stringify(s))
          .sort(),
      ).toEqual(
        canon(theirs)
          .map((s) => JSON.stringify(s))
          .sort(),
      );
      // Same partition of the rows into leaves.
      const leaf = t.target.map((_, i) => leafOf(tree, (j) => columns[j].values[i]).id);
      const pairs = new Map<number, number>();
      leaf.forEach((ourLeaf, i) => {
        const known = pairs.get(ourLeaf);
        if (known === undefined) pairs.set(ourLeaf, t.leafOfRow[i]);
        else expect(known).toBe(t.leafOfRow[i]);
      });
      expect(new Set(pairs.values()).size).toBe(pairs.size);
    });
  }
});

function depthOf(node: number): number {
  return Math.floor(Math.log2(node));
}

describe('synthetic: segments defined by two thresholds', () => {
  it('recovers both thresholds at depth 2 and every row', () => {
    // Segment 0: x < 3; segment 1: x ≥ 3 and y < 7; segment 2: x ≥ 3 and y ≥ 7. Values on a grid
    // of tenths that straddles both cuts, plus a noise column.
    const rng = createRandom(5);
    const n = 600;
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    const noise = new Float64Array(n);
    const target = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = Math.round(rng.uniform(0, 60)) / 10;
      y[i] = Math.round(rng.uniform(40, 100)) / 10;
      noise[i] = rng.normal();
      target[i] = x[i] < 3 ? 0 : y[i] < 7 ? 1 : 2;
    }
    const columns: RuleColumn[] = [
      { name: 'noise', kind: 'numeric', values: noise },
      { name: 'x', kind: 'numeric', values: x },
      { name: 'y', kind: 'numeric', values: y },
    ];
    const tree = classificationTree(columns, target, { depth: 2, minLeaf: 1 });
    const splits = inner(tree.root).map((node) => [
      columns[node.split!.column].name,
      node.split!.kind === 'threshold' ? node.split!.threshold : NaN,
    ]);
    expect(splits).toEqual([
      ['x', 2.95],
      ['y', 6.95],
    ]);
    for (let i = 0; i < n; i++) expect(leafOf(tree, (j) => columns[j].values[i]).prediction).toBe(target[i]);
  });
});
