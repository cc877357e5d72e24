// Documented tie rule, and agreement between the routes (rows vs dissimilarity; other metrics).
import { describe, expect, it } from 'vitest';
import { agglomerate, LINKAGE_METHODS } from '../../../src/methods/hierarchy';
import { dissimilarity } from '../../../src/measure/dissimilarity';
import { createRandom } from '../../../src/random';

describe('tie-breaking (documented rule: first minimum in increasing index; merged cluster keeps the larger index)', () => {
  it('three points on a line, 0–1 and 1–2 equally far: every method joins rows 1 and 2 (0-based 0 and 1) first', () => {
    for (const method of LINKAGE_METHODS) {
      const tree = agglomerate([[0], [1], [2]], { method });
      expect(tree.merges[0], method).toMatchObject({ left: 0, right: 1, height: 1, size: 2 });
      expect(tree.merges[1].left, method).toBe(2);
      expect(tree.merges[1].right, method).toBe(3);
    }
  });

  it('unit square: single linkage takes the smaller-index pairs first and is the same run after run', () => {
    const square = [
      [0, 0],
      [1, 0],
      [0, 1],
      [1, 1],
    ];
    const tree = agglomerate(square, { method: 'single' });
    expect(tree.merges.map((m) => [m.left, m.right, m.height])).toEqual([
      [0, 1, 1],
      [2, 4, 1],
      [3, 5, 1],
    ]);
    expect(agglomerate(square, { method: 'single' }).merges).toEqual(tree.merges);
    // With tied heights, cut({ k }) still gives exactly k segments, undoing the last merges first.
    expect(Array.from(tree.cut({ k: 2 }))).toEqual([0, 0, 0, 1]);
    expect(Array.from(tree.cut({ k: 3 }))).toEqual([0, 0, 1, 2]);
  });
});

describe('routes agree', () => {
  const r = createRandom(11);
  const rows = Array.from({ length: 40 }, () => [r.normal(), r.normal(), r.normal()]);

  it('rows and their Euclidean dissimilarity give the same tree, every method', () => {
    const d = dissimilarity(rows);
    for (const method of LINKAGE_METHODS) {
      const a = agglomerate(rows, { method });
      const b = agglomerate(d, { method });
      expect(
        a.merges.map((m) => [m.left, m.right, m.size]),
        method,
      ).toEqual(b.merges.map((m) => [m.left, m.right, m.size]));
      a.merges.forEach((m, i) => expect(m.height).toBeCloseTo(b.merges[i].height, 10));
    }
  });

  it('Ward, centroid and median from 400 clustered rows (vector routes, early abandoning) equal the matrix routes', () => {
    const g = createRandom(404);
    const centres = Array.from({ length: 6 }, () => Array.from({ length: 5 }, () => g.uniform(-6, 6)));
    const many = Array.from({ length: 400 }, () => centres[g.int(6)].map((c) => c + g.normal()));
    const d = dissimilarity(many);
    for (const method of ['ward', 'centroid', 'median'] as const) {
      const a = agglomerate(many, { method });
      const b = agglomerate(d, { method });
      expect(
        a.merges.map((m) => [m.left, m.right]),
        method,
      ).toEqual(b.merges.map((m) => [m.left, m.right]));
      a.merges.forEach((m, i) => expect(Math.abs(m.height - b.merges[i].height)).toBeLessThanOrEqual(1e-9 * Math.max(1, m.height)));
    }
  });

  it('another metric from rows (manhattan, minkowski p = 3) equals the tree of that dissimilarity', () => {
    for (const [metric, p] of [
      ['manhattan', undefined],
      ['minkowski', 3],
    ] as const) {
      const d = dissimilarity(rows, { metric, p });
      for (const method of ['single', 'complete', 'average', 'weighted'] as const) {
        const a = agglomerate(rows, { method, metric, p });
        const b = agglomerate(d, { method });
        expect(a.metric).toBe(metric);
        expect(a.merges).toEqual(b.merges);
        expect(a.copheneticCorrelation()).toBeCloseTo(b.copheneticCorrelation(), 12);
      }
    }
  });

  it('keeps row labels from a Dissimilarity and reports the cophenetic matrix with them', () => {
    const labels = rows.map((_, i) => `s${i}`);
    const d = dissimilarity(rows);
    const labelled = { ...d, labels };
    const tree = agglomerate(labelled, { method: 'average' });
    expect(tree.labels).toEqual(labels);
    expect(tree.cophenetic().labels).toEqual(labels);
  });
});
