// Re-applying a fitted preparation: JSON round trip, bit-for-bit identity on the training rows,
// unseen levels, missing and extra columns, stored imputation, and permutation (fast-check).
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { applyPreparation, prepareTable, type Preparation } from '../../src/prepare';

function riders(n: number, seed: number) {
  // Small deterministic generator of our own making (test data only).
  let s = seed >>> 0;
  const next = () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const fares = ['adult', 'student', 'senior', 'child'];
  return Array.from({ length: n }, (_, i) => ({
    rider: `r${i + 1}`,
    trips: Math.round(next() * 200) / 10,
    spend: Math.round(next() * 5000) / 100,
    fare: fares[Math.floor(next() * fares.length)],
    peak: next() < 0.5 ? 'yes' : 'no',
    band: ['low', 'mid', 'high'][Math.floor(next() * 3)],
    region: `zone ${Math.floor(next() * 3)}`,
  }));
}

const options = {
  id: 'rider',
  keep: ['region'],
  ordinalLevels: { band: ['low', 'mid', 'high'] },
  log: ['spend'],
  weights: { fare: 0.5, trips: 2 },
  scale: 'robust' as const,
};

describe('applyPreparation', () => {
  test('the preparation survives JSON unchanged and has no typed arrays or functions', () => {
    const p = prepareTable(riders(40, 1), options).preparation;
    const copy: Preparation = JSON.parse(JSON.stringify(p));
    expect(copy).toEqual(p);
    expect(JSON.stringify(copy)).toBe(JSON.stringify(p));
  });

  test('applied to the training rows (after a JSON round trip) it gives the fitted matrix bit for bit', () => {
    for (const scale of ['none', 'zscore', 'robust', 'minmax'] as const) {
      const rows = riders(60, 7);
      const fitted = prepareTable(rows, { ...options, scale });
      const again = applyPreparation(JSON.parse(JSON.stringify(fitted.preparation)), rows);
      expect(again.featureNames).toEqual(fitted.featureNames);
      expect(Buffer.from(again.matrix.data.buffer).equals(Buffer.from(fitted.matrix.data.buffer))).toBe(true);
      expect(again.ids).toEqual(fitted.ids);
      expect(again.mixed.columns.map((c) => Array.from(c.values))).toEqual(fitted.mixed.columns.map((c) => Array.from(c.values)));
    }
  });

  test('bit-for-bit after JSON even when the minimum (the min-max centre) is -0', () => {
    const rows = [{ v: -0 }, { v: 1 }, { v: 3 }];
    const fitted = prepareTable(rows, { scale: 'minmax' });
    const again = applyPreparation(JSON.parse(JSON.stringify(fitted.preparation)), rows);
    expect(Object.is(again.matrix.data[0], fitted.matrix.data[0])).toBe(true);
  });

  test('a level never seen in training: all its indicators 0, reported by id, column and level', () => {
    const fitted = prepareTable(riders(40, 3), options);
    const fresh = [
      { rider: 'n1', trips: 4, spend: 10, fare: 'veteran', peak: 'no', band: 'mid', region: 'zone 9' },
      { rider: 'n2', trips: 5, spend: 12, fare: 'adult', peak: 'yes', band: 'low', region: 'zone 1' },
    ];
    const out = applyPreparation(fitted.preparation, fresh);
    expect(out.report.unseenLevels).toEqual([{ id: 'n1', row: 0, column: 'fare', level: 'veteran' }]);
    const fareColumns = out.featureNames.map((f, j) => (f.startsWith('fare=') ? j : -1)).filter((j) => j >= 0);
    expect(fareColumns.map((j) => out.matrix.data[j])).toEqual([0, 0, 0, 0]);
    expect(fareColumns.map((j) => out.matrix.data[out.matrix.cols + j])).toEqual([0.5, 0, 0, 0]); // adult, weight 0.5
    expect(Number.isNaN(out.mixed.columns.find((c) => c.name === 'fare')!.values[0])).toBe(true);
  });

  test('a missing used column is named; extra columns are ignored and listed once', () => {
    const fitted = prepareTable(riders(30, 5), options);
    const rows = riders(5, 9).map(({ spend: _spend, ...rest }) => ({ ...rest, spnd: 1, extra: 'x' }));
    expect(() => applyPreparation(fitted.preparation, rows)).toThrow(/lack the used column\(s\) "spend".*Did you mean "spnd"\?/);
    const ok = applyPreparation(
      fitted.preparation,
      riders(5, 9).map((r) => ({ ...r, extra: 'x', other: 2 })),
    );
    expect(ok.report.notes.filter((n) => n.startsWith('Ignored columns'))).toEqual([
      'Ignored columns not in the preparation: extra, other.',
    ]);
  });

  test('new rows without the id column: refused by name, or numbered 1..n with { id: null }', () => {
    const fitted = prepareTable(riders(30, 5), options);
    const rows = riders(3, 6).map(({ rider: _rider, ...rest }) => rest);
    expect(() => applyPreparation(fitted.preparation, rows)).toThrow(/no id column "rider".*\{ id: null \}/);
    const out = applyPreparation(fitted.preparation, rows, { id: null });
    expect(out.ids).toEqual(['1', '2', '3']);
    expect(() => applyPreparation(fitted.preparation, rows, { idd: null } as never)).toThrow(/Did you mean "id"\?/);
  });

  test('missing cells follow the stored policy: median uses the stored training values', () => {
    const train = riders(30, 11);
    train[2].trips = null as never;
    const fitted = prepareTable(train, {
      id: 'rider',
      keep: ['region'],
      missing: 'median',
      scale: 'none',
      ordinalLevels: options.ordinalLevels,
    });
    const stored = fitted.preparation.columns.find((c) => c.name === 'trips')!.fill as number;
    const fresh = riders(3, 12).map((r, i) => (i === 1 ? { ...r, trips: null } : r));
    const out = applyPreparation(fitted.preparation, fresh);
    expect(out.matrix.data[1 * out.matrix.cols + out.featureNames.indexOf('trips')]).toBe(stored);
    expect(out.report.imputed).toEqual([{ column: 'trips', value: stored, count: 1, ids: ['r2'] }]);
    const refusing = prepareTable(riders(30, 11), { id: 'rider', keep: ['region'], ordinalLevels: options.ordinalLevels });
    expect(() => applyPreparation(refusing.preparation, fresh)).toThrow(/row 2 \(id "r2"\), column "trips" is missing/);
  });

  test('bad cells in new rows are refused by row id and column', () => {
    const fitted = prepareTable(riders(30, 13), options);
    const bad = riders(3, 14);
    bad[2].trips = 'lots' as never;
    expect(() => applyPreparation(fitted.preparation, bad)).toThrow(/row 3 \(id "r3"\), column "trips" holds "lots"/);
    const badBand = riders(3, 14).map((r, i) => (i === 0 ? { ...r, band: 'extreme' } : r));
    expect(() => applyPreparation(fitted.preparation, badBand)).toThrow(/row 1 \(id "r1"\), column "band" holds "extreme".*ordinal/);
    const negative = riders(3, 14).map((r, i) => (i === 1 ? { ...r, spend: -3 } : r));
    expect(() => applyPreparation(fitted.preparation, negative)).toThrow(/row 2 \(id "r2"\), column "spend" is -3.*log1p/);
    expect(() => applyPreparation({ format: 'other' } as never, bad)).toThrow(/not a kinsort preparation/);
  });

  test('property: applying to any permutation of the training rows gives the same rows permuted', () => {
    const rows = riders(25, 21);
    const fitted = prepareTable(rows, options);
    const p = fitted.matrix.cols;
    fc.assert(
      fc.property(
        fc.shuffledSubarray(
          rows.map((_, i) => i),
          { minLength: rows.length, maxLength: rows.length },
        ),
        (order) => {
          const out = applyPreparation(
            fitted.preparation,
            order.map((i) => rows[i]),
          );
          expect(out.ids).toEqual(order.map((i) => rows[i].rider));
          order.forEach((i, r) => {
            expect(Array.from(out.matrix.data.subarray(r * p, (r + 1) * p))).toEqual(
              Array.from(fitted.matrix.data.subarray(i * p, (i + 1) * p)),
            );
          });
        },
      ),
      { numRuns: 50, seed: 42 },
    );
  });
});
