// Bootstrap stability (Hennig 2007). No reference tool for it is installed here (R's fpc is not a
// Debian package on this machine), so the checks are worked from the definition: well separated
// blobs (of our own making, fixture of test/reference/gap_clusgap.R) must be recovered every time;
// an assignment unrelated to the structure must dissolve, with the Jaccard the definition predicts.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/gap_clusgap.json';
import { bootstrapStability } from '../../src/assess';
import { dissimilarity } from '../../src/measure';

const blobs = fixture.gap.blobs.rows;

describe('bootstrapStability', () => {
  it('four well separated blobs: every segment recovered in every resample, read as stable', () => {
    const r = bootstrapStability(blobs, { k: 4, resamples: 30, seed: 2 });
    expect(r.k).toBe(4);
    expect(r.resamples).toBe(30);
    for (let c = 0; c < 4; c++) {
      expect(r.jaccard[c]).toBeGreaterThan(0.97);
      expect(r.recovered[c]).toBe(1);
      expect(r.dissolved[c]).toBe(0);
    }
    expect(r.reading).toEqual(['stable', 'stable', 'stable', 'stable']);
  });

  it('an assignment that cuts across the blobs dissolves: Jaccard near 1/7 for quarters crossing quarters', () => {
    // Original segment C = every 4th row (a quarter of each blob); a new segment D = one blob.
    // |C∩D| ≈ n/16 and |C∪D| ≈ 7n/16, so the best Jaccard is about 1/7.
    const crossing = blobs.map((_, i) => i % 4);
    const r = bootstrapStability(blobs, { assignment: crossing, resamples: 20, seed: 5 });
    for (let c = 0; c < 4; c++) {
      expect(r.jaccard[c]).toBeGreaterThan(0.08);
      expect(r.jaccard[c]).toBeLessThan(0.25);
      expect(r.dissolved[c]).toBe(1);
    }
    expect(r.reading).toEqual(['unstable', 'unstable', 'unstable', 'unstable']);
    expect(Array.from(r.assignment)).toEqual(crossing);
  });

  it('is deterministic with the seed, reports progress per resample, and keeps the per-resample values', () => {
    const events: number[] = [];
    const a = bootstrapStability(fixture.gap.noise.rows, { k: 5, resamples: 6, seed: 9, onProgress: (e) => events.push(e.done) });
    const b = bootstrapStability(fixture.gap.noise.rows, { k: 5, resamples: 6, seed: 9 });
    expect(a.jaccard).toEqual(b.jaccard);
    expect(events).toEqual([1, 2, 3, 4, 5, 6]);
    expect(a.jaccardByResample).toHaveLength(5);
    for (let c = 0; c < 5; c++) {
      const mean = a.jaccardByResample[c].reduce((s, v) => s + v, 0) / 6;
      expect(a.jaccard[c]).toBeCloseTo(mean, 12);
    }
  });

  it("k-medoids from rows and from a dissimilarity: Ruspini's four groups (1970; pam(ruspini, 4) in R) are stable", () => {
    const ruspini = fixture.pamRuspini;
    const fromRows = bootstrapStability(ruspini.rows, { k: 4, method: 'kmedoids', resamples: 15, seed: 4 });
    const fromDiss = bootstrapStability(dissimilarity(ruspini.rows), { k: 4, method: 'kmedoids', resamples: 15, seed: 4 });
    // PAM is deterministic: the same resampled rows give the same segments either way.
    expect(fromDiss.jaccard).toEqual(fromRows.jaccard);
    expect(fromRows.method).toBe('kmedoids');
    expect(fromRows.reading).toEqual(['stable', 'stable', 'stable', 'stable']);
    // the original PAM segments are R's pam(ruspini, 4) clustering, up to numbering
    const counts = new Map<string, number>();
    ruspini.clustering.forEach((c, i) =>
      counts.set(`${c}-${fromRows.assignment[i]}`, (counts.get(`${c}-${fromRows.assignment[i]}`) ?? 0) + 1),
    );
    expect(counts.size).toBe(4);
  });

  it('refuses k-means on a dissimilarity', () => {
    expect(() => bootstrapStability(dissimilarity(blobs), { k: 4 })).toThrow(/use method "kmedoids" with a dissimilarity/);
  });

  it('refuses a missing k, a k that disagrees with the assignment, and unknown methods', () => {
    expect(() => bootstrapStability(blobs, {})).toThrow(/give k .* or an assignment/);
    expect(() => bootstrapStability(blobs, { k: 3, assignment: blobs.map((_, i) => i % 4) })).toThrow(
      /k = 3 but the assignment given has 4/,
    );
    expect(() => bootstrapStability(blobs, { k: 3, method: 'kmean' } as never)).toThrow(/Did you mean "kmeans"/);
    expect(() => bootstrapStability(blobs, { k: 3, resample: 10 } as never)).toThrow(/Did you mean "resamples"/);
  });
});
