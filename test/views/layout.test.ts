// Layout promises of the projection and the heatmap, read back from the static SVG: equal units
// on both axes of the biplot, every legend entry inside the picture, row labels that cannot touch
// at 60 rows, the colour key running from alike (left) to different (right), the cut marked.
import { describe, expect, it } from 'vitest';
import { projectionView, heatmapView } from '../../src/views';
import { sampleData, handProjection, sampleDissimilarity } from './gallery';

const viewBox = (svg: string) =>
  svg
    .match(/viewBox="0 0 ([\d.]+) ([\d.]+)"/)!
    .slice(1)
    .map(Number);

describe('projection still', () => {
  it('keeps equal units on both axes and every legend entry inside the picture', () => {
    const { rows, assignment } = sampleData(90);
    const k8 = assignment.map((_, i) => i % 8);
    const names = Object.fromEntries(Array.from({ length: 8 }, (_, s) => [s + 1, `A fairly long segment name ${s + 1}`]));
    const svg = projectionView(handProjection(rows), k8, { names }).svg();
    const [, height] = viewBox(svg);
    for (let s = 1; s <= 8; s++) {
      const m = svg.match(new RegExp(`<text x="[\\d.]+" y="([\\d.]+)"[^>]*>A fairly long segment name ${s}</text>`));
      expect(m, `legend entry ${s}`).not.toBeNull();
      expect(Number(m![1])).toBeLessThan(height);
    }
    // Centre discs sit at the segment means of the scores: pixels per unit must match on x and y.
    const p = handProjection(rows);
    const mean = (s: number, c: number) => {
      let t = 0;
      let m = 0;
      for (let i = 0; i < rows.length; i++) {
        if (k8[i] === s) {
          t += p.scores.data[i * 2 + c];
          m++;
        }
      }
      return t / m;
    };
    const discs = [...svg.matchAll(/<circle cx="([\d.-]+)" cy="([\d.-]+)" r="10"/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(discs).toHaveLength(8);
    const [a, b] = [0, 5];
    const perUnitX = Math.abs(discs[b][0] - discs[a][0]) / Math.abs(mean(b, 0) - mean(a, 0));
    const perUnitY = Math.abs(discs[b][1] - discs[a][1]) / Math.abs(mean(b, 1) - mean(a, 1));
    expect(perUnitX / perUnitY).toBeCloseTo(1, 1);
  });
});

describe('heatmap still at 60 rows', () => {
  const { rows, assignment, ids } = sampleData(60);
  const order = Array.from({ length: 60 }, (_, i) => i).sort((a, b) => assignment[a] - assignment[b] || a - b);
  const svg = heatmapView(sampleDissimilarity(rows, ids), { order, assignment }).svg();

  it('puts row labels at least 12 px apart', () => {
    const ys = [...svg.matchAll(/<text x="[\d.]+" y="([\d.]+)" text-anchor="end" font-size="9.5" fill="[^"]+">/g)].map((m) => Number(m[1]));
    expect(ys).toHaveLength(60);
    for (let i = 1; i < ys.length; i++) expect(ys[i] - ys[i - 1]).toBeGreaterThanOrEqual(11.99);
  });

  it('marks the cut with a line between each pair of segments, both ways', () => {
    expect((svg.match(/stroke="#ffffff" stroke-width="1.6"/g) ?? []).length).toBe(2 * 2);
  });

  it('runs its colour key from dark (alike, left) to pale (different, right)', () => {
    const keys = [...svg.matchAll(/<rect x="([\d.]+)" y="[\d.]+" width="[\d.]+" height="10" fill="rgb\((\d+),(\d+),(\d+)\)"/g)];
    expect(keys.length).toBe(40);
    const light = (m: RegExpMatchArray) => Number(m[2]) + Number(m[3]) + Number(m[4]);
    expect(Number(keys[0][1])).toBeLessThan(Number(keys[39][1]));
    expect(light(keys[0])).toBeLessThan(light(keys[39]));
    expect(svg).toContain('>0 alike</text>');
  });
});
