import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import type { MixedColumn, MixedTable } from '../../src/core/mixed';
import { dissimilarity } from '../../src/measure';
import fixture from '../reference/fixtures/gower_daisy.json';

type FixtureColumn = { name: string; kind: string; asymmetric: boolean; levels?: string[]; values: (number | null)[] };

function toTable(columns: FixtureColumn[], asymmetric: string[] = []): MixedTable {
  const cols: MixedColumn[] = columns.map((c) => ({
    name: c.name,
    kind: c.kind as MixedColumn['kind'],
    values: Float64Array.from(c.values, (v) => (v === null ? NaN : v)),
    levels: c.levels,
    asymmetric: c.asymmetric || asymmetric.includes(c.name),
  }));
  return { kind: 'mixed', rows: cols[0].values.length, columns: cols };
}

function expectClose(actual: Float64Array, expected: number[]): void {
  expect(actual.length).toBe(expected.length);
  for (let k = 0; k < expected.length; k++) {
    if (!(Math.abs(actual[k] - expected[k]) <= 1e-12)) {
      throw new Error(`pair ${k}: got ${actual[k]}, daisy gives ${expected[k]}`);
    }
  }
}

// Outside check: R cluster::daisy (Debian r-cran-cluster; version in the fixture) on the flower
// data (Struyf, Hubert & Rousseeuw 1997), produced by test/reference/gower_daisy.R.
describe(`Gower against ${fixture.producedBy}`, () => {
  const flower = fixture.flower.columns as FixtureColumn[];

  it('flower data, plain daisy(flower, metric = "gower"): binary, nominal, ordinal and numeric columns', () => {
    const d = dissimilarity(toTable(flower));
    expect(d.metric).toBe('gower');
    expect(d.size).toBe(18);
    expectClose(d.condensed, fixture.flower.plain);
  });

  it('flower data with V3 asymmetric binary (type = list(asymm = 3)): 0–0 pairs excluded', () => {
    const d = dissimilarity(toTable(flower, ['V3']), { metric: 'gower' });
    expectClose(d.condensed, fixture.flower.asymmetricV3);
    // The asymmetric treatment must matter on this data, or the check would prove nothing.
    expect(fixture.flower.asymmetricV3).not.toEqual(fixture.flower.plain);
  });

  it('flower data with per-column weights (daisy weights =)', () => {
    const d = dissimilarity(toTable(flower, ['V3']), { weights: fixture.flower.weights });
    expectClose(d.condensed, fixture.flower.weightedAsymmetricV3);
  });

  it('per-column weight on the columns themselves gives the same as the weights option', () => {
    const table = toTable(flower, ['V3']);
    const weighted: MixedTable = { ...table, columns: table.columns.map((c, t) => ({ ...c, weight: fixture.flower.weights[t] })) };
    expectClose(dissimilarity(weighted).condensed, fixture.flower.weightedAsymmetricV3);
  });

  it('own mixed table with missing values and a constant column (data of our own making) matches daisy', () => {
    const d = dissimilarity(toTable(fixture.own.columns as FixtureColumn[]));
    expectClose(d.condensed, fixture.own.condensed);
  });
});

describe('Gower through study()', () => {
  it('keeps a constant column in the average as daisy does (complete rows of the own table, fixture by gower_daisy.R)', () => {
    const records = fixture.ownComplete.records;
    const s = study(records, {
      id: 'id',
      use: ['size', 'flat', 'colour', 'grade', 'member'],
      types: { member: 'binary', grade: 'ordinal' },
      ordinalLevels: { grade: ['low', 'mid', 'high'] },
    }).prepare({ scale: 'none' });
    expect(s.report.constantColumns).toEqual(['flat']); // left out of the features …
    const d = s.dissimilarity({ metric: 'gower' });
    expectClose(d.condensed, fixture.ownComplete.condensed); // … but counted in Gower, as daisy counts it
  });
});

describe('Gower refusals', () => {
  const column = (name: string, kind: MixedColumn['kind'], values: number[], extra: Partial<MixedColumn> = {}): MixedColumn => ({
    name,
    kind,
    values: Float64Array.from(values),
    ...extra,
  });

  it('names both rows when a pair has no column in common', () => {
    const table: MixedTable = {
      kind: 'mixed',
      rows: 3,
      rowLabels: ['a', 'b', 'c'],
      columns: [column('x', 'numeric', [1, NaN, 3]), column('y', 'categorical', [NaN, 1, 0])],
    };
    expect(() => dissimilarity(table)).toThrow(/row 1 \(id "a"\) and row 2 \(id "b"\) share no column/);
  });

  it('refuses a binary value other than 0/1 and names row and column', () => {
    const table: MixedTable = { kind: 'mixed', rows: 2, columns: [column('owns', 'binary', [0, 2])] };
    expect(() => dissimilarity(table)).toThrow(/row 2, column "owns" \(binary\) is 2/);
  });

  it('refuses a non-gower metric for a mixed table', () => {
    const table: MixedTable = { kind: 'mixed', rows: 2, columns: [column('x', 'numeric', [0, 2])] };
    expect(() => dissimilarity(table, { metric: 'euclidean' })).toThrow(/takes metric "gower"/);
  });

  it('on plain numbers, gower is the mean of |difference| / range', () => {
    const rows = [
      [0, 10],
      [1, 30],
      [2, 20],
    ];
    const d = dissimilarity(rows, { metric: 'gower' });
    // Hand computation: ranges 2 and 20.
    expect(d.get(0, 1)).toBeCloseTo((1 / 2 + 20 / 20) / 2, 15);
    expect(d.get(0, 2)).toBeCloseTo((2 / 2 + 10 / 20) / 2, 15);
    expect(d.get(1, 2)).toBeCloseTo((1 / 2 + 10 / 20) / 2, 15);
  });

  it('on plain numbers, a NaN is a missing value that gower skips, while Infinity is refused', () => {
    const d = dissimilarity(
      [
        [0, 10],
        [1, NaN],
        [2, 20],
      ],
      { metric: 'gower' },
    );
    expect(d.get(0, 1)).toBeCloseTo(1 / 2, 15); // only the first column is present in both rows
    expect(d.get(0, 2)).toBeCloseTo((2 / 2 + 10 / 10) / 2, 15);
    expect(() =>
      dissimilarity(
        [
          [0, 1],
          [Infinity, 2],
        ],
        { metric: 'gower' },
      ),
    ).toThrow(/row 2, column "column 1" \(numeric\) is Infinity/);
    expect(() =>
      dissimilarity([
        [0, 1],
        [NaN, 2],
      ]),
    ).toThrow(/row 2, column 1 is NaN/);
  });
});
