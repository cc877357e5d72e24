import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { condensedIndex, crossDistances, dissimilarity, distanceFunction, ROW_METRICS, TRUE_METRICS } from '../../src/measure';
import type { MetricName } from '../../src/measure';

// Rows of small integers-and-fractions so duplicates and ties occur often.
const rowsArb = (minRows: number) =>
  fc.integer({ min: 1, max: 5 }).chain((d) =>
    fc.array(
      fc.array(
        fc.integer({ min: -20, max: 20 }).map((v) => v / 4),
        { minLength: d, maxLength: d },
      ),
      {
        minLength: minRows,
        maxLength: 14,
      },
    ),
  );

const exponentOf = (metric: string) => (metric === 'minkowski' ? 3 : undefined);

/** Cosine and correlation refuse zero / constant rows; keep them out of generic properties. */
function usable(rows: number[][], metric: string): boolean {
  if (metric === 'cosine') return rows.every((r) => r.some((v) => v !== 0));
  if (metric === 'correlation') return rows.every((r) => r.some((v) => v !== r[0]));
  return true;
}

describe('dissimilarity properties (fast-check)', () => {
  for (const metric of ROW_METRICS) {
    it(`${metric}: condensed layout is pairs i<j row-major, get is symmetric, the diagonal is 0`, () => {
      fc.assert(
        fc.property(rowsArb(2), (rows) => {
          fc.pre(usable(rows, metric));
          const d = dissimilarity(rows, { metric, p: exponentOf(metric) });
          const kernel = distanceFunction(metric, exponentOf(metric));
          const flat = Float64Array.from(rows.flat());
          const dims = rows[0].length;
          let k = 0;
          for (let i = 0; i < rows.length; i++) {
            expect(d.get(i, i)).toBe(0);
            for (let j = i + 1; j < rows.length; j++) {
              expect(condensedIndex(rows.length, i, j)).toBe(k);
              expect(condensedIndex(rows.length, j, i)).toBe(k);
              expect(d.get(i, j)).toBe(d.get(j, i));
              const direct = kernel(flat, i * dims, flat, j * dims, dims);
              expect(Math.abs(d.condensed[k] - direct)).toBeLessThanOrEqual(1e-12 * Math.max(1, direct));
              k++;
            }
          }
          expect(k).toBe(d.condensed.length);
        }),
        { numRuns: 60 },
      );
    });
  }

  for (const metric of TRUE_METRICS) {
    it(`${metric}: triangle inequality d(i,k) ≤ d(i,j) + d(j,k)`, () => {
      fc.assert(
        fc.property(rowsArb(3), (rows) => {
          const d = dissimilarity(rows, { metric: metric as MetricName, p: exponentOf(metric) });
          const n = rows.length;
          for (let i = 0; i < n; i++)
            for (let j = 0; j < n; j++)
              for (let k = 0; k < n; k++) {
                if (d.get(i, k) > d.get(i, j) + d.get(j, k) + 1e-12) {
                  throw new Error(`d(${i},${k}) = ${d.get(i, k)} > d(${i},${j}) + d(${j},${k}) = ${d.get(i, j) + d.get(j, k)}`);
                }
              }
        }),
        { numRuns: 40 },
      );
    });
  }

  it('the euclidean fast path agrees with the generic kernel for odd and even row counts', () => {
    fc.assert(
      fc.property(rowsArb(2), (rows) => {
        const fast = dissimilarity(rows).condensed;
        const viaMinkowski = dissimilarity(rows, { metric: 'minkowski', p: 2.0000001 }).condensed;
        const weighted = dissimilarity(rows, { metric: 'euclidean', weights: rows[0].map(() => 1) }).condensed;
        for (let k = 0; k < fast.length; k++) {
          expect(fast[k]).toBeCloseTo(weighted[k], 12);
          expect(Math.abs(fast[k] - viaMinkowski[k])).toBeLessThan(1e-5 * Math.max(1, fast[k]));
        }
      }),
      { numRuns: 60 },
    );
  });

  it('crossDistances(rows, rows) holds the same values as the condensed matrix', () => {
    fc.assert(
      fc.property(rowsArb(2), fc.constantFrom(...ROW_METRICS), (rows, metric) => {
        fc.pre(usable(rows, metric));
        const d = dissimilarity(rows, { metric, p: exponentOf(metric) });
        const cross = crossDistances(rows, rows, metric, { p: exponentOf(metric) });
        const n = rows.length;
        for (let i = 0; i < n; i++)
          for (let j = 0; j < n; j++) {
            if (i === j) continue;
            expect(Math.abs(cross[i * n + j] - d.get(i, j))).toBeLessThanOrEqual(1e-12);
          }
      }),
      { numRuns: 40 },
    );
  });
});
