import { describe, expect, it } from 'vitest';
import { setPairBudget } from '../../src/measure/condensed';
import { crossDistances, dissimilarity } from '../../src/measure';

describe('dissimilarity refusals', () => {
  const rows = [
    [1, 2],
    [3, 4],
    [0, 1],
  ];

  it('an unknown metric lists the valid names and suggests the closest', () => {
    expect(() => dissimilarity(rows, { metric: 'euclidian' as never })).toThrow(
      /Unknown metric "euclidian"\. Did you mean "euclidean"\? Valid metrics: euclidean, sqeuclidean, manhattan, chebyshev, minkowski, cosine, correlation, gower/,
    );
  });

  it('an unknown option name is refused with a suggestion', () => {
    expect(() => dissimilarity(rows, { metrc: 'euclidean' } as never)).toThrow(/unknown option "metrc". Did you mean "metric"\?/);
  });

  it('minkowski needs p ≥ 1, and p is refused for other metrics', () => {
    expect(() => dissimilarity(rows, { metric: 'minkowski' })).toThrow(/needs option p/);
    expect(() => dissimilarity(rows, { metric: 'minkowski', p: 0.5 })).toThrow(/p must be a number ≥ 1/);
    expect(() => dissimilarity(rows, { metric: 'manhattan', p: 2 })).toThrow(/applies only to metric "minkowski"/);
    expect(dissimilarity(rows, { metric: 'minkowski', p: Infinity }).get(0, 1)).toBe(2); // chebyshev limit
  });

  it('cosine on an all-zero row and correlation on a constant row name the row', () => {
    const m = { rows: 2, cols: 2, data: Float64Array.from([1, 2, 0, 0]), rowLabels: ['r1', 'r2'] };
    expect(() => dissimilarity(m, { metric: 'cosine' })).toThrow(/row 2 \(id "r2"\) is all zeros/);
    expect(() =>
      dissimilarity(
        [
          [1, 2],
          [5, 5],
        ],
        { metric: 'correlation' },
      ),
    ).toThrow(/row 2 has the same value in every column/);
    expect(() => crossDistances([[1, 2]], [[0, 0]], 'cosine')).toThrow(/row 1 is all zeros/);
  });

  it('NaN, ragged rows and text are refused naming row and column', () => {
    expect(() =>
      dissimilarity([
        [1, 2],
        [NaN, 1],
      ]),
    ).toThrow(/row 2, column 1 is NaN/);
    expect(() => dissimilarity([[1, 2], [1]])).toThrow(/row 2 has 1 values but row 1 has 2/);
    expect(() =>
      dissimilarity([
        [1, 2],
        [1, 'x' as never],
      ]),
    ).toThrow(/row 2, column 2 holds "x"/);
    expect(() => dissimilarity([])).toThrow(/empty/);
  });

  it('weights: one per column, ≥ 0, not all 0, and only for metrics that take them', () => {
    expect(() => dissimilarity(rows, { weights: [1] })).toThrow(/1 weights given for 2 columns/);
    expect(() => dissimilarity(rows, { weights: [1, -1] })).toThrow(/weight of column 2 is -1/);
    expect(() => dissimilarity(rows, { weights: [0, 0] })).toThrow(/every weight is 0/);
    expect(() => dissimilarity(rows, { metric: 'cosine', weights: [1, 1] })).toThrow(/not available for metric "cosine"/);
  });

  it('refuses before allocating a matrix beyond the memory budget, saying how large it would be', () => {
    const previous = setPairBudget(1000);
    try {
      const many = Array.from({ length: 100 }, (_, i) => [i, i * 2]);
      expect(() => dissimilarity(many)).toThrow(/100 rows holds 4,950 pairs \(38\.7 KB\)/);
    } finally {
      setPairBudget(previous);
    }
  });

  it('crossDistances checks that both sides have the same columns', () => {
    expect(() => crossDistances([[1, 2]], [[1, 2, 3]])).toThrow(/2 columns but the second rows have 3/);
    expect(
      Array.from(
        crossDistances(
          [[0, 0]],
          [
            [3, 4],
            [0, 1],
          ],
        ),
      ),
    ).toEqual([5, 1]);
  });
});
