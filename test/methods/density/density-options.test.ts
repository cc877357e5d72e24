// densitySegments(): refusals name the option; results are deterministic; no row is lost (every
// row is a segment member or noise); a Dissimilarity gives the same result as its rows.
import { describe, expect, it } from 'vitest';
import { densitySegments, NOISE } from '../../../src/methods/density';
import { dissimilarity } from '../../../src/measure';
import { KinsortError } from '../../../src/core/errors';
import { createRandom } from '../../../src/random';

function blobs(seed: number): number[][] {
  const random = createRandom(seed);
  const rows: number[][] = [];
  for (const [cx, cy] of [
    [0, 0],
    [6, 0],
    [0, 6],
  ])
    for (let i = 0; i < 40; i++) rows.push([cx + random.normal(), cy + random.normal()]);
  for (let i = 0; i < 6; i++) rows.push([20 + 3 * i, -15]);
  return rows;
}

describe('densitySegments', () => {
  const rows = blobs(11);
  it('finds the three blobs and marks the far rows as noise', () => {
    const r = densitySegments(rows, { minSize: 8 });
    expect(r.segmentCount).toBe(3);
    for (let i = 120; i < 126; i++) expect(r.assignment[i]).toBe(NOISE);
    expect(r.sizes.reduce((a, b) => a + b, 0) + r.noiseCount).toBe(rows.length);
    for (let i = 0; i < rows.length; i++) expect(r.noise[i]).toBe(r.assignment[i] === NOISE ? 1 : 0);
    for (let i = 120; i < 126; i++) expect(r.outlierScores[i]).toBeGreaterThan(0.5);
    expect(r.minSamples).toBe(8);
    expect(r.branches[0].from).toBe(-1);
  });
  it('is deterministic and agrees with the same rows given as a dissimilarity', () => {
    const a = densitySegments(rows, { minSize: 8, minSamples: 4 });
    const b = densitySegments(rows, { minSize: 8, minSamples: 4 });
    const c = densitySegments(dissimilarity(rows), { minSize: 8, minSamples: 4 });
    expect([...a.assignment]).toEqual([...b.assignment]);
    expect([...a.assignment]).toEqual([...c.assignment]);
    expect([...a.outlierScores]).toEqual([...c.outlierScores]);
  });
  it('refuses bad options clearly', () => {
    const call = (o: unknown) => () => densitySegments(rows, o as never);
    expect(call(undefined)).toThrow(/minSize is required/);
    expect(call({ minSize: 1 })).toThrow(/minSize must be a whole number ≥ 2/);
    expect(call({ minSize: 500 })).toThrow(/only 126 rows/);
    expect(call({ minSize: 5, minSamples: 0 })).toThrow(/minSamples/);
    expect(call({ minSize: 5, minSamples: 1000 })).toThrow(/minSamples is 1000/);
    expect(call({ minSize: 5, minSample: 3 })).toThrow(/Did you mean "minSamples"/);
    expect(call({ minSize: 5, metric: 'gower' })).toThrow(KinsortError);
    expect(() => densitySegments(dissimilarity(rows), { minSize: 5, metric: 'manhattan' })).toThrow(/already computed/);
    expect(() =>
      densitySegments(
        [
          [0, 1],
          [0, Number.NaN],
        ],
        { minSize: 2 },
      ),
    ).toThrow(/row 2, column 2/);
  });
});
