// The missing-value policies: refuse (default), drop (listed), median (imputed, listed).
// Data of our own making; expected values worked out by hand in the comments.
import { describe, expect, test } from 'vitest';
import { prepareTable } from '../../src/prepare';

const riders = [
  { rider: 'a', trips: 3, fare: 'adult', peak: 'yes', note: 'x' },
  { rider: 'b', trips: null, fare: 'student', peak: 'no', note: null },
  { rider: 'c', trips: 8, fare: null, peak: 'yes', note: 'z' },
  { rider: 'd', trips: 4, fare: 'adult', peak: 'no', note: null },
  { rider: 'e', trips: 'NA', fare: 'senior', peak: 'yes', note: 'w' },
  { rider: 'f', trips: 6, fare: 'adult', peak: 'no', note: 'v' },
];

describe('missing: refuse (default)', () => {
  test('names the first row id and column, and counts the other missing cells', () => {
    expect(() => prepareTable(riders, { id: 'rider', keep: ['note'] })).toThrow(
      /row 2 \(id "b"\), column "trips" is missing.*There are 2 other missing cell\(s\).*trips \(2\), fare \(1\)/,
    );
  });

  test('missing profile-only values are no reason to refuse or drop', () => {
    const full = riders.filter((r) => r.trips !== null && r.trips !== 'NA' && r.fare !== null);
    const p = prepareTable(full, { id: 'rider', keep: ['note'] });
    expect(p.report.keptRows).toBe(3);
    expect(p.profile.columns.note).toEqual(['x', null, 'v']);
  });
});

describe('missing: drop', () => {
  test('drops and lists every row with a missing feature; counts add up', () => {
    const p = prepareTable(riders, { id: 'rider', keep: ['note'], missing: 'drop' });
    expect(p.report.dropped).toEqual([
      { id: 'b', row: 1, columns: ['trips'], reason: 'missing value in trips' },
      { id: 'c', row: 2, columns: ['fare'], reason: 'missing value in fare' },
      { id: 'e', row: 4, columns: ['trips'], reason: 'missing value in trips' },
    ]);
    expect(p.report.inputRows).toBe(p.report.keptRows + p.report.dropped.length);
    expect(p.ids).toEqual(['a', 'd', 'f']);
    expect(Array.from(p.rowNumbers)).toEqual([0, 3, 5]);
    expect(p.matrix.rows).toBe(3);
    expect(p.mixed.rows).toBe(3);
    expect(p.profile.columns.trips).toEqual([3, 4, 6]);
  });

  test('a column that no longer varies after dropping is flagged and left out of the features', () => {
    const p = prepareTable(riders, { id: 'rider', keep: ['note'], missing: 'drop' });
    // Kept rows a, d, f all have fare "adult".
    expect(p.report.constantColumns).toEqual(['fare']);
    expect(p.featureNames).toEqual(['trips', 'peak=yes']);
    expect(p.report.notes.some((n) => n.includes('do not vary') && n.includes('fare'))).toBe(true);
    expect(p.profile.columns.fare).toEqual(['adult', 'adult', 'adult']);
  });

  test('when every row has a missing feature the error says so', () => {
    expect(() =>
      prepareTable(
        [
          { a: null, b: 1 },
          { a: 2, b: null },
        ],
        { missing: 'drop' },
      ),
    ).toThrow(/every one of the 2 rows/);
  });
});

describe('missing: median', () => {
  test('imputes numeric by the median and categorical by the most frequent level, reported per column', () => {
    const p = prepareTable(riders, { id: 'rider', keep: ['note'], missing: 'median', scale: 'none' });
    // trips present: 3, 8, 4, 6 → median 5; fare present: adult ×3, student, senior → adult.
    expect(p.report.imputed).toEqual([
      { column: 'trips', value: 5, count: 2, ids: ['b', 'e'] },
      { column: 'fare', value: 'adult', count: 1, ids: ['c'] },
    ]);
    expect(p.report.keptRows).toBe(6);
    expect(p.report.dropped).toEqual([]);
    expect(p.matrix.data[1 * p.matrix.cols + 0]).toBe(5);
    expect(p.profile.columns.trips).toEqual([3, null, 8, 4, null, 6]);
    const spec = p.preparation.columns.find((c) => c.name === 'trips')!;
    expect(spec.fill).toBe(5);
  });
});

describe('option checks', () => {
  test('unknown options and policies get a did-you-mean', () => {
    expect(() => prepareTable(riders, { missin: 'drop' } as never)).toThrow(/unknown option "missin". Did you mean "missing"\?/);
    expect(() => prepareTable(riders, { missing: 'impute' as never })).toThrow(/Valid missing-value policys?: refuse, drop, median/);
    expect(() => prepareTable(riders, { scale: 'standard' as never })).toThrow(/Valid scale methods: none, zscore, robust, minmax/);
  });
});
