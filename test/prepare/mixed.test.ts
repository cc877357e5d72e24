// The MixedTable handed to Gower, and the drop policy's bookkeeping under random missing patterns.
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { prepareTable } from '../../src/prepare';

describe('mixed columns for Gower', () => {
  test('unscaled values and codes per kind, same kept rows, weights carried', () => {
    const rows = [
      { id: 'a', trips: 2, peak: 'yes', fare: 'student', size: 'M' },
      { id: 'b', trips: 10, peak: 'no', fare: 'adult', size: 'S' },
      { id: 'c', trips: null, peak: 'no', fare: 'adult', size: 'L' },
      { id: 'd', trips: 6, peak: 'yes', fare: 'senior', size: 'L' },
    ];
    const p = prepareTable(rows, {
      id: 'id',
      missing: 'drop',
      ordinalLevels: { size: ['S', 'M', 'L'] },
      weights: { fare: 3 },
    });
    expect(p.mixed.rows).toBe(3);
    expect(p.mixed.rowLabels).toEqual(['a', 'b', 'd']);
    const byName = Object.fromEntries(p.mixed.columns.map((c) => [c.name, c]));
    expect(byName.trips.kind).toBe('numeric');
    expect(Array.from(byName.trips.values)).toEqual([2, 10, 6]); // unscaled
    expect(byName.peak.kind).toBe('binary');
    expect(byName.peak.levels).toEqual(['no', 'yes']);
    expect(Array.from(byName.peak.values)).toEqual([1, 0, 1]);
    expect(byName.fare.kind).toBe('categorical');
    expect(byName.fare.levels).toEqual(['adult', 'senior', 'student']);
    expect(Array.from(byName.fare.values)).toEqual([2, 0, 1]);
    expect(byName.fare.weight).toBe(3);
    expect(byName.size.kind).toBe('ordinal');
    expect(Array.from(byName.size.values)).toEqual([1, 0, 2]);
    // The matrix agrees: z-scored trips (mean 6, sd 4), then peak, fare one-hot ×3, size rank z-scored.
    expect(p.featureNames).toEqual(['trips', 'peak=yes', 'fare=adult', 'fare=senior', 'fare=student', 'size']);
    expect(Array.from(p.matrix.data.subarray(0, 6))).toEqual([-1, 1, 0, 0, 3, 0]);
  });
});

describe('drop policy bookkeeping (property)', () => {
  test('inputRows = keptRows + dropped; dropped are exactly the rows with a missing feature', () => {
    const cell = fc.option(fc.integer({ min: 0, max: 9 }), { freq: 4 });
    const row = fc.record({ a: cell, b: cell, note: fc.option(fc.constantFrom('x', 'y'), { freq: 2 }) });
    fc.assert(
      fc.property(fc.array(row, { minLength: 2, maxLength: 30 }), (rows) => {
        const complete = rows.filter((r) => r.a !== null && r.b !== null);
        const distinctA = new Set(complete.map((r) => r.a)).size;
        const distinctB = new Set(complete.map((r) => r.b)).size;
        if (complete.length === 0 || (distinctA < 2 && distinctB < 2)) {
          expect(() => prepareTable(rows, { keep: ['note'], missing: 'drop', types: { a: 'numeric', b: 'numeric' } })).toThrow();
          return;
        }
        const p = prepareTable(rows, { keep: ['note'], missing: 'drop', types: { a: 'numeric', b: 'numeric' } });
        expect(p.report.inputRows).toBe(rows.length);
        expect(p.report.keptRows + p.report.dropped.length).toBe(rows.length);
        expect(p.report.dropped.map((d) => d.row)).toEqual(rows.flatMap((r, i) => (r.a === null || r.b === null ? [i] : [])));
        for (const d of p.report.dropped) {
          const r = rows[d.row];
          expect(d.columns).toEqual((['a', 'b'] as const).filter((k) => r[k] === null));
          expect(d.id).toBe(String(d.row + 1));
        }
        expect(p.matrix.rows).toBe(p.report.keptRows);
      }),
      { numRuns: 200, seed: 7 },
    );
  });
});
