// readTable: any supported input shape → a plain Table with inferred (or declared) column types.
import { KinsortError, checkChoice } from '../core/errors';
import { checkOptions } from '../core/options';
import { DECIMAL_MARKS, DEFAULT_MISSING_MARKERS, normaliseCell, trimSpaces, type DecimalMark } from './cells';
import { parseCsvText, readCsvText, type RawColumns } from './csv';
import { inferType } from './infer';
import { checkHeader, requireColumn } from './names';
import { rawColumnsFromShape } from './shapes';
import { isTable, type DeclaredType, type Table, type TableColumn } from './types';

export const DECLARED_TYPES: readonly DeclaredType[] = ['numeric', 'binary', 'categorical', 'ordinal'];

export interface ReadTableOptions {
  /** Declare column types instead of inferring them. */
  types?: Record<string, DeclaredType>;
  /** Level order (lowest first) of ordinal columns; naming a column here makes it ordinal. */
  ordinalLevels?: Record<string, readonly (string | number)[]>;
  /**
   * Texts that mean missing besides an empty cell, compared after trimming ASCII spaces
   * (default: NA, N/A, n/a, #N/A, NaN, nan, null, NULL).
   */
  missingMarkers?: readonly string[];
  /** The decimal mark of numbers written as text: '.' (default) or ',' ("1,5" is one and a half). */
  decimalMark?: DecimalMark;
  /** CSV only: the field delimiter; detected among , ; and tab when absent. */
  delimiter?: ',' | ';' | '\t';
  /** CSV files only: the text encoding when it is not UTF-8 (e.g. 'windows-1252', 'latin1', 'utf-16le'). */
  encoding?: string;
}

const READ_OPTIONS = ['types', 'ordinalLevels', 'missingMarkers', 'decimalMark', 'delimiter', 'encoding'];

/** The name given to a CSV's unnamed first column (R's write.csv and pandas' to_csv write row names / an index there). */
export const ROW_NAME_COLUMN = 'row_name';

/** The missing markers to read with: the given list (each a string, no control characters) or the default. */
export function checkMissingMarkers(markers: unknown, where: string): string[] {
  if (markers === undefined) return [...DEFAULT_MISSING_MARKERS];
  if (!Array.isArray(markers) || markers.some((m) => typeof m !== 'string')) {
    throw new KinsortError(`${where}: missingMarkers must be an array of texts.`, 'bad-option');
  }
  // An empty cell is always missing, so '' in the list adds nothing.
  const list = markers.map((m) => trimSpaces(m as string)).filter((m) => m !== '');
  const bad = list.find((m) => /[\u0000-\u001f\u007f]/.test(m));
  if (bad !== undefined) {
    throw new KinsortError(`${where}: missing marker ${JSON.stringify(bad)} holds a control character.`, 'bad-option');
  }
  return Array.from(new Set(list));
}

/** The type overrides of `types` / `ordinalLevels`, checked against the column names. */
export function checkTypeOverrides(
  names: readonly string[],
  types: Record<string, unknown> | undefined,
  ordinalLevels: Record<string, readonly unknown[]> | undefined,
  where: string,
): { types: Map<string, DeclaredType>; levels: Map<string, string[]> } {
  const declared = new Map<string, DeclaredType>();
  const levels = new Map<string, string[]>();
  for (const [name, type] of Object.entries(types ?? {})) {
    requireColumn(name, names, `${where} types`);
    declared.set(name, checkChoice(type, DECLARED_TYPES, `column type for "${name}"`));
  }
  for (const [name, order] of Object.entries(ordinalLevels ?? {})) {
    requireColumn(name, names, `${where} ordinalLevels`);
    if (!Array.isArray(order) || order.length < 2) {
      throw new KinsortError(`${where} ordinalLevels.${name} must list at least two levels, lowest first.`, 'bad-option');
    }
    // Levels are the user's text, compared exactly (numbers as JavaScript prints them).
    const keys = order.map((l) => String(l));
    const dup = keys.find((k, i) => keys.indexOf(k) !== i);
    if (dup !== undefined) {
      throw new KinsortError(`${where} ordinalLevels.${name} lists "${dup}" twice.`, 'bad-option');
    }
    const type = declared.get(name);
    if (type !== undefined && type !== 'ordinal') {
      throw new KinsortError(`${where}: column "${name}" is declared ${type} but also given ordinalLevels; pick one.`, 'bad-option');
    }
    declared.set(name, 'ordinal');
    levels.set(name, keys);
  }
  for (const [name, type] of declared) {
    if (type === 'ordinal' && !levels.has(name)) {
      throw new KinsortError(
        `${where}: column "${name}" is declared ordinal; give its level order, lowest first, in ordinalLevels.`,
        'bad-option',
      );
    }
  }
  return { types: declared, levels };
}

export function checkDecimalMark(mark: unknown, where: string): DecimalMark {
  if (mark === undefined) return '.';
  return checkChoice(mark, DECIMAL_MARKS, `${where} decimalMark`);
}

function buildTable(raw: RawColumns, options: ReadTableOptions): Table {
  const notes = [...(raw.notes ?? [])];
  let names = raw.names;
  const rowNamed = raw.lines !== undefined && names.length > 1 && names[0] === '';
  if (rowNamed) {
    let name = ROW_NAME_COLUMN;
    for (let n = 2; names.includes(name); n++) name = `${ROW_NAME_COLUMN}_${n}`;
    names = [name, ...names.slice(1)];
    notes.push(
      `The CSV's first column has no name in the header, as R's write.csv and pandas' to_csv write row names ` +
        `or an index: it is read as the row-name column "${name}" (not a feature unless listed in use; give ` +
        `{ id: '${name}' } to use it as the id).`,
    );
  }
  checkHeader(names, raw.source);
  const rowCount = raw.columns[0]?.length ?? 0;
  if (rowCount === 0) throw new KinsortError(`${raw.source} has a header but no rows.`, 'empty');
  const missingMarkers = checkMissingMarkers(options.missingMarkers, 'readTable');
  const decimalMark = checkDecimalMark(options.decimalMark, 'readTable');
  const markers = new Set(missingMarkers);
  const { types, levels } = checkTypeOverrides(names, options.types, options.ordinalLevels, 'readTable');
  const columns: TableColumn[] = names.map((name, j) => {
    const where = (i: number) =>
      raw.lines ? `${raw.source}: line ${raw.lines[i]}, column "${name}"` : `${raw.source}: row ${i + 1}, column "${name}"`;
    const values = raw.columns[j].map((value, i) => normaliseCell(value, markers, where, i));
    const inference = inferType(values, decimalMark);
    const column: TableColumn = { name, values, inferred: inference.type };
    if (inference.anyCase) Object.assign(column, { anyCase: true });
    if (inference.commaNumberRow !== undefined) Object.assign(column, { commaNumberRow: inference.commaNumberRow });
    if (rowNamed && j === 0) Object.assign(column, { rowNames: true });
    const declared = types.get(name);
    if (declared !== undefined) Object.assign(column, { declared });
    if (levels.has(name)) Object.assign(column, { ordinalLevels: levels.get(name) });
    return column;
  });
  return { kind: 'table', rowCount, columns, missingMarkers, decimalMark, notes };
}

/** Apply new type overrides to an existing table (values are not re-read). */
function redeclare(table: Table, options: ReadTableOptions): Table {
  const names = table.columns.map((c) => c.name);
  const { types, levels } = checkTypeOverrides(names, options.types, options.ordinalLevels, 'readTable');
  if (types.size === 0) return table;
  const columns = table.columns.map((c) => {
    const declared = types.get(c.name);
    if (declared === undefined) return c;
    return { ...c, declared, ...(levels.has(c.name) ? { ordinalLevels: levels.get(c.name) } : {}) };
  });
  return { ...table, columns };
}

/**
 * Read records, a column object, CSV text, `number[][]`, a dataframe-like object, or an existing
 * Table into a Table. Types are inferred per column unless declared in `types` / `ordinalLevels`.
 */
export function readTable(input: unknown, options?: ReadTableOptions): Table {
  const opts = checkOptions(options, READ_OPTIONS, 'readTable');
  if (isTable(input)) {
    for (const key of ['missingMarkers', 'decimalMark', 'delimiter', 'encoding'] as const) {
      if (opts[key] !== undefined) {
        throw new KinsortError(
          `readTable: the input is already a Table, read once; ${key} applies when reading text or records.`,
          'bad-option',
        );
      }
    }
    return redeclare(input, opts);
  }
  if (opts.encoding !== undefined) {
    throw new KinsortError(
      'readTable: the encoding option applies to CSV files (readCsvFile); text in memory is already decoded.',
      'bad-option',
    );
  }
  if (typeof input === 'string') return buildTable(parseCsvText(input, opts.delimiter), opts);
  if (opts.delimiter !== undefined) {
    throw new KinsortError('readTable: the delimiter option applies to CSV text only.', 'bad-option');
  }
  if (input === undefined || input === null) throw new KinsortError('readTable: no input given.', 'empty');
  return buildTable(rawColumnsFromShape(input), opts);
}

/** Read a CSV file (UTF-8 unless `encoding` says otherwise; BOM stripped; `,` `;` or tab detected) into a Table. */
export function readCsvFile(path: string, options?: ReadTableOptions): Table {
  const opts = checkOptions(options, READ_OPTIONS, 'readCsvFile');
  if (typeof path !== 'string' || path === '') throw new KinsortError('readCsvFile: give a file path.', 'bad-argument');
  return buildTable(readCsvText(path, opts.delimiter, opts.encoding), opts);
}

/** The column named `name`, or a clear error with a "did you mean". */
export function tableColumn(table: Table, name: string, what = 'table'): TableColumn {
  requireColumn(
    name,
    table.columns.map((c) => c.name),
    what,
  );
  return table.columns.find((c) => c.name === name)!;
}
