import { describe, expect, it } from 'vitest';
import { dissimilarity } from '../../src/measure';
import fixture from '../reference/fixtures/pdist_metrics.json';

type Case = { metric: string; p?: number; weights?: number[]; condensed: number[] };

/** Relative 1e-12, with an absolute floor for values at 0 (duplicate rows). */
function expectClose(actual: Float64Array, expected: number[]): void {
  expect(actual.length).toBe(expected.length);
  for (let k = 0; k < expected.length; k++) {
    const e = expected[k];
    const tol = 1e-12 * Math.max(Math.abs(e), 1e-3);
    if (!(Math.abs(actual[k] - e) <= tol)) {
      throw new Error(`pair ${k}: got ${actual[k]}, SciPy gives ${e} (difference ${actual[k] - e})`);
    }
  }
}

// Outside check: SciPy pdist (Debian python3-scipy, version in the fixture) on data of our own
// making, produced by test/reference/pdist_metrics.py.
describe(`dissimilarity against ${fixture.producedBy}`, () => {
  for (const c of fixture.cases as Case[]) {
    const title = `${c.metric}${c.p !== undefined ? ` p=${c.p}` : ''}${c.weights ? ' weighted' : ''}`;
    it(`${title} matches SciPy pdist within 1e-12 relative`, () => {
      const d = dissimilarity(fixture.rows, { metric: c.metric as never, p: c.p, weights: c.weights });
      expect(d.size).toBe(fixture.rows.length);
      expect(d.metric).toBe(c.metric);
      expectClose(d.condensed, c.condensed);
    });
  }

  it('gives exactly 0 for duplicate rows (rows 4, 8 and 20 are the same) in the difference-based metrics', () => {
    for (const metric of ['euclidean', 'sqeuclidean', 'manhattan', 'chebyshev'] as const) {
      const d = dissimilarity(fixture.rows, { metric });
      expect(d.get(3, 7)).toBe(0);
      expect(d.get(19, 3)).toBe(0);
    }
  });
});
