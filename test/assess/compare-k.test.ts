// The k comparison: on data with clear structure (four blobs of our own making, Ruspini 1970 as R
// ships it) every criterion must point to 4 — the k R cluster::clusGap recommended on the same
// rows (fixture by test/reference/gap_clusgap.R) and the number of groups the data were made with.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/gap_clusgap.json';
import { calinskiHarabasz, compareK, daviesBouldin, silhouette } from '../../src/assess';
import { combine } from '../../src/assess/compare-k';

describe('compareK', () => {
  it.each([
    ['blobs of our own making', fixture.gap.blobs],
    ['Ruspini (1970)', fixture.gap.ruspini],
  ])('on %s every criterion and the recommendation agree with clusGap\'s k', (_name, ref) => {
    const r = compareK(ref.rows, { from: 2, to: 8, seed: 1 });
    expect(ref.recommended).toBe(4);
    expect(r.recommended).toBe(4);
    expect(r.byCriterion).toEqual({ silhouette: 4, calinskiHarabasz: 4, daviesBouldin: 4, gap: 4, knee: 4 });
    expect(r.reasons.some((s) => /Recommended: k = 4, the choice of 5 of 5 criteria/.test(s))).toBe(true);
    expect(r.table.map((row) => row.k)).toEqual([2, 3, 4, 5, 6, 7, 8]);
  });

  it('table columns are the measures of the k-means assignment at each k', () => {
    const rows = fixture.gap.ruspini.rows;
    const r = compareK(rows, { from: 2, to: 5, gap: false });
    r.table.forEach((row, t) => {
      expect(row.silhouette).toBe(silhouette(rows, r.assignments[t]).average);
      expect(row.calinskiHarabasz).toBe(calinskiHarabasz(rows, r.assignments[t]));
      expect(row.daviesBouldin).toBe(daviesBouldin(rows, r.assignments[t]));
      expect(row.gap).toBeUndefined();
    });
    expect(r.byCriterion.gap).toBeUndefined();
    // within-SS falls with k
    for (let t = 1; t < r.table.length; t++) expect(r.table[t].withinSS).toBeLessThan(r.table[t - 1].withinSS);
  });

  it('on uniform noise the gap statistic picks k = 1 and the reasons say the segments may be arbitrary', () => {
    const r = compareK(fixture.gap.noise.rows, { from: 2, to: 6, references: 30 });
    expect(fixture.gap.noise.recommended).toBe(1); // clusGap on the same rows
    expect(r.byCriterion.gap).toBe(1);
    expect(r.reasons.join(' ')).toMatch(/not clearly tighter.*arbitrary/);
  });

  it('reports progress up to its total, and samples rows for the silhouette when asked', () => {
    const events: { done: number; total: number }[] = [];
    const r = compareK(fixture.gap.blobs.rows, { from: 3, to: 5, references: 4, silhouetteRows: 120, onProgress: (e) => events.push(e) });
    expect(events.map((e) => e.done)).toEqual(events.map((_, i) => i + 1));
    expect(events[events.length - 1].done).toBe(events[0].total);
    expect(r.reasons[0]).toMatch(/seeded sample of 120 rows/);
    expect(r.recommended).toBe(4);
  });

  it('the vote: majority wins; ties go to the silhouette\'s choice, else to the smallest k', () => {
    expect(combine({ silhouette: 3, calinskiHarabasz: 5, daviesBouldin: 5, gap: 3, knee: 4 }).recommended).toBe(3);
    expect(combine({ silhouette: 2, calinskiHarabasz: 5, daviesBouldin: 5, gap: 3, knee: 3 }).recommended).toBe(3);
    expect(combine({ silhouette: 2, calinskiHarabasz: 6, daviesBouldin: 6, gap: 6 }).recommended).toBe(6);
  });

  it('refuses from < 2, a single k, too large a range and misspelt options', () => {
    const rows = fixture.gap.ruspini.rows;
    expect(() => compareK(rows, { from: 1 })).toThrow(/from must be a whole number from 2 to 74; got 1/);
    expect(() => compareK(rows, { from: 4, to: 4 })).toThrow(/leave a single k/);
    expect(() => compareK(rows, { to: 80 })).toThrow(/to must be a whole number from 2 to 74; got 80/);
    expect(() => compareK(rows, { refrences: 3 } as never)).toThrow(/Did you mean "references"/);
  });
});
