// The silhouette view aggregates before drawing: checked against counts made by hand, and its
// size does not grow with the rows.
import { describe, expect, it } from 'vitest';
import { summariseSilhouette } from '../../src/views/silhouette-summary';
import { silhouetteView } from '../../src/views/silhouette';
import { createRandom } from '../../src/random';

describe('summariseSilhouette', () => {
  it('bins, quartiles, the share below 0 and the segment those rows lean to (hand-counted)', () => {
    const values = [0.62, 0.41, -0.12, 0.33, -0.04, 0.7, 0.05];
    const labels = Int32Array.from([0, 0, 0, 0, 1, 1, 1]);
    const neighbour = [1, 1, 2, 1, 0, 0, 0];
    const s = summariseSilhouette(values, labels, 3, 0.2786, neighbour);
    expect(s.binStart).toBeCloseTo(-0.15, 12); // floor(−0.12 / 0.05) = −3
    expect(s.bins).toBe(18); // 0.70 sits on an edge: its bin is [0.70, 0.75), bin 17 of 0..17
    const seg0 = s.segments[0];
    expect(seg0.size).toBe(4);
    expect(seg0.below).toBe(1);
    expect(seg0.leansTo).toBe(2); // its one row below 0 has neighbour 2
    expect(seg0.mean).toBeCloseTo((0.62 + 0.41 - 0.12 + 0.33) / 4, 12);
    // sorted −0.12 0.33 0.41 0.62: median (0.33 + 0.41) / 2, q1 at position 0.75 → −0.12 + 0.75 × 0.45
    expect(seg0.median).toBeCloseTo(0.37, 12);
    expect(seg0.q1).toBeCloseTo(0.2175, 12);
    expect(seg0.counts.reduce((a, b) => a + b, 0)).toBe(4);
    expect(seg0.counts[0]).toBe(1); // −0.12 in [−0.15, −0.10)
    expect(s.segments[1].leansTo).toBe(0);
    expect(s.segments[2].size).toBe(0);
  });
});

describe('silhouetteView', () => {
  it('draws the same size of picture for 1,000 and 100,000 rows, with the figures printed', () => {
    const make = (n: number) => {
      const rnd = createRandom(5);
      const values = Float64Array.from({ length: n }, () => Math.max(-1, Math.min(1, 0.3 + 0.2 * rnd.normal())));
      const assignment = Int32Array.from({ length: n }, (_, i) => i % 4);
      const neighbour = Int32Array.from({ length: n }, (_, i) => (i + 1) % 4);
      const average = values.reduce((a, b) => a + b, 0) / n;
      return silhouetteView({ values, average, neighbour }, assignment, { names: { 2: 'A name long enough to need a second line' } }).svg();
    };
    const small = make(1000);
    const big = make(100000);
    expect(big.length).toBeLessThan(small.length * 1.5);
    expect(big).toMatch(/below 0/);
    expect(big).toContain('A name long enough to');
    expect(big).toMatch(/all rows 0\.\d\d/);
    expect(big).not.toContain('stroke-dasharray');
  });
});
