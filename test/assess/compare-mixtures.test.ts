// compareMixtures on rows drawn from three Gaussians of unequal shape (numpy, seeded, stored in the
// fixture by test/reference/mixture_sklearn.py): kinsort's BIC picks k = 3, as scikit-learn 1.2's
// BIC does on the same rows, and the two BIC curves agree where both fits reach the same optimum.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { compareMixtures } from '../../src/assess/compare-mixtures';
import { mixtureEvidenceView } from '../../src/views/mixture-evidence';

const fixture = JSON.parse(readFileSync(join(__dirname, '../reference/fixtures/mixture_sklearn.json'), 'utf8')) as {
  threeShapes: { rows: number[][]; bicByK: number[]; preferredK: number };
};

describe('compareMixtures', () => {
  const result = compareMixtures(fixture.threeShapes.rows, { from: 1, to: 6, shapes: ['full', 'diagonal'], seed: 2, restarts: 5 });

  test('three Gaussians of unequal shape: the lowest BIC is k = 3 with full covariance', () => {
    // Source: scikit-learn 1.2 GaussianMixture (full), BIC for k = 1..6, n_init = 10.
    expect(fixture.threeShapes.preferredK).toBe(3);
    expect(result.chosen).toMatchObject({ k: 3, covariance: 'full' });
    expect(result.bestKByShape.full).toBe(3);
    const full = result.candidates.filter((c) => c.covariance === 'full');
    full.forEach((c, i) => {
      // Up to k = 3 at least as good a fit as scikit-learn's best of 10 (a BIC as low); past it,
      // where extra components split a Gaussian in many nearly equal ways, within 0.5 %.
      if (c.k <= 3) expect(c.bic).toBeLessThanOrEqual(fixture.threeShapes.bicByK[i] * (1 + 1e-6));
      expect(Math.abs(c.bic / fixture.threeShapes.bicByK[i] - 1)).toBeLessThan(5e-3);
    });
    expect(result.convention).toContain('lower is better');
  });

  test('the evidence view names the choice, marks it and lists every BIC', () => {
    const view = mixtureEvidenceView(result);
    expect(view.title).toContain('k = 3');
    const html = view.html();
    expect(html).toContain('lowest BIC');
    for (const c of result.candidates.slice(0, 3)) expect(html).toContain(Math.round(c.bic).toLocaleString('en-US'));
    expect(view.svg()).toContain('<svg');
  });

  test('bad ranges and shapes are refused', () => {
    expect(() => compareMixtures(fixture.threeShapes.rows, { from: 4, to: 2 })).toThrow(/to/);
    expect(() => compareMixtures(fixture.threeShapes.rows, { shapes: ['round' as never] })).toThrow(/round/);
    expect(() => compareMixtures(fixture.threeShapes.rows, { shapes: [] })).toThrow(/at least one/);
  });
});

describe('the fluent comparison', () => {
  test('prepared.compareMixtures() shows the evidence; a study not yet prepared says to prepare first', async () => {
    const { study } = await import('../../src');
    const records = fixture.threeShapes.rows.map((r, i) => ({ id: `p${i}`, a: r[0], b: r[1] }));
    const s = study(records, { id: 'id' });
    expect(() => (s as unknown as { compareMixtures: () => unknown }).compareMixtures()).toThrow(/prepare/);
    const result = s.prepare({ scale: 'none' }).compareMixtures({ from: 2, to: 4, shapes: ['full'], seed: 1 });
    expect(result.chosen.k).toBe(3);
    expect(result.view().html()).toContain('Mixture evidence');
  });
});
