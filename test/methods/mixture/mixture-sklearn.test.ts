// Gaussian mixtures against scikit-learn 1.2's GaussianMixture (fixture made by
// test/reference/mixture_sklearn.py): on Old Faithful (R datasets::faithful) and six columns of
// the Wisconsin breast cancer data, for all four covariance shapes, kinsort's best of 10 restarts
// reaches at least scikit-learn's best of 10 initialisations (relative 1e-6), counts the free
// parameters the same way, and its BIC is −2 ln L + p ln n, the formula scikit-learn's figures obey.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { gaussianMixture, type CovarianceShape } from '../../../src/methods/mixture';

interface Fit {
  k: number;
  covariance: CovarianceShape;
  logLikelihood: number;
  bic: number;
  parameterCount: number;
}
const fixture = JSON.parse(readFileSync(join(__dirname, '../../reference/fixtures/mixture_sklearn.json'), 'utf8')) as {
  datasets: Record<string, { rows: number[][]; fits: Fit[] }>;
};

describe.each(Object.entries(fixture.datasets))('scikit-learn GaussianMixture on %s', (_name, data) => {
  test.each(data.fits.map((f) => [f.k, f.covariance, f] as const))('k = %i, %s covariance', (k, covariance, ref) => {
    // Same tolerance as the reference fits (1e-8 on the mean per-row log-likelihood), same floor (1e-6).
    const fit = gaussianMixture(data.rows, { k, covariance, restarts: 10, seed: 1, tolerance: 1e-8, maxIterations: 5000 });
    const n = data.rows.length;
    // Source: scikit-learn 1.2 GaussianMixture, best of n_init = 10.
    expect(fit.logLikelihood).toBeGreaterThanOrEqual(ref.logLikelihood - 1e-6 * Math.abs(ref.logLikelihood));
    expect(fit.parameterCount).toBe(ref.parameterCount);
    // Source: scikit-learn's bic() on its own fit obeys the same formula.
    expect(-2 * ref.logLikelihood + ref.parameterCount * Math.log(n)).toBeCloseTo(ref.bic, 6);
    expect(fit.bic).toBeCloseTo(-2 * fit.logLikelihood + fit.parameterCount * Math.log(n), 8);
    expect(fit.bic).toBeLessThanOrEqual(ref.bic + 2e-6 * Math.abs(ref.bic));
  });
});
