import { describe, expect, it } from 'vitest';
import { kmeans, kmeansMiniBatch } from '../../../src/methods/partition';
import { blobs, readFixture, samePartition, squaredDistance } from './partition-helpers';

const iris = readFixture('kmeans_iris.json');

describe('kmeansMiniBatch', () => {
  it('Fisher iris (1936), k = 3: within 2 % of the R stats::kmeans optimum (fixture kmeans_iris.json)', () => {
    const fit = kmeansMiniBatch(iris.rows, { k: 3, batchSize: 50, seed: 1, maxIterations: 200 });
    expect(fit.variant).toBe('mini-batch');
    expect(fit.withinSS).toBeLessThan(iris.k3.withinSS * 1.02);
    expect(fit.withinSS).toBeGreaterThanOrEqual(iris.k3.withinSS * (1 - 1e-9));
  });

  it('well-separated blobs of our own making: same partition as full k-means', () => {
    const rows = blobs(3000, 4, 5, 21, 0.3);
    const full = kmeans(rows, { k: 5, seed: 1 });
    const mini = kmeansMiniBatch(rows, { k: 5, seed: 1, batchSize: 256 });
    expect(samePartition(full.assignment, mini.assignment)).toBe(true);
  });

  it('final assignment is nearest-centre on all rows before the centres become the means; figures exact', () => {
    const rows = blobs(2000, 3, 4, 5, 2);
    const fit = kmeansMiniBatch(rows, { k: 4, seed: 3, batchSize: 128 });
    let within = 0;
    rows.forEach((r, i) => (within += squaredDistance(r, fit.centers[fit.assignment[i]])));
    expect(fit.withinSS).toBeCloseTo(within, 6);
    expect(fit.withinSS + fit.betweenSS).toBeCloseTo(fit.totalSS, 4);
    expect(fit.sizes.reduce((a, b) => a + b, 0)).toBe(2000);
    expect(fit.restartsRun).toBe(3);
  });

  it('the same seed gives the same result', () => {
    const rows = blobs(1500, 3, 6, 9, 1.5);
    const a = kmeansMiniBatch(rows, { k: 6, seed: 4, batchSize: 100 });
    const b = kmeansMiniBatch(rows, { k: 6, seed: 4, batchSize: 100 });
    expect(Array.from(a.assignment)).toEqual(Array.from(b.assignment));
    expect(a.centers).toEqual(b.centers);
  });

  it('refuses bad options with a suggestion', () => {
    expect(() => kmeansMiniBatch(iris.rows, { k: 3, batchSise: 10 } as any)).toThrow(/Did you mean "batchSize"/);
    expect(() => kmeansMiniBatch(iris.rows, { k: 3, batchSize: 0 })).toThrow(/batchSize/);
    expect(() => kmeansMiniBatch(iris.rows, { k: 0 })).toThrow(/k must be/);
  });
});
