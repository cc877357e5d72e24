// What a variable tree reads: numeric rows with column names, or a table whose columns are
// numeric, binary (two levels, coded 0/1) or ordinal (level ranks). Unordered categorical and text
// columns are refused with the reason: a correlation needs an order or exactly two levels.
import { cellNumber } from '../../table/cells';
import { KinsortError } from '../../core/errors';
import { createMatrix, isMatrix, toMatrix, type Matrix, type RowsInput } from '../../core/matrix';
import { isTable, type Table, type TableColumn } from '../../table/types';

export interface VariableInput {
  matrix: Matrix;
  names: string[];
  /** How each column entered: 'numeric', 'binary 0 = "a", 1 = "b"', 'ordinal ranks'. */
  entered: string[];
}

export function readVariables(
  input: RowsInput | Table,
  names: readonly string[] | undefined,
  columns: readonly string[] | undefined,
  where: string,
): VariableInput {
  if (isTable(input)) return fromTable(input, columns, where);
  if (columns !== undefined)
    throw new KinsortError(`${where}: option columns picks columns of a table; for rows give names.`, 'bad-option');
  const m = toMatrix(input as RowsInput, { what: `${where}: rows`, minRows: 3 });
  const given = names ?? (isMatrix(input) ? input.colNames : undefined);
  const out = given ? [...given].map(String) : Array.from({ length: m.cols }, (_, j) => `column ${j + 1}`);
  if (out.length !== m.cols) throw new KinsortError(`${where}: ${out.length} names for ${m.cols} columns.`, 'bad-option');
  if (m.cols < 2) throw new KinsortError(`${where}: a tree of variables needs at least 2 columns; got ${m.cols}.`, 'empty');
  return { matrix: m, names: out, entered: out.map(() => 'numeric') };
}

function fromTable(table: Table, columns: readonly string[] | undefined, where: string): VariableInput {
  const picked: TableColumn[] = [];
  if (columns) {
    for (const name of columns) {
      const c = table.columns.find((col) => col.name === name);
      if (!c) throw new KinsortError(`${where}: no column "${name}" in the table.`, 'unknown-column');
      picked.push(c);
    }
  } else {
    picked.push(...table.columns.filter((c) => (c.declared ?? c.inferred) !== 'text'));
  }
  if (picked.length < 2) throw new KinsortError(`${where}: a tree of variables needs at least 2 columns; got ${picked.length}.`, 'empty');
  const n = table.rowCount;
  const data = new Float64Array(n * picked.length);
  const entered: string[] = [];
  picked.forEach((c, j) => {
    const type = c.declared ?? c.inferred;
    let code: (v: number | string) => number;
    if (type === 'numeric') {
      entered.push('numeric');
      // Table cells are text as given; the text rule (table/cells.ts) reads the number.
      const mark = table.decimalMark ?? '.';
      code = (v) => cellNumber(v, mark) ?? NaN;
    } else if (type === 'binary') {
      const levels = [...new Set(c.values.filter((v) => v !== null).map(String))].sort();
      entered.push(`binary: "${levels[0]}" = 0, "${levels[1]}" = 1`);
      code = (v) => levels.indexOf(String(v));
    } else if (type === 'ordinal' && c.ordinalLevels) {
      const levels = c.ordinalLevels.map(String);
      entered.push('ordinal: level rank 0, 1, … lowest first');
      code = (v) => levels.indexOf(String(v));
    } else {
      const count = new Set(c.values.filter((v) => v !== null)).size;
      throw new KinsortError(
        `${where}: column "${c.name}" is ${type} with ${count} unordered levels. A correlation needs an order or exactly two ` +
          'levels; a correlation ratio would measure something else (it is not symmetric, and not defined between two such ' +
          'columns), so heights would not be comparable. Leave it out (list the columns to use), declare its order ' +
          '(types: { … : "ordinal" } with ordinalLevels), or make indicator columns yourself.',
        'not-supported',
      );
    }
    for (let i = 0; i < n; i++) {
      const v = c.values[i];
      const x = v === null ? NaN : code(v);
      if (!Number.isFinite(x) || (x < 0 && type !== 'numeric')) {
        throw new KinsortError(
          `${where}: row ${i + 1}, column "${c.name}" ${v === null ? 'is missing' : `holds ${JSON.stringify(v)}`}; a variable ` +
            'tree needs every value (pairwise deletion would correlate different rows for different pairs). Drop or fill those rows first.',
          v === null ? 'missing-value' : 'bad-input',
        );
      }
      data[i * picked.length + j] = x;
    }
  });
  if (n < 3) throw new KinsortError(`${where}: ${n} row(s); correlations need at least 3.`, 'empty');
  return { matrix: createMatrix(n, picked.length, data), names: picked.map((c) => c.name), entered };
}
