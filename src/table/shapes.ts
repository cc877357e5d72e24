// Recognise an input by its shape (no dataframe package is imported) and turn it into named
// columns of raw values.
import { KinsortError } from '../core/errors';
import { describe } from '../core/options';
import type { RawColumns } from './csv';

type Dict = Record<string, unknown>;

function isPlainObject(value: unknown): value is Dict {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && !ArrayBuffer.isView(value);
}

function isArrayLike(value: unknown): value is ArrayLike<unknown> {
  return Array.isArray(value) || (ArrayBuffer.isView(value) && !(value instanceof DataView));
}

function requireRows(n: number, source: string): void {
  if (n === 0) throw new KinsortError(`${source} has no rows.`, 'empty');
}

/** Array of records `{col: value}`; a key absent from a record is a missing value there. */
function fromRecords(records: readonly unknown[]): RawColumns {
  const names: string[] = [];
  const seen = new Set<string>();
  records.forEach((record, i) => {
    if (!isPlainObject(record)) {
      throw new KinsortError(`records: row ${i + 1} is ${describe(record)}, not an object of {column: value}.`, 'bad-input');
    }
    for (const key of Object.keys(record)) {
      if (!seen.has(key)) {
        seen.add(key);
        names.push(key);
      }
    }
  });
  const columns = names.map((name) => records.map((r) => (r as Dict)[name]));
  return { names, columns, source: 'records' };
}

/** Plain `number[][]`: columns are named x1..xd. */
function fromNestedRows(rows: readonly unknown[], source = 'rows', names?: string[]): RawColumns {
  const width = names ? names.length : (rows[0] as ArrayLike<unknown>).length;
  rows.forEach((row, i) => {
    if (!isArrayLike(row)) throw new KinsortError(`${source}: row ${i + 1} is not an array.`, 'bad-input');
    if (row.length !== width) {
      throw new KinsortError(
        `${source}: row ${i + 1} has ${row.length} values but ${names ? 'there are' : 'row 1 has'} ${width}` +
          `${names ? ' column names' : ''}; every row needs the same columns.`,
        'ragged',
      );
    }
  });
  const columnNames = names ?? Array.from({ length: width }, (_, j) => `x${j + 1}`);
  const columns = columnNames.map((_, j) => rows.map((row) => (row as ArrayLike<unknown>)[j]));
  return { names: columnNames, columns, source };
}

/** `{col: values[]}`, every array the same length. */
function fromColumnObject(object: Dict): RawColumns {
  const names = Object.keys(object);
  if (names.length === 0) throw new KinsortError('column object has no columns.', 'empty');
  const lengths = names.map((n) => (object[n] as ArrayLike<unknown>).length);
  const first = lengths[0];
  const differ = names.filter((_, j) => lengths[j] !== first);
  if (differ.length > 0) {
    const shown = names.map((n, j) => `"${n}" (${lengths[j]})`).join(', ');
    throw new KinsortError(`column object: columns have different lengths: ${shown}; every column needs one value per row.`, 'ragged');
  }
  requireRows(first, 'column object');
  return { names, columns: names.map((n) => Array.from(object[n] as ArrayLike<unknown>)), source: 'column object' };
}

/** arquero-like: `columnNames()` and `array(name)`. */
function fromColumnAccessors(table: { columnNames(): string[]; array(name: string): ArrayLike<unknown> }): RawColumns {
  const names = [...table.columnNames()];
  const columns = names.map((n) => Array.from(table.array(n)));
  return { names, columns, source: 'table object' };
}

/** Everything but CSV text: recognised by shape. */
export function rawColumnsFromShape(input: unknown): RawColumns {
  if (Array.isArray(input)) {
    if (input.length === 0) throw new KinsortError('input is an empty array: no rows.', 'empty');
    if (isArrayLike(input[0])) return fromNestedRows(input);
    if (isPlainObject(input[0])) return fromRecords(input);
    throw new KinsortError(
      `input is an array whose first item is ${describe(input[0])}; expected records ({column: value}) ` + `or rows of numbers.`,
      'bad-input',
    );
  }
  if (typeof input === 'object' && input !== null) {
    const o = input as Dict;
    if (typeof o.columnNames === 'function' && typeof o.array === 'function') {
      return fromColumnAccessors(o as never);
    }
    if (Array.isArray(o.columns) && Array.isArray(o.values) && o.columns.every((c) => typeof c === 'string')) {
      requireRows(o.values.length, 'dataframe values');
      return fromNestedRows(o.values, 'dataframe values', o.columns as string[]);
    }
    if (Array.isArray(o.$columns) && Array.isArray(o.$data)) {
      requireRows(o.$data.length, 'dataframe $data');
      return fromNestedRows(o.$data, 'dataframe $data', o.$columns as string[]);
    }
    const keys = Object.keys(o);
    if (keys.length > 0 && keys.every((k) => isArrayLike(o[k]))) return fromColumnObject(o);
  }
  throw new KinsortError(
    `Cannot read ${describe(input)} as a table. Give records ([{column: value}]), a column object ` +
      `({column: [values]}), CSV text, rows of numbers (number[][]), or a dataframe-like object ` +
      `({columns, values}, {$columns, $data}, or one with columnNames() and array(name)).`,
    'bad-input',
  );
}
