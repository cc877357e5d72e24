import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { kmedoids } from '../../../src/methods/partition';
import { fromCondensed } from '../../../src/measure/condensed';
import { dissimilarity } from '../../../src/measure/dissimilarity';
import { KinsortError } from '../../../src/core/errors';
import { readFixture, samePartition } from './partition-helpers';

// Fixture pam_ruspini.json from test/reference/pam_ruspini.R: R cluster::pam (BUILD + SWAP).
const fixture = readFixture('pam_ruspini.json');
const sorted = (v: number[]) => [...v].sort((a, b) => a - b);
const toRows = (v: number[]) => v.map((r) => r - 1); // R rows are 1-based

function checkAgainstR(fit: ReturnType<typeof kmedoids>, r: any, n: number) {
  expect(fit.medoids).toEqual(sorted(toRows(r.medoidRows)));
  expect(fit.cost).toBeCloseTo(r.totalSwap, 9);
  expect(fit.cost / n).toBeCloseTo(r.objectiveSwap, 11);
  expect(fit.buildCost).toBeCloseTo(r.totalBuild, 9);
  expect(samePartition(fit.assignment, r.clustering)).toBe(true);
}

describe('kmedoids against R cluster::pam', () => {
  const rows = fixture.ruspini.rows;
  for (const r of fixture.ruspini.fits) {
    it(`Ruspini (1970), Euclidean, k = ${r.k}: medoids, BUILD and SWAP objective, partition`, () => {
      checkAgainstR(kmedoids(rows, { k: r.k }), r, rows.length);
    });
  }
  for (const r of fixture.flowerGower.fits) {
    it(`flower data (Struyf, Hubert & Rousseeuw 1997), Gower from cluster::daisy, k = ${r.k}`, () => {
      const diss = fromCondensed(fixture.flowerGower.condensed, { metric: 'gower' });
      checkAgainstR(kmedoids(diss, { k: r.k }), r, diss.size);
    });
  }
  for (const r of fixture.tiedGrid.fits) {
    it(`data of our own making with many ties (integer grid, Manhattan), k = ${r.k}: R's tie rules`, () => {
      const diss = fromCondensed(fixture.tiedGrid.condensed);
      checkAgainstR(kmedoids(diss, { k: r.k }), r, diss.size);
      const fromRows = kmedoids(fixture.tiedGrid.rows, { k: r.k, metric: 'manhattan' });
      expect(fromRows.medoids).toEqual(sorted(toRows(r.medoidRows)));
    });
  }
});

// Fixture pam_gower_ties.json from test/reference/pam_gower_ties.R: R cluster::daisy (Gower) and
// cluster::pam with and without SWAP on tie-heavy data of our own making. Before BUILD summed and
// compared its gains as R does, 4 of these 48 fits started from other medoids than R's.
describe('kmedoids BUILD tie rule against R cluster::pam on tie-heavy Gower data', () => {
  const ties = readFixture('pam_gower_ties.json');
  for (const c of ties.cases) {
    it(`seed ${c.seed}, ${c.n} rows, k = 2..5: BUILD medoids, final medoids and costs as R's`, () => {
      const diss = fromCondensed(c.condensed, { metric: 'gower' });
      for (const r of c.fits) {
        const built = kmedoids(diss, { k: r.k, maxSwaps: 0 });
        expect(built.medoids).toEqual(sorted(toRows(r.buildMedoidRows)));
        expect(built.buildCost).toBeCloseTo(r.totalBuild, 9);
        const fit = kmedoids(diss, { k: r.k });
        expect(fit.medoids).toEqual(sorted(toRows(r.medoidRows)));
        expect(fit.cost).toBeCloseTo(r.totalSwap, 9);
      }
    });
  }
});

describe('kmedoids result and properties', () => {
  const rows = fixture.ruspini.rows as number[][];
  it('has the documented shape', () => {
    const fit = kmedoids(rows, { k: 3 });
    expect(fit.kind).toBe('kmedoids');
    expect(fit.assignment).toBeInstanceOf(Int32Array);
    expect(fit.sizes.reduce((a, b) => a + b, 0)).toBe(rows.length);
    fit.medoids.forEach((m, c) => expect(fit.assignment[m]).toBe(c));
    expect(fit.metric).toBe('euclidean');
  });

  it('SWAP ends at a local optimum: no single exchange lowers the cost (brute force), and cost = Σ nearest medoid', () => {
    const table = fc.array(fc.tuple(fc.integer({ min: 0, max: 9 }), fc.integer({ min: 0, max: 9 })), { minLength: 5, maxLength: 25 });
    fc.assert(
      fc.property(table, fc.integer({ min: 1, max: 4 }), (pts, kWanted) => {
        const data = pts.map(([a, b]) => [a, b]);
        const distinct = new Set(pts.map((p) => p.join(','))).size;
        const k = Math.min(kWanted, distinct);
        const fit = kmedoids(data, { k });
        const diss = dissimilarity(data, { metric: 'euclidean' });
        const costOf = (meds: number[]) => data.reduce((s, _, i) => s + Math.min(...meds.map((m) => diss.get(i, m))), 0);
        expect(fit.cost).toBeCloseTo(costOf(fit.medoids), 9);
        expect(fit.cost).toBeLessThanOrEqual(fit.buildCost + 1e-9);
        for (let slot = 0; slot < k; slot++) {
          for (let c = 0; c < data.length; c++) {
            if (fit.medoids.includes(c)) continue;
            const trial = fit.medoids.slice();
            trial[slot] = c;
            expect(costOf(trial)).toBeGreaterThanOrEqual(fit.cost - 1e-9);
          }
        }
      }),
      { numRuns: 80 },
    );
  });

  it('refuses bad k and a metric that contradicts a given dissimilarity', () => {
    const diss = fromCondensed([1, 2, 3]);
    expect(() => kmedoids(diss, { k: 4 })).toThrow(/from 1 to 3/);
    expect(() => kmedoids(rows, { k: 0 })).toThrow(KinsortError);
    expect(() =>
      kmedoids(
        [
          [1, 1],
          [1, 1],
          [2, 2],
        ],
        { k: 3 },
      ),
    ).toThrow(/only 2 distinct/);
    expect(() => kmedoids(diss, { k: 2, metric: 'manhattan' })).toThrow(/leave metric out/);
    expect(() => kmedoids(rows, { k: 2, swaps: 3 } as any)).toThrow(/unknown option/);
  });
});
