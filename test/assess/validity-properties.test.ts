// Properties of the validity measures (fast-check) and the errors for bad input.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { adjustedRandIndex, calinskiHarabasz, daviesBouldin, normalizedMutualInfo, silhouette } from '../../src/assess';
import { fromCondensed } from '../../src/measure/condensed';

const labelled = fc
  .integer({ min: 3, max: 40 })
  .chain((n) =>
    fc.record({
      rows: fc.array(
        fc.array(
          fc.integer({ min: -10000, max: 10000 }).map((v) => v / 100),
          { minLength: 2, maxLength: 2 },
        ),
        {
          minLength: n,
          maxLength: n,
        },
      ),
      labels: fc.array(fc.integer({ min: 0, max: 3 }), { minLength: n, maxLength: n }),
    }),
  )
  .filter((c) => new Set(c.labels).size >= 2);

const labelPair = fc
  .integer({ min: 1, max: 60 })
  .chain((n) =>
    fc.tuple(
      fc.array(fc.integer({ min: -3, max: 5 }), { minLength: n, maxLength: n }),
      fc.array(fc.integer({ min: 0, max: 7 }), { minLength: n, maxLength: n }),
    ),
  );

describe('silhouette properties', () => {
  it('every value lies in [-1, 1] and the average is their mean (Rousseeuw 1987 definition)', () => {
    fc.assert(
      fc.property(labelled, ({ rows, labels }) => {
        const s = silhouette(rows, labels);
        let total = 0;
        for (const v of s.values) {
          expect(v).toBeGreaterThanOrEqual(-1 - 1e-12);
          expect(v).toBeLessThanOrEqual(1 + 1e-12);
          total += v;
        }
        expect(s.average).toBeCloseTo(total / rows.length, 10);
      }),
      { numRuns: 150 },
    );
  });

  it('from rows equals from the condensed Euclidean dissimilarity of the same rows', () => {
    fc.assert(
      fc.property(labelled, ({ rows, labels }) => {
        const n = rows.length;
        const condensed: number[] = [];
        for (let i = 0; i < n; i++)
          for (let j = i + 1; j < n; j++) condensed.push(Math.hypot(rows[i][0] - rows[j][0], rows[i][1] - rows[j][1]));
        const fromRows = silhouette(rows, labels);
        const fromDiss = silhouette(fromCondensed(condensed), labels);
        for (let i = 0; i < n; i++) expect(fromDiss.values[i]).toBeCloseTo(fromRows.values[i], 9);
      }),
      { numRuns: 100 },
    );
  });

  it('the tiled stream agrees with a direct double loop on more rows than one tile', () => {
    const n = 700;
    const rows = Array.from({ length: n }, (_, i) => [Math.sin(i * 1.3) * 5, Math.cos(i * 0.7) * 3, (i % 11) / 2]);
    const labels = rows.map((_, i) => i % 5);
    const s = silhouette(rows, labels, { metric: 'sqeuclidean' });
    for (const i of [0, 63, 64, 255, 256, 257, 699]) {
      const sums = [0, 0, 0, 0, 0];
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        sums[labels[j]] += rows[i].reduce((acc, v, c) => acc + (v - rows[j][c]) ** 2, 0);
      }
      const sizes = [140, 140, 140, 140, 140];
      const a = sums[labels[i]] / (sizes[labels[i]] - 1);
      const b = Math.min(...sums.map((t, c) => (c === labels[i] ? Infinity : t / sizes[c])));
      expect(s.values[i]).toBeCloseTo((b - a) / Math.max(a, b), 10);
    }
  });
});

describe('agreement properties', () => {
  it('ARI(a, a) = 1 and ARI is unchanged by relabelling either side (Hubert & Arabie 1985)', () => {
    fc.assert(
      fc.property(labelPair, fc.integer({ min: 1, max: 9 }), fc.integer({ min: -50, max: 50 }), ([a, b], scale, shift) => {
        expect(adjustedRandIndex(a, a)).toBeCloseTo(1, 12);
        const relabel = a.map((v) => v * scale + shift);
        expect(adjustedRandIndex(relabel, b)).toBeCloseTo(adjustedRandIndex(a, b), 12);
        expect(adjustedRandIndex(b, a)).toBeCloseTo(adjustedRandIndex(a, b), 12);
      }),
    );
  });

  it('NMI lies in [0, 1] for every average, and NMI(a, a) = 1', () => {
    fc.assert(
      fc.property(labelPair, ([a, b]) => {
        for (const average of ['arithmetic', 'geometric', 'min', 'max'] as const) {
          const v = normalizedMutualInfo(a, b, { average });
          expect(v).toBeGreaterThanOrEqual(0);
          expect(v).toBeLessThanOrEqual(1);
          expect(normalizedMutualInfo(a, a, { average })).toBeCloseTo(1, 12);
        }
      }),
    );
  });
});

describe('bad input', () => {
  const rows = [[0], [1], [5], [6]];
  it('a single segment is refused where two are needed, saying so', () => {
    expect(() => silhouette(rows, [0, 0, 0, 0])).toThrow(/at least 2 segments.*has 1/);
    expect(() => calinskiHarabasz(rows, [1, 1, 1, 1])).toThrow(/at least 2 segments/);
    expect(() => daviesBouldin(rows, [2, 2, 2, 2])).toThrow(/at least 2 segments/);
  });
  it('as many segments as rows is refused by Calinski–Harabasz and Davies–Bouldin', () => {
    expect(() => calinskiHarabasz(rows, [0, 1, 2, 3])).toThrow(/fewer segments than rows.*4 rows into 4 segments/);
    expect(() => daviesBouldin(rows, [0, 1, 2, 3])).toThrow(/fewer segments than rows/);
  });
  it('assignments of the wrong length are refused with both lengths named', () => {
    expect(() => silhouette(rows, [0, 1, 1])).toThrow(/3 entries but the rows have 4/);
    expect(() => adjustedRandIndex([0, 1, 1], [0, 1])).toThrow(/2 entries but the first assignment has 3/);
    expect(() => normalizedMutualInfo([0, 1], [0, 1, 0])).toThrow(/3 entries/);
  });
  it('non-integer labels, unknown options and unknown averages are refused', () => {
    expect(() => silhouette(rows, [0, 1, 1.5, 0])).toThrow(/entry 3 is 1.5/);
    expect(() => silhouette(rows, [0, 1, 1, 0], { metirc: 'euclidean' } as never)).toThrow(/Did you mean "metric"/);
    expect(() => silhouette(rows, [0, 1, 1, 0], { metric: 'cosine' } as never)).toThrow(/Valid silhouette metrics: euclidean/);
    expect(() => normalizedMutualInfo([0, 1], [0, 1], { average: 'geometrc' } as never)).toThrow(/Did you mean "geometric"/);
  });
  it('a metric with a dissimilarity is refused (the dissimilarity already fixes it)', () => {
    expect(() => silhouette(fromCondensed([1, 2, 3]), [0, 1, 1], { metric: 'manhattan' })).toThrow(/applies to rows only/);
  });
});
