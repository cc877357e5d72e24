// Outside check: SciPy 1.10 scipy.cluster.hierarchy (linkage, fcluster maxclust / distance, cophenet,
// leaves_list) on data of our own making — fixture from test/reference/linkage_scipy.py.
import { describe, expect, it } from 'vitest';
import { agglomerate, LINKAGE_METHODS } from '../../../src/methods/hierarchy';
import { fromCondensed } from '../../../src/measure/condensed';
import { canonical, expectClose, heightsOf, leafSetsOf, mergesFromPairs, readFixture } from './helpers';

const fixture = readFixture('linkage_scipy.json');

function pdist(rows: number[][]): Float64Array {
  const n = rows.length;
  const out = new Float64Array((n * (n - 1)) / 2);
  let k = 0;
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      let s = 0;
      for (let t = 0; t < rows[i].length; t++) s += (rows[i][t] - rows[j][t]) ** 2;
      out[k++] = Math.sqrt(s);
    }
  return out;
}

describe('agglomerate against SciPy 1.10 linkage (data of our own making)', () => {
  for (const set of fixture.sets) {
    const rows: number[][] = set.rows;
    const n = rows.length;
    const d = fromCondensed(pdist(rows), { metric: 'euclidean' });
    const routes: [string, string, () => any][] = [];
    for (const method of LINKAGE_METHODS) {
      routes.push(['dissimilarity', method, () => agglomerate(d, { method })]);
      routes.push(['rows', method, () => agglomerate(rows, { method })]);
    }
    for (const [route, method, run] of routes) {
      // SciPy's reference for a route: linkage on observations for ward/centroid/median, else on pdist.
      const ref = route === 'rows' && set.fromRows[method] ? set.fromRows[method] : set.fromPdist[method];
      // On tied data the tree is not unique. The matrix NN-chain and MST routes resolve ties as
      // SciPy does; the generic algorithm's queue and the centroid arithmetic of the vector routes
      // may pick another of the equally good trees, so there only heights and sizes are compared.
      const tieSensitive = set.name === 'grid' && (method === 'centroid' || method === 'median' || (method === 'ward' && route === 'rows'));
      it(`${set.name}, ${method} from ${route}: heights (1e-10 relative), sizes${tieSensitive ? ' (as multisets; ties)' : ', merges, cuts'}, cophenetic correlation as SciPy`, () => {
        const tree = run();
        expect(tree.merges.length).toBe(n - 1);
        expectClose(heightsOf(tree), ref.heights, 1e-10);
        const sizes = tree.merges.map((m: any) => m.size);
        if (tieSensitive) {
          const sorted = (v: number[]) => [...v].sort((a, b) => a - b);
          expect(sorted(sizes)).toEqual(sorted(ref.sizes));
          expect(tree.copheneticCorrelation()).toBeGreaterThan(0);
          return;
        }
        expect(sizes).toEqual(ref.sizes);
        if (set.name !== 'grid') {
          // No ties: merges, numbering and leaf order must agree exactly.
          expect(tree.merges.map((m: any) => [m.left, m.right])).toEqual(ref.merges);
          expect(tree.order).toEqual(ref.order);
        } else {
          // Ties: left/right can be ambiguous, so merges are compared as sets of leaves.
          expect(leafSetsOf(tree.merges, n)).toEqual(leafSetsOf(mergesFromPairs(ref.merges, ref.heights), n));
        }
        for (const [kText, labels] of Object.entries(ref.cutsMaxclust as Record<string, number[]>)) {
          const k = Number(kText);
          // fcluster's maxclust gives fewer than k clusters when the cut falls on a tie; compare only clean cuts.
          if (new Set(labels).size !== k) continue;
          expect(canonical(tree.cut({ k })), `k = ${k}`).toEqual(canonical(labels));
        }
        // fcluster(Z, t, 'distance'): SciPy keeps a node when the highest merge beneath it is ≤ t.
        for (const { height, labels } of ref.heightCuts as { height: number; labels: number[] }[]) {
          expect(canonical(tree.cut({ height })), `height ${height}`).toEqual(canonical(labels));
        }
        // Inversions (centroid / median): a merge lower than a merge beneath it, read off SciPy's Z.
        const inverted = ref.merges.flatMap(([a, b]: number[], i: number) =>
          [a, b].some((c) => c >= n && ref.heights[c - n] > ref.heights[i]) ? [i] : [],
        );
        expect(tree.monotonic.inversions.map((v: any) => v.merge)).toEqual(inverted);
        expect(tree.monotonic.ok).toBe(inverted.length === 0);
        expect(tree.copheneticCorrelation()).toBeCloseTo(ref.copheneticCorrelation, 10);
        expect(tree.copheneticCorrelation(d)).toBeCloseTo(ref.copheneticCorrelation, 10);
        if (ref.cophenetic) expectClose(Array.from(tree.cophenetic().condensed), ref.cophenetic, 1e-10);
      });
    }
  }
});
