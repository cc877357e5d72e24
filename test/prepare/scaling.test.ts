// Scaling, log1p, one-hot and imputation against numpy / scikit-learn values
// (fixture: test/reference/scaling.py → fixtures/scaling.json, data of our own making, seeded).
import { readFileSync } from 'fs';
import { join } from 'path';
import { describe, expect, test } from 'vitest';
import { prepareTable, type PreparedData } from '../../src/prepare';

const fixture = JSON.parse(readFileSync(join(__dirname, '../reference/fixtures/scaling.json'), 'utf8'));
const { columns } = fixture.inputs;
const numeric = ['trips', 'spend', 'tenure'];
const numericInput = { trips: columns.trips, spend: columns.spend, tenure: columns.tenure };

function column(p: PreparedData, name: string): number[] {
  const j = p.featureNames.indexOf(name);
  expect(j).toBeGreaterThanOrEqual(0);
  return Array.from({ length: p.matrix.rows }, (_, i) => p.matrix.data[i * p.matrix.cols + j]);
}

function expectClose(actual: number[], expected: number[], tolerance = 1e-12): void {
  expect(actual.length).toBe(expected.length);
  const worst = Math.max(...actual.map((v, i) => Math.abs(v - expected[i]) / Math.max(1, Math.abs(expected[i]))));
  expect(worst).toBeLessThan(tolerance);
}

describe(`scaling against ${fixture.producedBy}`, () => {
  test('zscore matches numpy (x − mean) / std(ddof=1), the sample sd that R scale() uses', () => {
    const p = prepareTable(numericInput, { scale: 'zscore' });
    for (const name of numeric) {
      expectClose(column(p, name), fixture.expected.zscoreSample[name]);
      const spec = p.preparation.columns.find((c) => c.name === name)!;
      expect(spec.center).toBeCloseTo(fixture.expected.numpyMean[name], 12);
      expect(spec.spread).toBeCloseTo(fixture.expected.numpySdSample[name], 12);
    }
  });

  test('zscore differs from StandardScaler (population sd) by exactly the factor sqrt((n − 1) / n)', () => {
    const p = prepareTable(numericInput, { scale: 'zscore' });
    const n = columns.trips.length;
    const factor = Math.sqrt((n - 1) / n);
    for (const name of numeric) {
      const population = fixture.expected.standardScalerPopulation[name] as number[];
      expectClose(
        column(p, name),
        population.map((v) => v * factor),
      );
    }
  });

  test('robust matches RobustScaler(quantile_range=(25, 75)); quantiles are numpy percentile (type 7)', () => {
    const p = prepareTable(numericInput, { scale: 'robust' });
    for (const name of numeric) {
      expectClose(column(p, name), fixture.expected.robustScaler[name]);
      const spec = p.preparation.columns.find((c) => c.name === name)!;
      const [q1, q2, q3] = fixture.expected.numpyPercentiles[name];
      expect(spec.center).toBeCloseTo(q2, 12);
      expect(spec.spread).toBeCloseTo(q3 - q1, 12);
      expect(spec.spread).toBeCloseTo(fixture.expected.robustScale[name], 12);
      expect(spec.spreadKind).toBe('iqr');
    }
  });

  test('minmax matches MinMaxScaler; none leaves values as given', () => {
    const p = prepareTable(numericInput, { scale: 'minmax' });
    for (const name of numeric) expectClose(column(p, name), fixture.expected.minMaxScaler[name]);
    const raw = prepareTable(numericInput, { scale: 'none' });
    for (const name of numeric) expect(column(raw, name)).toEqual(columns[name]);
  });

  test('log1p before zscore matches numpy log1p then (x − mean) / std(ddof=1)', () => {
    const p = prepareTable(numericInput, { log: ['trips', 'spend', 'tenure'] });
    for (const name of numeric) expectClose(column(p, name), fixture.expected.log1pZscoreSample[name]);
    // The mixed (Gower) columns carry the logged but unscaled values.
    const spend = p.mixed.columns.find((c) => c.name === 'spend')!;
    expect(Array.from(spend.values)).toEqual((columns.spend as number[]).map(Math.log1p));
  });

  test('one-hot matches OneHotEncoder: sorted levels, one indicator per level', () => {
    const p = prepareTable({ mode: columns.mode });
    expect(p.featureNames).toEqual(fixture.expected.oneHotCategories.map((l: string) => `mode=${l}`));
    const rows = Array.from({ length: p.matrix.rows }, (_, i) =>
      Array.from(p.matrix.data.subarray(i * p.matrix.cols, (i + 1) * p.matrix.cols)),
    );
    expect(rows).toEqual(fixture.expected.oneHot);
  });

  test('weights multiply the scaled column, and each indicator of a one-hot column', () => {
    const base = prepareTable({ ...numericInput, mode: columns.mode });
    const weighted = prepareTable({ ...numericInput, mode: columns.mode }, { weights: { trips: 2.5, mode: 0.5 } });
    expect(column(weighted, 'trips')).toEqual(column(base, 'trips').map((v) => v * 2.5));
    for (const level of fixture.expected.oneHotCategories) {
      expect(column(weighted, `mode=${level}`)).toEqual(column(base, `mode=${level}`).map((v) => v * 0.5));
    }
    expect(column(weighted, 'spend')).toEqual(column(base, 'spend'));
  });

  test("median policy imputes SimpleImputer's median and most frequent (ties: first in sorted order)", () => {
    const m = fixture.inputs.withMissing;
    const p = prepareTable({ trips: m.trips, tenure: m.tenure, mode: m.mode }, { missing: 'median' });
    const byColumn = Object.fromEntries(p.report.imputed.map((r) => [r.column, r]));
    expect(byColumn.trips.value).toBeCloseTo(fixture.expected.medianImputed.trips, 12);
    expect(byColumn.tenure.value).toBe(fixture.expected.medianImputed.tenure);
    expect(byColumn.mode.value).toBe(fixture.expected.mostFrequentImputed.mode);
    expect(byColumn.trips.count).toBe(3);
    expect(byColumn.trips.ids).toEqual(['4', '18', '30']);
    const tie = prepareTable({ tie: m.tie, n: [1, 2, 3, 4, 5, 6] }, { missing: 'median' });
    expect(tie.report.imputed[0].value).toBe(fixture.expected.mostFrequentImputed.tie);
  });
});

describe('robust scaling fallbacks (of our own making)', () => {
  test('IQR 0 but not constant: falls back to the sd with a report line', () => {
    const p = prepareTable({ v: [5, 5, 5, 5, 5, 5, 5, 9, 1], w: [1, 2, 3, 4, 5, 6, 7, 8, 9] }, { scale: 'robust' });
    const spec = p.preparation.columns.find((c) => c.name === 'v')!;
    expect(spec.spreadKind).toBe('sd');
    expect(spec.center).toBe(5);
    expect(spec.spread).toBeCloseTo(Math.sqrt(32 / 8), 12);
    expect(p.report.notes.some((n) => n.includes('"v"') && n.includes('standard deviation'))).toBe(true);
  });
});
