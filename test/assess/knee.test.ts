// Kneedle (Satopää, Albrecht, Irwin & Raghavan 2011): checks worked by hand from the paper's
// definition, and against the analytic point of largest distance from the chord for y = 1/x.
import { describe, expect, it } from 'vitest';
import { findKnee } from '../../src/assess';

const ks = [1, 2, 3, 4, 5, 6, 7];
// A within-SS-like elbow; by hand: difference 1 − x_n − y_n = [0, .445, .585, .439, .293, .146, 0],
// local maximum at k = 3, threshold .585 − 1/6 = .418, crossed at k = 5 → knee 3.
const elbow = [100, 40, 10, 8, 6, 4, 2];

describe('findKnee', () => {
  it('finds the elbow of a decreasing convex curve (worked by hand)', () => {
    const r = findKnee(ks, elbow);
    expect(r.knee).toBe(3);
    expect(r.normalizedDifference[2]).toBeCloseTo(1 - 2 / 6 - 8 / 98, 12);
  });

  it('finds the same bend in all four orientations (mirror images of the elbow)', () => {
    const rising = elbow.map((v) => 102 - v); // increasing, concave
    expect(findKnee(ks, rising, { direction: 'increasing', curve: 'concave' }).knee).toBe(3);
    const mirrored = elbow.slice().reverse(); // increasing, convex; bend at 8 − 3
    expect(findKnee(ks, mirrored, { direction: 'increasing', curve: 'convex' }).knee).toBe(5);
    expect(
      findKnee(
        ks,
        mirrored.map((v) => -v),
        { direction: 'decreasing', curve: 'concave' },
      ).knee,
    ).toBe(5);
  });

  it('on y = 1/x over [1, 10] the knee is the point farthest from the chord, x = √10 (analytic)', () => {
    const xs = Array.from({ length: 901 }, (_, i) => 1 + i / 100);
    const r = findKnee(
      xs,
      xs.map((x) => 1 / x),
    );
    expect(r.knee).not.toBeNull();
    expect(Math.abs(r.knee! - Math.sqrt(10))).toBeLessThanOrEqual(0.01);
  });

  it('a straight line, a too-short curve and a faint bend under a high sensitivity have no knee', () => {
    expect(
      findKnee(
        ks,
        ks.map((k) => 10 - k),
      ).knee,
    ).toBeNull();
    expect(findKnee([1, 2], [5, 1]).knee).toBeNull();
    expect(findKnee(ks, [10, 8.6, 7.3, 6, 4.7, 3.4, 2.1], { sensitivity: 1 }).knee).toBeNull();
    expect(findKnee(ks, elbow, { sensitivity: 10 }).knee).toBeNull();
  });

  it('refuses mismatched lengths, decreasing x, non-finite values and unknown choices', () => {
    expect(() => findKnee([1, 2, 3], [1, 2])).toThrow(/3 x values but 2 curve values/);
    expect(() => findKnee([1, 3, 2], [3, 2, 1])).toThrow(/point 3 has x = 2 after 3/);
    expect(() => findKnee([1, 2, 3], [3, NaN, 1])).toThrow(/point 2 is \(2, NaN\)/);
    expect(() => findKnee(ks, elbow, { curve: 'convx' } as never)).toThrow(/Did you mean "convex"/);
  });
});
