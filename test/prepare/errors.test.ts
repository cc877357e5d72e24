// Bad input to prepareTable: every refusal names what was given, and the row id and column.
import { describe, expect, test } from 'vitest';
import { KinsortError } from '../../src/core/errors';
import { prepareTable } from '../../src/prepare';
import { readTable } from '../../src/table';

const rows = [
  { id: 'a', trips: '3', fare: 'adult' },
  { id: 'b', trips: '4', fare: 'student' },
  { id: 'c', trips: '12abc', fare: 'senior' },
  { id: 'd', trips: '6', fare: 'adult' },
];

function codeOf(f: () => unknown): string | undefined {
  try {
    f();
  } catch (e) {
    return e instanceof KinsortError ? e.code : 'not a KinsortError';
  }
  return undefined;
}

describe('prepareTable refusals', () => {
  test('text in a numeric column names row id and column', () => {
    expect(() => prepareTable(rows, { id: 'id' })).toThrow(/row 3 \(id "c"\), column "trips" holds "12abc", which is not a number/);
    expect(codeOf(() => prepareTable(rows, { id: 'id' }))).toBe('bad-input');
    // Declared categorical, the same column is accepted.
    expect(prepareTable(rows, { id: 'id', types: { trips: 'categorical' } }).featureNames).toContain('trips=12abc');
  });

  test('Infinity and NaN: Infinity refused by row and column, NaN is missing', () => {
    const inf = [{ x: 1 }, { x: Infinity }, { x: 3 }];
    expect(() => prepareTable(inf)).toThrow(/row 2, column "x" is Infinity/);
    expect(codeOf(() => prepareTable(inf))).toBe('not-finite');
    expect(() => prepareTable([{ x: 1 }, { x: NaN }, { x: 3 }])).toThrow(/row 2, column "x" is missing/);
  });

  test('duplicate and missing ids name both rows / the row', () => {
    const dup = [
      { id: 'a', v: 1 },
      { id: 'b', v: 2 },
      { id: 'a', v: 3 },
    ];
    expect(() => prepareTable(dup, { id: 'id' })).toThrow(/id "a" appears twice in column "id" \(rows 1 and 3\)/);
    expect(codeOf(() => prepareTable(dup, { id: 'id' }))).toBe('duplicate-id');
    expect(() =>
      prepareTable(
        [
          { id: 'a', v: 1 },
          { id: null, v: 2 },
          { id: 'c', v: 5 },
        ],
        { id: 'id' },
      ),
    ).toThrow(/row 2 has no value in the id column "id"/);
  });

  test('unknown column names in id, use, keep, log, weights get a did-you-mean', () => {
    expect(() => prepareTable(rows, { id: 'ids' })).toThrow(/prepareTable id: no column named "ids". Did you mean "id"\?/);
    expect(() => prepareTable(rows, { id: 'id', use: ['fair'] })).toThrow(/no column named "fair". Did you mean "fare"\?/);
    expect(() => prepareTable(rows, { id: 'id', keep: ['tripz'] })).toThrow(/Did you mean "trips"\?/);
    expect(() => prepareTable(rows, { id: 'id', use: ['fare'], log: ['trips'] })).toThrow(/log \(a used column\): no column named "trips"/);
    expect(codeOf(() => prepareTable(rows, { id: 'ids' }))).toBe('unknown-column');
  });

  test('conflicting roles and options are refused', () => {
    expect(() => prepareTable(rows, { id: 'id', use: ['fare'], keep: ['fare'] })).toThrow(/"fare" is in both use and keep/);
    expect(() => prepareTable(rows, { id: 'id', use: ['id', 'fare'] })).toThrow(/"id" is the id column/);
    expect(() => prepareTable(rows, { id: 'id', use: ['fare'], log: ['fare'] })).toThrow(
      /column "fare" is categorical; log1p applies to numeric columns only/,
    );
    expect(() => prepareTable(rows, { id: 'id', use: ['fare'], weights: { fare: 0 } })).toThrow(/weights.fare must be a finite number/);
    expect(() => prepareTable(rows, { id: 'id', use: ['fare'], weights: { fare: NaN } })).toThrow(/weights.fare/);
  });

  test('negative values under log1p are refused by row and column', () => {
    const t = [
      { id: 'p', s: 1 },
      { id: 'q', s: -2 },
      { id: 'r', s: 4 },
    ];
    expect(() => prepareTable(t, { id: 'id', log: ['s'] })).toThrow(/row 2 \(id "q"\), column "s" is -2, but log1p/);
  });

  test('a column declared binary with three levels is refused, listing levels', () => {
    expect(() => prepareTable(rows, { id: 'id', use: ['fare'], types: { fare: 'binary' } })).toThrow(
      /"fare" is treated as binary but has 3 distinct values \("adult", "senior", "student"\)/,
    );
  });

  test('free-text columns: left out of the default features with a note, refused when asked for', () => {
    const names = Array.from({ length: 30 }, (_, i) => ({ name: `person ${i}`, v: i % 7 }));
    const p = prepareTable(names);
    expect(p.featureNames).toEqual(['v']);
    expect(p.report.notes[0]).toMatch(/free text.*name/);
    expect(() => prepareTable(names, { use: ['name', 'v'] })).toThrow(/column "name" reads as free text/);
    expect(prepareTable(names, { use: ['name'], types: { name: 'categorical' } }).featureNames.length).toBe(30);
  });

  test('all-constant features and empty feature lists are refused', () => {
    expect(() =>
      prepareTable([
        { a: 1, b: 'x' },
        { a: 1, b: 'x' },
      ]),
    ).toThrow(/every used column is constant.*a, b/);
    expect(() => prepareTable(rows, { id: 'id', keep: ['trips', 'fare'] })).toThrow(/no feature columns/);
  });

  test('ordinal: level order respected, unknown level refused by row', () => {
    const t = readTable({ size: ['S', 'L', 'M', 'S'] }, { ordinalLevels: { size: ['S', 'M', 'L'] } });
    const p = prepareTable(t, { scale: 'none' });
    expect(Array.from(p.matrix.data)).toEqual([0, 2, 1, 0]);
    expect(p.mixed.columns[0].kind).toBe('ordinal');
    expect(() => prepareTable({ size: ['S', 'XL', 'M'] }, { ordinalLevels: { size: ['S', 'M', 'L'] } })).toThrow(
      /row 2, column "size" holds "XL", which is not one of the ordinal column's levels/,
    );
  });
});
