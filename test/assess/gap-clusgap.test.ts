// Gap statistic against R cluster::clusGap 2.1.4 (fixture by test/reference/gap_clusgap.R:
// kmeans, K.max = 8, B = 100, nstart = 10, spaceH0 = "scaledPCA", d.power = 2) on blobs and
// uniform noise of our own making and on Ruspini's data (1970, as R's cluster ships it).
// Reference draws differ between R and us, so gaps are compared within clusGap's standard errors.
import { beforeAll, describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/gap_clusgap.json';
import { gapStatistic, type GapStatisticResult } from '../../src/assess';
import { principalBox } from '../../src/assess/principal-box';
import { createMatrix } from '../../src/core/matrix';
import { createRandom } from '../../src/random';

const cases = Object.entries(fixture.gap).map(([name, ref]) => ({ name, ref }));

describe.each(cases)('R cluster::clusGap, Tibs2001SEmax: $name', ({ ref }) => {
  let ours: GapStatisticResult;
  beforeAll(() => {
    ours = gapStatistic(ref.rows, { kFrom: 1, kTo: 8, references: 50, seed: 3, restarts: 10 });
  });

  it('recommends the same k as maxSE(method = "Tibs2001SEmax")', () => {
    expect(ours.recommended).toBe(ref.recommended);
  });

  // clusGap's W sums each pair once, the paper's both orders: our log W = clusGap logW + log 2.
  it('log W of the data equals clusGap logW + log 2 for k ≤ 5; for larger k the k-means optima may differ a little', () => {
    for (let t = 0; t < 8; t++) {
      const difference = ours.table[t].logW - (ref.logW[t] + Math.log(2));
      if (ref.k[t] <= 5) expect(Math.abs(difference)).toBeLessThan(1e-2);
      // never a much worse k-means fit than R's stats::kmeans (Hartigan–Wong, nstart = 10); on
      // uniform noise at k = 8 our Lloyd-type fit was 2.5% worse in within-SS when this was written
      expect(difference).toBeLessThan(3e-2);
    }
    // k = 1 (total SS) and k = 2 have one clear optimum in all three data sets: equal to rounding.
    for (let t = 0; t < 2; t++) expect(ours.table[t].logW).toBeCloseTo(ref.logW[t] + Math.log(2), 9);
  });

  it("expected log W of the reference sets lies within clusGap's standard error of E.logW (+ log 2)", () => {
    for (let t = 0; t < 8; t++) {
      expect(ours.table[t].k).toBe(ref.k[t]);
      expect(Math.abs(ours.table[t].expectedLogW - (ref.expectedLogW[t] + Math.log(2)))).toBeLessThanOrEqual(ref.se[t]);
    }
  });

  it("gaps lie within clusGap's standard errors wherever both found the same k-means fit of the data; SEs of the same size", () => {
    let compared = 0;
    for (let t = 0; t < 8; t++) {
      const sameFit = Math.abs(ours.table[t].logW - (ref.logW[t] + Math.log(2))) < 1e-3;
      if (sameFit) {
        compared++;
        expect(Math.abs(ours.table[t].gap - ref.gap[t])).toBeLessThanOrEqual(ref.se[t]);
      }
      expect(ours.table[t].se / ref.se[t]).toBeGreaterThan(0.6);
      expect(ours.table[t].se / ref.se[t]).toBeLessThan(1.6);
    }
    expect(compared).toBeGreaterThanOrEqual(5);
  });
});

describe('gapStatistic mechanics', () => {
  const rows = fixture.gap.ruspini.rows;
  it('is deterministic with the seed and changes with it', () => {
    const a = gapStatistic(rows, { kTo: 3, references: 5, seed: 9, restarts: 2 });
    const b = gapStatistic(rows, { kTo: 3, references: 5, seed: 9, restarts: 2 });
    const c = gapStatistic(rows, { kTo: 3, references: 5, seed: 10, restarts: 2 });
    expect(a.table).toEqual(b.table);
    expect(a.table[1].expectedLogW).not.toBe(c.table[1].expectedLogW);
  });
  it('reports progress once per reference set', () => {
    const events: number[] = [];
    gapStatistic(rows, { kTo: 2, references: 4, restarts: 1, onProgress: (e) => events.push(e.done) });
    expect(events).toEqual([1, 2, 3, 4]);
  });
  it('refuses a missing kTo, kTo above the rows, and misspelt options', () => {
    expect(() => gapStatistic(rows, {} as never)).toThrow(/kTo .* is required/);
    expect(() => gapStatistic(rows, { kTo: 100 })).toThrow(/kTo must be a whole number from 1 to 75; got 100/);
    expect(() => gapStatistic(rows, { kTo: 3, refrences: 5 } as never)).toThrow(/Did you mean "references"/);
  });
  it('principal axes diagonalise the cross-product matrix (Jacobi) and the box holds the rotated rows', () => {
    const r = createRandom(1);
    const d = 4;
    const data = new Float64Array(60 * d).map((_, i) => r.normal() * (1 + (i % d)) + (i % d === 1 ? r.normal() : 0));
    const m = createMatrix(60, d, data);
    const box = principalBox(m);
    // The axes are the eigenvectors of the centred cross-product matrix.
    const a = new Float64Array(d * d);
    for (let i = 0; i < 60; i++)
      for (let p = 0; p < d; p++)
        for (let q = 0; q < d; q++) a[p * d + q] += ((data[i * d + p] - box.mean[p]) * (data[i * d + q] - box.mean[q])) / 60;
    const v = box.axes;
    // Vᵀ A V is diagonal and V is orthonormal.
    for (let p = 0; p < 4; p++) {
      for (let q = 0; q < 4; q++) {
        let vav = 0;
        let vv = 0;
        for (let i = 0; i < 4; i++) {
          vv += v[i * 4 + p] * v[i * 4 + q];
          for (let j = 0; j < 4; j++) vav += v[i * 4 + p] * a[i * 4 + j] * v[j * 4 + q];
        }
        expect(vv).toBeCloseTo(p === q ? 1 : 0, 12);
        if (p !== q) expect(vav).toBeCloseTo(0, 10);
      }
    }
    for (let c = 0; c < d; c++) expect(box.high[c]).toBeGreaterThan(box.low[c]);
  });
});
