// The memory guard: before an n × n allocation above the budget, a clear refusal with the size and
// the alternatives, through every route that would build one; routes that need no matrix still run.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { agglomerate, dissimilarity, kmeans, kmedoids, silhouette, study } from '../../src';
import { setPairBudget } from '../../src/internal';
import { refusal } from './helpers';
import { groupedRows } from './data';

const rows = groupedRows(200, 3, 3, 5); // 19,900 pairs: 159,200 bytes as float64
let previous = 0;
beforeEach(() => {
  previous = setPairBudget(100_000);
});
afterEach(() => {
  setPairBudget(previous);
});

const SIZE = ['200 rows', '19,900 pairs', 'KB', 'k-means', 'k-medoids on a sample', 'Ward'];

describe('over the budget: refused before allocating, with the size and the alternatives', () => {
  it('dissimilarity', () => {
    const e = refusal(() => dissimilarity(rows, { metric: 'manhattan' }), ...SIZE);
    expect(e.code).toBe('too-large');
  });
  it('silhouette from a dissimilarity (the dissimilarity is the step refused)', () => {
    refusal(() => silhouette(dissimilarity(rows, {}), new Int32Array(200)), ...SIZE);
  });
  it('kmedoids on rows', () => {
    refusal(() => kmedoids(rows, { k: 3 }), ...SIZE);
  });
  it('agglomerate with average, complete and weighted linkage on rows (through the condensed route)', () => {
    for (const method of ['average', 'complete', 'weighted'] as const) {
      refusal(() => agglomerate(rows, { method, metric: 'manhattan' }), ...SIZE);
    }
  });
  // Found by this suite: the full-array route for Euclidean rows once skipped the budget check.
  it('agglomerate with average, complete and weighted linkage on Euclidean rows (full-array route) respects the budget', () => {
    for (const method of ['average', 'complete', 'weighted'] as const) refusal(() => agglomerate(rows, { method }), ...SIZE);
  });
  it('the fluent layer: kmedoids, average linkage and the dissimilarity', () => {
    const s = study(
      rows.map((r, i) => ({ id: `r${i}`, a: r[0], b: r[1], c: r[2] })),
      { id: 'id' },
    ).prepare();
    refusal(() => s.kmedoids({ k: 3 }), ...SIZE);
    refusal(() => s.agglomerate({ method: 'average' }), ...SIZE);
    refusal(() => s.dissimilarity({ metric: 'euclidean' }), ...SIZE);
  });
});

describe('the alternatives named in the refusal work under the same budget', () => {
  it('Ward from the rows, single linkage (spanning tree from rows), k-means, and silhouette from the rows need no n × n matrix', () => {
    const tree = agglomerate(rows, { method: 'ward' });
    expect(new Set(tree.cut({ k: 3 })).size).toBe(3);
    expect(agglomerate(rows, { method: 'single' }).merges.length).toBe(199);
    const fit = kmeans(rows, { k: 3, seed: 1 });
    expect(fit.sizes.reduce((a, b) => a + b, 0)).toBe(200);
    const sil = silhouette(rows, fit.assignment);
    expect(sil.average).toBeGreaterThan(0.5); // three separated groups of our own making
  });
  it('k-medoids on a sample of the rows fits within the budget', () => {
    const sample = rows.filter((_, i) => i % 4 === 0); // 50 rows: 1,225 pairs, 9,800 bytes
    expect(kmedoids(sample, { k: 3 }).medoids.length).toBe(3);
  });
});
