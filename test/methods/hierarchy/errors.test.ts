// Bad input: every refusal says what was given, what is allowed, and names rows where it can.
import { describe, expect, it } from 'vitest';
import { agglomerate } from '../../../src/methods/hierarchy';
import { KinsortError } from '../../../src/core/errors';
import { makeDissimilarity, fromCondensed } from '../../../src/measure/condensed';
import { dissimilarity } from '../../../src/measure/dissimilarity';

function failure(run: () => unknown): KinsortError {
  try {
    run();
  } catch (e) {
    if (e instanceof KinsortError) return e;
    throw e;
  }
  throw new Error('expected a KinsortError');
}

const rows = [
  [0, 0],
  [1, 0],
  [5, 5],
  [6, 5],
];

describe('agglomerate refuses bad input clearly', () => {
  it('fewer than 2 rows', () => {
    expect(failure(() => agglomerate([[1, 2]], { method: 'average' })).message).toMatch(/1 row\(s\).*at least 2/);
    expect(failure(() => agglomerate([], { method: 'average' })).code).toBe('empty');
  });

  it('NaN / Infinity, naming row and column', () => {
    const e = failure(() =>
      agglomerate(
        [
          [1, 2],
          [3, NaN],
          [4, 5],
        ],
        { method: 'ward' },
      ),
    );
    expect(e.code).toBe('not-finite');
    expect(e.message).toMatch(/row 2.*column 2/);
    expect(
      failure(() =>
        agglomerate(
          [
            [1, Infinity],
            [3, 4],
          ],
          { method: 'single' },
        ),
      ).message,
    ).toMatch(/row 1.*column 2/);
  });

  it('a dissimilarity with negative or non-finite entries, naming the pair', () => {
    const negative = makeDissimilarity(3, Float64Array.from([1, -2, 3]), 'given', ['a', 'b', 'c']);
    const e = failure(() => agglomerate(negative, { method: 'average' }));
    expect(e.code).toBe('bad-dissimilarity');
    expect(e.message).toMatch(/row 1 \(id "a"\) and row 3 \(id "c"\) is -2/);
    const nan = makeDissimilarity(3, Float64Array.from([1, 2, NaN]), 'given');
    expect(failure(() => agglomerate(nan, { method: 'single' })).message).toMatch(/rows? 2.*row 3 is NaN/);
  });

  it('a full square matrix passed as number[][] is refused with a pointer to fromCondensed', () => {
    const square = [
      [0, 1, 2],
      [1, 0, 3],
      [2, 3, 0],
    ];
    const e = failure(() => agglomerate(square, { method: 'average' }));
    expect(e.code).toBe('bad-input');
    expect(e.message).toMatch(/fromCondensed/);
  });

  it('unknown method with a suggestion; missing method; unknown option', () => {
    const e = failure(() => agglomerate(rows, { method: 'avrage' as any }));
    expect(e.message).toMatch(/Did you mean "average"\?/);
    expect(e.message).toMatch(/single, complete, average, weighted, centroid, median, ward/);
    expect(failure(() => agglomerate(rows, {} as any)).message).toMatch(/method is required/);
    expect(failure(() => agglomerate(rows, { method: 'ward', metrc: 'euclidean' } as any)).code).toBe('unknown-option');
  });

  it('ward / centroid / median on a non-Euclidean dissimilarity or metric: explains why, suggests alternatives', () => {
    const manhattan = dissimilarity(rows, { metric: 'manhattan' });
    for (const method of ['ward', 'centroid', 'median'] as const) {
      const e = failure(() => agglomerate(manhattan, { method }));
      expect(e.message).toMatch(/centroids in Euclidean space/);
      expect(e.message).toMatch(/"average", "complete" or "single"/);
      expect(failure(() => agglomerate(rows, { method, metric: 'cosine' })).message).toMatch(/metric "cosine"/);
    }
    // A condensed array given without a metric is not assumed Euclidean; saying so is enough.
    const given = fromCondensed(dissimilarity(rows).condensed);
    expect(failure(() => agglomerate(given, { method: 'ward' })).message).toMatch(/metric "given"/);
    expect(agglomerate(fromCondensed(dissimilarity(rows).condensed, { metric: 'euclidean' }), { method: 'ward' }).size).toBe(4);
  });

  it('metric given together with a dissimilarity', () => {
    expect(failure(() => agglomerate(dissimilarity(rows), { method: 'average', metric: 'euclidean' })).message).toMatch(/apply to rows/);
  });

  it('cut: k outside 1..n or not whole, negative height, both or neither', () => {
    const tree = agglomerate(rows, { method: 'complete' });
    for (const k of [0, 5, 1.5, NaN]) {
      const e = failure(() => tree.cut({ k }));
      expect(e.code).toBe('bad-k');
      expect(e.message).toMatch(/from 1 to 4/);
    }
    expect(failure(() => tree.cut({ height: -1 })).message).toMatch(/height/);
    expect(failure(() => tree.cut({ k: 2, height: 1 } as any)).message).toMatch(/not both/);
    expect(failure(() => tree.cut({} as any)).message).toMatch(/not neither/);
    expect(failure(() => tree.cut({ kk: 2 } as any)).code).toBe('unknown-option');
    expect(failure(() => tree.copheneticCorrelation(dissimilarity([[1], [2]]))).message).toMatch(/2 rows but the tree has 4/);
  });
});
