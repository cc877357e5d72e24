// Settling k-means to a fixed point of the nearest-centre rule, checked against scikit-learn:
// KMeans(algorithm='lloyd', tol=0) from the same starting centres stops when no label changes
// (fixture and its script: test/reference/settle_sklearn.py, scikit-learn 1.2.1).
import { readFileSync } from 'fs';
import { join } from 'path';
import { describe, expect, it } from 'vitest';
import { adjustedRandIndex, kmeans, toMatrix, type Matrix } from '../../src';
import { ruleAgreement, settleKmeans } from '../../src/internal';
import { nearestCenters } from '../../src/segments/assign-nearest';

/** Each row to its nearest of `centers` (ties to the lower index), as the first Lloyd step does. */
function nearestCentersForTest(m: Matrix, centers: number[][]): Int32Array {
  return nearestCenters(m.data, m.rows, Float64Array.from(centers.flat()), centers.length, m.cols, 'euclidean').segment;
}

const source = JSON.parse(readFileSync(join(__dirname, '../reference/fixtures/kmeans_sklearn.json'), 'utf8'));
const fixture = JSON.parse(readFileSync(join(__dirname, '../reference/fixtures/settle_sklearn.json'), 'utf8'));

describe('settleKmeans', () => {
  for (const c of fixture.cases as { name: string; k: number; labels: number[]; inertia: number }[]) {
    it(`ends on scikit-learn's Lloyd labels from the same start: ${c.name}, k = ${c.k}`, () => {
      const rows: number[][] = source.cases.find((s: { name: string }) => s.name === c.name).rows;
      const m = toMatrix(rows);
      const start = nearestCentersForTest(m, rows.slice(0, c.k));
      const settled = settleKmeans(m, start, c.k);
      expect(settled.fixedPoint).toBe(true);
      expect(Array.from(settled.assignment)).toEqual(c.labels);
      const agreement = ruleAgreement(m, settled.assignment, settled.centers, 'euclidean', 'nearest-center');
      expect(agreement.reproduced).toBe(rows.length);
      let ss = 0;
      rows.forEach((r, i) => r.forEach((v, j) => (ss += (v - settled.centers[settled.assignment[i]][j]) ** 2)));
      expect(ss).toBeCloseTo(c.inertia, 6);
    });
  }

  it('a fit stopped after one iteration is moved to a fixed point, and a converged one is left alone', () => {
    const rows: number[][] = source.cases[0].rows;
    const m = toMatrix(rows);
    // refine: false, so the single-row transfers do not finish the fit on their own: the test needs an early stop.
    const early = kmeans(m, { k: 8, seed: 4, restarts: 1, maxIterations: 1, refine: false });
    const settled = settleKmeans(m, early.assignment, 8);
    expect(settled.fixedPoint).toBe(true);
    expect(settled.moved).toBeGreaterThan(0);
    expect(ruleAgreement(m, settled.assignment, settled.centers, 'euclidean', 'nearest-center').reproduced).toBe(rows.length);
    const full = kmeans(m, { k: 8, seed: 4, restarts: 1 });
    const again = settleKmeans(m, full.assignment, 8);
    expect(again.moved).toBe(0);
    expect(adjustedRandIndex(again.assignment, full.assignment)).toBe(1);
  });
});
