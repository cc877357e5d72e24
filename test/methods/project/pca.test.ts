import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createMatrix } from '../../../src/core/matrix';
import { project, projectNew, symmetricEigen } from '../../../src/methods/project';
import fixture from '../../reference/fixtures/pca_sklearn.json';

type Case = (typeof fixture.cases)[number];

/** |a − b| ≤ tol · max(1, |b|). */
function near(a: number, b: number, tol: number): boolean {
  return Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));
}

/** Per-component sign that maps our column onto the reference (signs of eigenvectors are arbitrary). */
function signsAgainst(ours: Float64Array, reference: number[][], cols: number): number[] {
  return Array.from({ length: cols }, (_, c) => {
    let dot = 0;
    reference.forEach((row, t) => (dot += row[c] * ours[t * cols + c]));
    return dot < 0 ? -1 : 1;
  });
}

// Outside check: scikit-learn PCA (Debian python3-sklearn; version in the fixture), produced by
// test/reference/pca_sklearn.py: wine (Forina et al., standardised) and iris (Fisher 1936).
describe(`project against ${fixture.producedBy}`, () => {
  for (const c of fixture.cases as Case[]) {
    describe(`${c.name}: ${c.source}`, () => {
      const rows = createMatrix(c.rows.length, c.rows[0].length, Float64Array.from(c.rows.flat()), { colNames: c.featureNames });
      const p = project(rows, { components: c.components });

      it('mean, explained variance (n − 1) and ratios for every component', () => {
        expect(p.mean.every((v, t) => near(v, c.mean[t], 1e-12))).toBe(true);
        expect(p.explainedVariance).toHaveLength(c.explainedVariance.length);
        p.explainedVariance.forEach((v, k) => expect(near(v, c.explainedVariance[k], 1e-10)).toBe(true));
        p.explainedVarianceRatio.forEach((v, k) => expect(near(v, c.explainedVarianceRatio[k], 1e-10)).toBe(true));
      });

      it('loadings equal sklearn components_ up to a per-component sign, and follow our sign rule', () => {
        const k = c.components;
        const s = signsAgainst(p.loadings.data, c.loadings, k);
        c.loadings.forEach((row, t) => row.forEach((v, j) => expect(near(p.loadings.data[t * k + j] * s[j], v, 1e-9)).toBe(true)));
        for (let j = 0; j < k; j++) {
          const column = Array.from({ length: rows.cols }, (_, t) => p.loadings.data[t * k + j]);
          const largest = column.reduce((a, b) => (Math.abs(b) > Math.abs(a) + 1e-12 ? b : a));
          expect(largest).toBeGreaterThan(0);
        }
        expect(p.featureNames).toEqual(c.featureNames);
      });

      it('scores and scores of new rows equal sklearn transform up to the same signs', () => {
        const k = c.components;
        const s = signsAgainst(p.loadings.data, c.loadings, k);
        expect(p.scores.rows).toBe(c.rows.length);
        expect(p.scores.cols).toBe(k);
        c.scores.forEach((row, i) => row.forEach((v, j) => expect(near(p.scores.data[i * k + j] * s[j], v, 1e-9)).toBe(true)));
        const fresh = projectNew(p, c.newRows);
        c.newScores.forEach((row, i) => row.forEach((v, j) => expect(near(fresh.data[i * k + j] * s[j], v, 1e-9)).toBe(true)));
      });
    });
  }

  it('agrees with ml-pca (cross-check, not an outside reference) on iris explained variance', async () => {
    const { PCA } = await import('ml-pca');
    const iris = fixture.cases.find((c) => c.name === 'iris')!;
    const theirs = new PCA(iris.rows).getExplainedVariance();
    const ours = project(iris.rows, { components: 2 }).explainedVarianceRatio;
    theirs.forEach((v: number, k: number) => expect(near(ours[k], v, 1e-10)).toBe(true));
  });
});

describe('project properties and refusals', () => {
  it('symmetricEigen: A v = λ v, unit orthogonal vectors, values sorted (fast-check)', () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 1, max: 7 })
          .chain((d) =>
            fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: d * d, maxLength: d * d }).map((v) => ({ d, v })),
          ),
        ({ d, v }) => {
          const a = new Float64Array(d * d);
          for (let i = 0; i < d; i++) for (let j = 0; j < d; j++) a[i * d + j] = (v[i * d + j] + v[j * d + i]) / 2;
          const { values, vectors } = symmetricEigen(a, d);
          const scale = Math.max(1, ...Array.from(a, Math.abs));
          for (let c = 0; c < d; c++) {
            if (c > 0) expect(values[c]).toBeLessThanOrEqual(values[c - 1]);
            for (let i = 0; i < d; i++) {
              let av = 0;
              for (let k = 0; k < d; k++) av += a[i * d + k] * vectors[k * d + c];
              expect(Math.abs(av - values[c] * vectors[i * d + c])).toBeLessThan(1e-10 * scale);
            }
            for (let c2 = 0; c2 < d; c2++) {
              let dot = 0;
              for (let k = 0; k < d; k++) dot += vectors[k * d + c] * vectors[k * d + c2];
              expect(Math.abs(dot - (c === c2 ? 1 : 0))).toBeLessThan(1e-10);
            }
          }
        },
      ),
      { numRuns: 100 },
    );
  });

  it('center: false projects the raw rows (mean reported as zeros)', () => {
    const rows = [
      [1, 2],
      [2, 4.5],
      [3, 5.5],
    ];
    const p = project(rows, { components: 1, center: false });
    expect(p.mean).toEqual([0, 0]);
    const w = [p.loadings.data[0], p.loadings.data[1]];
    rows.forEach((r, i) => expect(p.scores.data[i]).toBeCloseTo(r[0] * w[0] + r[1] * w[1], 12));
  });

  it('refuses unknown options, too many components, one row and mismatched new rows', () => {
    expect(() =>
      project(
        [
          [1, 2],
          [3, 4],
        ],
        { componets: 1 } as never,
      ),
    ).toThrow(/Did you mean "components"/);
    expect(() =>
      project(
        [
          [1, 2],
          [3, 4],
        ],
        { components: 3 },
      ),
    ).toThrow(/components must be a whole number from 1 to 2/);
    expect(() => project([[1, 2]])).toThrow(/at least 2 needed/);
    const p = project([
      [1, 2],
      [3, 5],
      [0, 1],
    ]);
    expect(() => projectNew(p, [[1, 2, 3]])).toThrow(/3 columns but the projection was fitted on 2/);
  });
});
