import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { kmeans } from '../../../src/methods/partition';
import { squaredDistance } from './partition-helpers';

// Property checks of Lloyd's algorithm itself (no outside tool): the fixed point, the monotone
// objective, seeded reproducibility and independence of row order.

/** Small tables on a 0.25 grid so distinct rows are common but ties and duplicates happen too. */
const table = fc.tuple(fc.integer({ min: 1, max: 4 }), fc.integer({ min: 6, max: 60 })).chain(([d, n]) =>
  fc.array(
    fc.array(
      fc.integer({ min: -40, max: 40 }).map((v) => v / 4),
      { minLength: d, maxLength: d },
    ),
    {
      minLength: n,
      maxLength: n,
    },
  ),
);

function distinctCount(rows: number[][]): number {
  return new Set(rows.map((r) => r.join(','))).size;
}

describe('kmeans properties (fast-check)', () => {
  it('every row ends at its nearest reported centre, whatever the tolerance (the final exact scan)', () => {
    fc.assert(
      fc.property(table, fc.integer({ min: 1, max: 5 }), fc.integer(), fc.constantFrom(0, 1e-4, 1e-1), (rows, kWanted, seed, tolerance) => {
        const k = Math.min(kWanted, distinctCount(rows));
        const fit = kmeans(rows, { k, seed, restarts: 2, tolerance, maxIterations: 1000 });
        expect(fit.converged).toBe(true);
        rows.forEach((row, i) => {
          const own = squaredDistance(row, fit.centers[fit.assignment[i]]);
          for (const c of fit.centers) expect(own).toBeLessThanOrEqual(squaredDistance(row, c) * (1 + 1e-12) + 1e-12);
        });
      }),
      { numRuns: 150 },
    );
  });

  it('within-SS never rises between Lloyd iterations', () => {
    fc.assert(
      fc.property(
        table,
        fc.integer({ min: 1, max: 6 }),
        fc.integer(),
        fc.constantFrom('k-means++', 'random') as fc.Arbitrary<'k-means++' | 'random'>,
        (rows, kWanted, seed, start) => {
          const k = Math.min(kWanted, distinctCount(rows));
          const fit = kmeans(rows, { k, seed, restarts: 1, tolerance: 0, start, trace: true });
          const t = fit.withinSSTrace!;
          expect(t.length).toBe(fit.iterations);
          for (let i = 1; i < t.length; i++) expect(t[i]).toBeLessThanOrEqual(t[i - 1] * (1 + 1e-12) + 1e-12);
          expect(fit.withinSS).toBeLessThanOrEqual(t[t.length - 1] * (1 + 1e-12) + 1e-12);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('the same seed gives an identical result', () => {
    fc.assert(
      fc.property(table, fc.integer({ min: 1, max: 5 }), fc.integer(), (rows, kWanted, seed) => {
        const k = Math.min(kWanted, distinctCount(rows));
        const a = kmeans(rows, { k, seed, restarts: 3 });
        const b = kmeans(rows, { k, seed, restarts: 3 });
        expect(Array.from(a.assignment)).toEqual(Array.from(b.assignment));
        expect(a.centers).toEqual(b.centers);
        expect(a.restartWithinSS).toEqual(b.restartWithinSS);
      }),
      { numRuns: 60 },
    );
  });

  // Plain Lloyd (refine: false): single-row transfers take the rows in row order, so with them
  // the local optimum reached may depend on the order (as R's Hartigan–Wong does).
  it('permuting the rows, with fixed given centres, permutes the partition (plain Lloyd)', () => {
    fc.assert(
      fc.property(
        table.chain((rows) =>
          fc.tuple(
            fc.constant(rows),
            fc.shuffledSubarray(
              rows.map((_, i) => i),
              { minLength: rows.length },
            ),
          ),
        ),
        fc.integer({ min: 1, max: 4 }),
        ([rows, order], kWanted) => {
          // Start from the first k distinct rows so the start does not depend on the order.
          const seen = new Set<string>();
          const start: number[][] = [];
          for (const r of rows) {
            const key = r.join(',');
            if (!seen.has(key) && start.length < kWanted) {
              seen.add(key);
              start.push(r);
            }
          }
          const k = start.length;
          const a = kmeans(rows, { k, start, tolerance: 0, refine: false });
          const b = kmeans(
            order.map((i) => rows[i]),
            { k, start, tolerance: 0, refine: false },
          );
          order.forEach((i, pos) => expect(b.assignment[pos]).toBe(a.assignment[i]));
        },
      ),
      { numRuns: 100 },
    );
  });
});
