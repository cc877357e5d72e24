// Properties of gaussianMixture that hold whatever the data: memberships are probabilities, the
// assignment is their argmax, the parameters are consistent with the memberships, a seed gives the
// same bits, the shapes look as promised, and bad input is refused with a clear message.
import { describe, expect, test } from 'vitest';
import { gaussianMixture, COVARIANCE_SHAPES } from '../../../src/methods/mixture';
import { createRandom } from '../../../src/random';
import { KinsortError } from '../../../src/core/errors';

function blobs(seed: number): number[][] {
  const random = createRandom(seed);
  const rows: number[][] = [];
  const centres = [
    [0, 0, 0],
    [5, 1, -2],
    [1, 6, 3],
  ];
  for (let i = 0; i < 240; i++) {
    const c = centres[i % 3];
    rows.push(c.map((v, j) => v + random.normal() * (1 + 0.5 * j + (i % 3))));
  }
  return rows;
}

describe('gaussianMixture', () => {
  const rows = blobs(7);

  test.each(COVARIANCE_SHAPES)('%s: memberships sum to 1, assignment is their argmax, weights are their means', (covariance) => {
    const fit = gaussianMixture(rows, { k: 3, covariance, seed: 3, tolerance: 1e-12, maxIterations: 2000 });
    const n = rows.length;
    expect(fit.membership.length).toBe(n * 3);
    const weights = [0, 0, 0];
    for (let i = 0; i < n; i++) {
      let s = 0;
      let top = 0;
      for (let c = 0; c < 3; c++) {
        const p = fit.membership[i * 3 + c];
        expect(p).toBeGreaterThanOrEqual(0);
        s += p;
        weights[c] += p / n;
        if (p > fit.membership[i * 3 + top]) top = c;
      }
      expect(s).toBeCloseTo(1, 12);
      expect(fit.assignment[i]).toBe(top);
    }
    // The weights are from the last M-step, the memberships from the E-step after it: equal once settled.
    fit.weights.forEach((w, c) => expect(w).toBeCloseTo(weights[c], 6));
    expect(fit.weights.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    for (const cov of fit.covariances) {
      for (let a = 0; a < 3; a++) {
        expect(cov[a][a]).toBeGreaterThanOrEqual(fit.varianceFloor);
        for (let b = 0; b < 3; b++) {
          expect(cov[a][b]).toBe(cov[b][a]);
          if (covariance === 'diagonal' || covariance === 'spherical') if (a !== b) expect(cov[a][b]).toBe(0);
        }
      }
      if (covariance === 'spherical') expect(cov[1][1]).toBe(cov[0][0]);
    }
    if (covariance === 'tied') expect(fit.covariances[1]).toEqual(fit.covariances[0]);
  });

  test('the same seed gives the same bits; the kept restart has the highest log-likelihood', () => {
    const a = gaussianMixture(rows, { k: 3, seed: 'x', restarts: 4 });
    const b = gaussianMixture(rows, { k: 3, seed: 'x', restarts: 4 });
    expect(Array.from(b.membership)).toEqual(Array.from(a.membership));
    expect(b.logLikelihood).toBe(a.logLikelihood);
    expect(a.restartLogLikelihoods).toHaveLength(4);
    expect(a.logLikelihood).toBe(Math.max(...a.restartLogLikelihoods));
  });

  test('EM never lowers the log-likelihood: more iterations from the same start give at least as much', () => {
    let previous = -Infinity;
    for (const maxIterations of [1, 2, 5, 20]) {
      const fit = gaussianMixture(rows, { k: 3, seed: 5, maxIterations, tolerance: 0 });
      expect(fit.logLikelihood).toBeGreaterThanOrEqual(previous - 1e-9);
      previous = fit.logLikelihood;
    }
  });

  test('one component is the sample mean and the (population) covariance plus the floor', () => {
    const fit = gaussianMixture(rows, { k: 1 });
    const n = rows.length;
    const mean = [0, 1, 2].map((j) => rows.reduce((s, r) => s + r[j], 0) / n);
    fit.means[0].forEach((m, j) => expect(m).toBeCloseTo(mean[j], 10));
    const v01 = rows.reduce((s, r) => s + (r[0] - mean[0]) * (r[1] - mean[1]), 0) / n;
    const v22 = rows.reduce((s, r) => s + (r[2] - mean[2]) ** 2, 0) / n;
    expect(fit.covariances[0][0][1]).toBeCloseTo(v01, 9);
    expect(fit.covariances[0][2][2]).toBeCloseTo(v22 + 1e-6, 9);
    expect(fit.weights).toEqual([1]);
  });

  test('bad k, too few rows, non-finite input and unknown shapes are refused clearly', () => {
    const refused = (f: () => unknown, pattern: RegExp) => {
      expect(f).toThrow(KinsortError);
      expect(f).toThrow(pattern);
    };
    refused(() => gaussianMixture(rows, { k: 0 }), /k must be a whole number/);
    refused(() => gaussianMixture(rows, {} as never), /option k .* is required/);
    refused(() => gaussianMixture(rows.slice(0, 2), { k: 3 }), /only 2 rows/);
    refused(() => gaussianMixture([[1, 2]], { k: 1 }), /at least 2 rows/);
    refused(
      () =>
        gaussianMixture(
          [
            [1, 2],
            [3, NaN],
          ],
          { k: 1 },
        ),
      /row 2, column 2/,
    );
    refused(() => gaussianMixture(rows, { k: 2, covariance: 'round' as never }), /covariance/);
    refused(() => gaussianMixture(rows, { k: 2, colour: 1 } as never), /colour/);
  });
});
