// Every input shape readTable recognises, including a real arquero 7 table and danfo-like objects.
import * as aq from 'arquero';
import { describe, expect, test } from 'vitest';
import { readTable, type Table } from '../../src/table';

const plain = (t: Table) => t.columns.map((c) => [c.name, c.values, c.inferred]);

const records = [
  { id: 'r1', trips: 3, fare: 'adult', peak: true },
  { id: 'r2', trips: 5.5, fare: 'student', peak: false },
  { id: 'r3', trips: 8, fare: 'senior', peak: true },
];
const expected = [
  ['id', ['r1', 'r2', 'r3'], 'categorical'],
  ['trips', [3, 5.5, 8], 'numeric'],
  ['fare', ['adult', 'student', 'senior'], 'categorical'],
  ['peak', ['true', 'false', 'true'], 'binary'],
];

describe('input shapes', () => {
  test('array of records', () => {
    const t = readTable(records);
    expect(t.kind).toBe('table');
    expect(t.rowCount).toBe(3);
    expect(plain(t)).toEqual(expected);
  });

  test('records with an absent key: that cell is missing', () => {
    const t = readTable([{ a: 1, b: 'x' }, { a: 2 }, { b: 'y', a: 3 }]);
    expect(t.columns.find((c) => c.name === 'b')!.values).toEqual(['x', null, 'y']);
  });

  test('column object; columns of different lengths are named', () => {
    const t = readTable({ id: ['r1', 'r2', 'r3'], trips: [3, 5.5, 8], fare: ['adult', 'student', 'senior'], peak: [true, false, true] });
    expect(plain(t)).toEqual(expected);
    expect(() => readTable({ a: [1, 2, 3], b: [1, 2] })).toThrow(/different lengths: "a" \(3\), "b" \(2\)/);
    const typed = readTable({ x: new Float64Array([1, 2, 3]) });
    expect(typed.columns[0].values).toEqual([1, 2, 3]);
  });

  test('CSV text gives the same table as records, numbers kept as their text', () => {
    const t = readTable('id,trips,fare,peak\nr1,3,adult,true\nr2,5.5,student,false\nr3,8,senior,true\n');
    expect(plain(t)).toEqual(
      expected.map(([n, v, type]) => [n, (v as unknown[]).map((x) => (typeof x === 'number' ? String(x) : x)), type]),
    );
    expect(t.columns.map((c) => c.inferred)).toEqual(readTable(records).columns.map((c) => c.inferred));
  });

  test('danfo-like {columns, values} and {$columns, $data}', () => {
    const values = records.map((r) => [r.id, r.trips, r.fare, r.peak]);
    const columns = ['id', 'trips', 'fare', 'peak'];
    expect(plain(readTable({ columns, values }))).toEqual(expected);
    expect(plain(readTable({ $columns: columns, $data: values }))).toEqual(expected);
    expect(() => readTable({ columns, values: [values[0], values[1].slice(0, 3)] })).toThrow(
      /row 2 has 3 values but there are 4 column names/,
    );
  });

  test('a real arquero 7 table (columnNames() + array(name))', () => {
    const dt = aq.table({ id: ['r1', 'r2', 'r3'], trips: [3, 5.5, 8], fare: ['adult', 'student', 'senior'], peak: [true, false, true] });
    expect(plain(readTable(dt))).toEqual(expected);
    const filtered = dt.filter((d: { trips: number }) => d.trips > 4);
    const t = readTable(filtered);
    expect(t.rowCount).toBe(2);
    expect(t.columns[0].values).toEqual(['r2', 'r3']);
  });

  test('plain number[][] gets columns x1..xd; ragged rows are named', () => {
    const t = readTable([
      [1, 2],
      [3, 4],
      [5, 7],
    ]);
    expect(t.columns.map((c) => c.name)).toEqual(['x1', 'x2']);
    expect(t.columns[1].values).toEqual([2, 4, 7]);
    expect(() => readTable([[1, 2], [3]])).toThrow(/row 2 has 1 values but row 1 has 2/);
  });

  test('empty and unrecognised inputs are refused', () => {
    expect(() => readTable([])).toThrow(/empty array/);
    expect(() => readTable({})).toThrow(/Cannot read/);
    expect(() => readTable(42)).toThrow(/Cannot read 42 as a table/);
    expect(() => readTable(null)).toThrow(/no input/);
    expect(() => readTable([{ a: 1 }, 7])).toThrow(/row 2 is 7, not an object/);
    expect(() => readTable([{ a: { nested: 1 } }])).toThrow(/row 1, column "a" holds object/);
  });

  test('unknown option names get a did-you-mean', () => {
    expect(() => readTable(records, { type: {} } as never)).toThrow(/unknown option "type". Did you mean "types"\?/);
  });

  test('an existing Table passes through, with new type declarations applied', () => {
    const t = readTable(records);
    expect(readTable(t)).toBe(t);
    const t2 = readTable(t, { types: { trips: 'categorical' } });
    expect(t2.columns[1].declared).toBe('categorical');
  });
});
