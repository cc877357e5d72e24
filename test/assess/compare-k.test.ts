// The k comparison: on data with clear structure (four blobs of our own making, Ruspini 1970 as R
// ships it) every criterion must point to 4 — the k R cluster::clusGap recommended on the same
// rows (fixture by test/reference/gap_clusgap.R) and the number of groups the data were made with.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/gap_clusgap.json';
import { calinskiHarabasz, compareK, daviesBouldin, silhouette } from '../../src/assess';
import { createRandom } from '../../src/random';
import { kmeans } from '../../src/methods/partition';
import { chooseK } from '../../src/assess/k-choice';

describe('compareK', () => {
  it.each([
    ['blobs of our own making', fixture.gap.blobs],
    ['Ruspini (1970)', fixture.gap.ruspini],
  ])("on %s every criterion and the recommendation agree with clusGap's k", (_name, ref) => {
    const r = compareK(ref.rows, { from: 2, to: 8, seed: 1 });
    expect(ref.recommended).toBe(4);
    expect(r.recommended).toBe(4);
    expect(r.byCriterion).toEqual({
      silhouette: 4,
      calinskiHarabasz: 4,
      daviesBouldin: 4,
      gap: 4,
      knee: 4,
      stability: 4,
      predictionStrength: 4,
    });
    expect(r.table.find((row) => row.k === 4)!.predictionStrength).toBeGreaterThan(0.95); // Tibshirani & Walther (2005): near 1 at the true k
    expect(r.headline).toBe("k = 4 recommended: every segment stable, the gap statistic's pick, where the within-SS also bends");
    expect(r.noStructure).toBe(false);
    // Four real groups: every one of the four segments comes back in the resamples (Hennig 2007).
    const four = r.table.find((row) => row.k === 4)!;
    expect(four.weakestStability).toBeGreaterThan(0.95);
    expect(four.stabilityBySegment).toHaveLength(4);
    expect(four.stability).toBeCloseTo(four.stabilityBySegment!.reduce((a, b) => a + b, 0) / 4, 12);
    expect(four.weakestStability).toBe(Math.min(...four.stabilityBySegment!));
    // Splitting a real group in two at k = 5 leaves a segment that does not come back.
    expect(r.table.find((row) => row.k === 5)!.weakestStability).toBeLessThan(0.75);
    expect(r.reasons.some((s) => /^Recommended: k = 4\./.test(s))).toBe(true);
    expect(r.reasons.some((s) => /criteria disagree/.test(s))).toBe(false);
    expect(r.table.map((row) => row.k)).toEqual([2, 3, 4, 5, 6, 7, 8]);
  });

  it('table columns are the measures of the k-means assignment at each k', () => {
    const rows = fixture.gap.ruspini.rows;
    const r = compareK(rows, { from: 2, to: 5, gap: false, stability: false });
    r.table.forEach((row, t) => {
      expect(row.silhouette).toBe(silhouette(rows, r.assignments[t]).average);
      expect(row.calinskiHarabasz).toBe(calinskiHarabasz(rows, r.assignments[t]));
      expect(row.daviesBouldin).toBe(daviesBouldin(rows, r.assignments[t]));
      expect(row.gap).toBeUndefined();
      expect(row.weakestStability).toBeUndefined();
    });
    expect(r.byCriterion.gap).toBeUndefined();
    // within-SS falls with k
    for (let t = 1; t < r.table.length; t++) expect(r.table[t].withinSS).toBeLessThan(r.table[t - 1].withinSS);
  });

  it('on uniform noise: no clustering structure, recommended 1, though a cut in two is reproducible', () => {
    const r = compareK(fixture.gap.noise.rows, { from: 2, to: 6, references: 30 });
    expect(fixture.gap.noise.recommended).toBe(1); // clusGap on the same rows
    expect(r.byCriterion.gap).toBe(1);
    expect(r.recommended).toBe(1);
    expect(r.noStructure).toBe(true);
    expect(r.headline).toMatch(/^No clustering structure/);
    expect(r.reasons.join(' ')).toMatch(/not clearly tighter.*arbitrary/);
    // Hennig (2007) warns that k-means cuts of homogeneous data can be stable: they are here.
    expect(r.table[0].weakestStability).toBeGreaterThan(0.75);
    expect(r.reasons.join(' ')).toMatch(/such cuts can be stable too/);
    // Prediction strength (Tibshirani & Walther 2005) does not mistake the cut for structure.
    expect(r.byCriterion.predictionStrength).toBeUndefined();
    expect(r.reasons.join(' ')).toMatch(/Prediction strength stays below 0.8 at every k/);
  });

  it('when the criteria disagree the reasons say which picks which and what each measures', () => {
    // Two far-apart pairs of groups (our own making): the cleanest split is in two, and each half
    // holds two real groups of its own. The silhouette and the gap statistic's one-SE rule take
    // the first level (2); the bend and stability also see the second (4). The rule follows the
    // gap among the stable k, and the reasons name both readings.
    const random = createRandom(11);
    const centres = [
      [0, 0],
      [0, 2.5],
      [30, 0],
      [30, 2.5],
    ];
    const rows = Array.from({ length: 240 }, (_, i) => centres[i % 4].map((c) => c + 0.6 * random.normal()));
    const r = compareK(rows, { from: 2, to: 6, seed: 3 });
    expect(r.byCriterion).toMatchObject({ silhouette: 2, gap: 2, knee: 4, stability: 4 });
    expect(r.recommended).toBe(2);
    const said = r.reasons.join(' ');
    expect(said).toMatch(
      /The criteria disagree: k = 2 by [^;]*the gap statistic \(how much tighter the segments are than in structureless reference data\)/,
    );
    expect(said).toMatch(
      /k = 4 by stability \(whether the segments come back when the rows are resampled\), prediction strength \([^)]*\), the within-SS bend/,
    );
  });

  it('on many rows: gap and stability on a seeded sample, restarts on a sample finished on all rows, same answer', () => {
    // 24,000 rows of four blobs of our own making (above the 20,000 where restarts move to a sample).
    const random = createRandom(5);
    const centres = [
      [0, 0],
      [6, 0],
      [0, 6],
      [6, 6],
    ];
    const rows = Array.from({ length: 24_000 }, (_, i) => centres[i % 4].map((c) => c + random.normal()));
    const r = compareK(rows, { from: 2, to: 6, seed: 2, sampleRows: 1_000, silhouetteRows: 1_000, references: 10, resamples: 10 });
    expect(r.recommended).toBe(4);
    expect(r.sampleRows).toBe(1_000);
    expect(r.reasons.join(' ')).toMatch(/10 bootstrap resamples on a seeded sample of 1000 rows/);
    expect(r.reasons.join(' ')).toMatch(/10 reference sets on a seeded sample of 1000 rows/);
    expect(r.table.find((row) => row.k === 4)!.weakestStability).toBeGreaterThan(0.95);
    // The fit finished on all rows is as good as ten restarts on all rows (to 1e-9).
    const full = kmeans(rows, { k: 4, seed: 2, restarts: 10 });
    expect(r.table.find((row) => row.k === 4)!.withinSS).toBeLessThanOrEqual(full.withinSS * (1 + 1e-9));
    expect(r.assignments[2]).toHaveLength(24_000);
  });

  it('on a handful of rows a resample too small for k is segmented into as many as it holds, not refused', () => {
    // Eight rows of our own making in four pairs: a resample often holds fewer than 7 distinct rows.
    const rows = [
      [0, 0],
      [0, 1],
      [5, 5],
      [5, 6],
      [9, 0],
      [9, 1],
      [2, 8],
      [3, 8],
    ];
    const r = compareK(rows, { to: 7, seed: 4 });
    for (const row of r.table) expect(row.stabilityBySegment!.every((v) => v >= 0 && v <= 1)).toBe(true);
    expect(r.table.find((row) => row.k === 4)!.weakestStability).toBeGreaterThan(0.75);
  });

  it('reports progress up to its total, and samples rows for the silhouette when asked', () => {
    const events: { done: number; total: number }[] = [];
    const r = compareK(fixture.gap.blobs.rows, { from: 3, to: 5, references: 4, silhouetteRows: 120, onProgress: (e) => events.push(e) });
    expect(events.map((e) => e.done)).toEqual(events.map((_, i) => i + 1));
    expect(events[events.length - 1].done).toBe(events[0].total);
    expect(r.reasons.join(' ')).toMatch(/silhouette is highest at k = \d \([\d.]+\), computed on a seeded sample of 120 rows/);
    expect(r.recommended).toBe(4);
  });

  it('the rule: stable k only; then the gap, then the bend, then the silhouette; gap = 1 means no structure', () => {
    const ks = [2, 3, 4, 5, 6];
    const silhouette = [0.5, 0.4, 0.45, 0.3, 0.2];
    const weakestStability = [0.9, 0.8, 0.85, 0.6, 0.5];
    expect(chooseK({ ks, silhouette, weakestStability, gap: 4, knee: 3 }).recommended).toBe(4);
    expect(chooseK({ ks, silhouette, weakestStability, gap: 5, knee: 3 }).recommended).toBe(3); // gap's 5 not stable
    expect(chooseK({ ks, silhouette, weakestStability, gap: 5, knee: 6 }).recommended).toBe(2); // silhouette among 2, 3, 4
    expect(chooseK({ ks, silhouette, weakestStability, gap: 1, knee: 3 })).toMatchObject({ recommended: 1, noStructure: true });
    const none = chooseK({ ks, silhouette, weakestStability: [0.5, 0.5, 0.5, 0.5, 0.5], gap: 5 });
    expect(none).toMatchObject({ recommended: 5, noneStable: true, candidates: ks });
    expect(chooseK({ ks, silhouette, knee: 6 }).recommended).toBe(6); // no stability computed: all k are candidates
  });

  it('refuses from < 2, a single k, too large a range and misspelt options', () => {
    const rows = fixture.gap.ruspini.rows;
    expect(() => compareK(rows, { from: 1 })).toThrow(/from must be a whole number from 2 to 74; got 1/);
    expect(() => compareK(rows, { from: 4, to: 4 })).toThrow(/leave a single k/);
    expect(() => compareK(rows, { to: 80 })).toThrow(/to must be a whole number from 2 to 74; got 80/);
    expect(() => compareK(rows, { refrences: 3 } as never)).toThrow(/Did you mean "references"/);
  });
});
