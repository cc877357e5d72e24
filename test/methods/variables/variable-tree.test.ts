// variableTree(): heights and cuts against R (stats::cor + hclust + cutree, fixture script
// test/reference/variable_tree.R, R 4.2.2) on mtcars, swiss and longley; a synthetic case of
// three hidden factors with four noisy indicators each; the group summaries; refusals.
import { readFileSync } from 'fs';
import { join } from 'path';
import { describe, expect, it } from 'vitest';
import { variableTree } from '../../../src/methods/variables';
import { readTable } from '../../../src/table';
import { createRandom } from '../../../src/random';
import { KinsortError } from '../../../src/core/errors';

interface Run {
  similarity: 'pearson' | 'spearman';
  strength: 'squared' | 'absolute';
  method: 'average';
  call: string;
  heightsSorted: number[];
  cuts: number[][];
}
const fixture = JSON.parse(readFileSync(join(__dirname, '../../reference/fixtures/variable_tree.json'), 'utf8')) as {
  producedBy: string;
  data: Record<
    string,
    {
      columns: string[];
      rows: number[][];
      runs: Run[];
      groups: {
        k: number;
        firstComponentShare: number[];
        members: { name: string; group: number; sharedWithOwn: number; sharedWithNext: number; unexplainedRatio: number }[];
      };
    }
  >;
};

describe('variableTree matches R hclust on 1 − r² and 1 − |r| (' + fixture.producedBy + ')', () => {
  for (const [name, set] of Object.entries(fixture.data)) {
    for (const run of set.runs) {
      it(`${name}: ${run.call.replace('X', name)}`, () => {
        const tree = variableTree(set.rows, { similarity: run.similarity, strength: run.strength, method: run.method, names: set.columns });
        const heights = tree.merges.map((m) => m.height).sort((a, b) => a - b);
        expect(heights.length).toBe(run.heightsSorted.length);
        heights.forEach((h, i) => expect(Math.abs(h - run.heightsSorted[i])).toBeLessThan(1e-12));
        // cutree numbers groups by first appearance in column order, as our cut does.
        run.cuts.forEach((expected, t) => {
          expect(Array.from(tree.cut({ k: t + 2 }))).toEqual(expected.map((g) => g - 1));
        });
        expect(tree.labels).toEqual(set.columns);
      });
    }
  }
});

describe('group summaries match R prcomp on the groups of hclust(as.dist(1 - cor(X)^2), "average") cut into 3', () => {
  for (const [name, set] of Object.entries(fixture.data)) {
    it(`${name}: first-component shares, R² with own and next group, 1 − R² ratios`, () => {
      const groups = variableTree(set.rows, { names: set.columns }).groups({ k: set.groups.k });
      groups.forEach((g, t) => expect(Math.abs(g.firstComponentShare - set.groups.firstComponentShare[t])).toBeLessThan(1e-10));
      for (const expected of set.groups.members) {
        const g = groups[expected.group - 1];
        const m = g.members.find((x) => x.name === expected.name)!;
        expect(Math.abs(m.sharedWithOwn - expected.sharedWithOwn)).toBeLessThan(1e-10);
        expect(Math.abs(m.sharedWithNext - expected.sharedWithNext)).toBeLessThan(1e-10);
        expect(Math.abs(m.unexplainedRatio - expected.unexplainedRatio)).toBeLessThan(1e-9);
      }
    });
  }
});

/** Three independent hidden factors, four indicators each (indicator = factor + 0.6 × noise), columns shuffled. */
function threeFactors(n: number, seed: number): { rows: number[][]; names: string[]; factorOf: number[] } {
  const rng = createRandom(seed);
  const layout = [0, 1, 2, 0, 1, 2, 0, 1, 2, 0, 1, 2];
  const names = layout.map((f, j) => `f${f + 1}_item${j + 1}`);
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) {
    const factors = [rng.normal(), rng.normal(), rng.normal()];
    rows.push(layout.map((f) => factors[f] + 0.6 * rng.normal()));
  }
  return { rows, names, factorOf: layout };
}

describe('synthetic: three hidden factors × four indicators', () => {
  const { rows, names, factorOf } = threeFactors(400, 19);
  for (const options of [{}, { similarity: 'spearman' as const }, { strength: 'absolute' as const, method: 'complete' as const }]) {
    it(`splits into the three factors at k = 3 (${JSON.stringify(options)})`, () => {
      const tree = variableTree(rows, { ...options, names });
      const cut = tree.cut({ k: 3 });
      for (let a = 0; a < names.length; a++) {
        for (let b = 0; b < names.length; b++) expect(cut[a] === cut[b]).toBe(factorOf[a] === factorOf[b]);
      }
    });
  }

  it('group summaries: high first-component share, one representative per group from that group', () => {
    const groups = variableTree(rows, { names }).groups({ k: 3 });
    expect(groups).toHaveLength(3);
    for (const g of groups) {
      expect(g.members).toHaveLength(4);
      // Each indicator shares 1/(1+0.36) ≈ 0.74 of its variance with its factor, so the first
      // component of four of them explains about (1 + 3·0.74)/4 ≈ 0.80 (derived from the model).
      expect(g.firstComponentShare).toBeGreaterThan(0.7);
      expect(g.members.map((m) => m.name)).toContain(g.representative);
      for (const m of g.members) {
        expect(m.sharedWithOwn).toBeGreaterThan(0.6);
        expect(m.sharedWithNext).toBeLessThan(0.1);
        expect(m.unexplainedRatio).toBeCloseTo((1 - m.sharedWithOwn) / (1 - m.sharedWithNext), 12);
      }
      const best = Math.min(...g.members.map((m) => m.unexplainedRatio));
      expect(g.members.find((m) => m.name === g.representative)!.unexplainedRatio).toBe(best);
    }
  });
});

describe('group summaries by hand', () => {
  it('a group of two columns with correlation r: first component explains (1 + |r|)/2, each shares (1 + |r|)/2', () => {
    // Eigenvalues of [[1, r], [r, 1]] are 1 ± r (textbook), eigenvector (1, ±1)/√2.
    const rng = createRandom(3);
    const rows: number[][] = [];
    for (let i = 0; i < 200; i++) {
      const a = rng.normal();
      rows.push([a, a + rng.normal(), rng.normal()]);
    }
    const tree = variableTree(rows, { names: ['a', 'b', 'c'] });
    const r = tree.correlation[1];
    const [ab] = tree.groups({ k: 2 });
    expect(ab.members.map((m) => m.name)).toEqual(['a', 'b']);
    expect(ab.firstComponentShare).toBeCloseTo((1 + Math.abs(r)) / 2, 12);
    expect(ab.members[0].sharedWithOwn).toBeCloseTo((1 + Math.abs(r)) / 2, 12);
  });
});

describe('variableTree on a table, and refusals', () => {
  it('binary columns enter as 0/1 (point-biserial), ordinal by rank; unordered categorical refused with the reason', () => {
    const records = Array.from({ length: 30 }, (_, i) => ({
      x: i,
      y: (i * 7) % 11,
      member: i % 2 ? 'yes' : 'no',
      fare: ['adult', 'child', 'senior'][i % 3],
    }));
    const table = readTable(records);
    const tree = variableTree(table, { columns: ['x', 'y', 'member'] });
    expect(tree.names).toEqual(['x', 'y', 'member']);
    expect(tree.entered[2]).toMatch(/binary: "no" = 0, "yes" = 1/);
    let caught: unknown;
    try {
      variableTree(table);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(KinsortError);
    expect((caught as Error).message).toMatch(/"fare" is categorical with 3 unordered levels.*correlation ratio/);
  });

  it('missing values and constant columns are refused by row and column', () => {
    const table = readTable([
      { a: 1, b: 2 },
      { a: 2, b: null },
      { a: 3, b: 1 },
      { a: 4, b: 5 },
    ]);
    expect(() => variableTree(table)).toThrow(/row 2, column "b" is missing/);
    expect(() =>
      variableTree(
        [
          [1, 1],
          [2, 1],
          [3, 1],
        ],
        { names: ['u', 'v'] },
      ),
    ).toThrow(/"v" has the same value in every row/);
    expect(() =>
      variableTree(
        [
          [1, 2],
          [2, 1],
          [3, 3],
        ],
        { similarity: 'kendall' as never },
      ),
    ).toThrow(/similarity/);
    expect(() =>
      variableTree(
        [
          [1, 2],
          [2, 1],
          [3, 3],
        ],
        { method: 'ward' as never },
      ),
    ).toThrow(/not Euclidean/);
  });
});
