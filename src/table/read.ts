// readTable: any supported input shape → a plain Table with inferred (or declared) column types.
import { KinsortError, checkChoice } from '../core/errors';
import { checkOptions } from '../core/options';
import { DEFAULT_MISSING_MARKERS, normaliseCell } from './cells';
import { parseCsvText, type RawColumns } from './csv';
import { readRegularTextFile } from './file-text';
import { convertNumbers, inferType } from './infer';
import { checkHeader, requireColumn } from './names';
import { rawColumnsFromShape } from './shapes';
import { isTable, type DeclaredType, type Table, type TableColumn } from './types';

export const DECLARED_TYPES: readonly DeclaredType[] = ['numeric', 'binary', 'categorical', 'ordinal'];

export interface ReadTableOptions {
  /** Declare column types instead of inferring them. */
  types?: Record<string, DeclaredType>;
  /** Level order (lowest first) of ordinal columns; naming a column here makes it ordinal. */
  ordinalLevels?: Record<string, readonly (string | number)[]>;
  /** Strings that mean missing (default: empty, NA, NaN, null, N/A), compared after trimming. */
  missingMarkers?: readonly string[];
  /** CSV only: the field delimiter; detected among , ; and tab when absent. */
  delimiter?: ',' | ';' | '\t';
}

const READ_OPTIONS = ['types', 'ordinalLevels', 'missingMarkers', 'delimiter'];

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
    const keys = order.map((l) => String(l).trim());
    const dup = keys.find((k, i) => keys.indexOf(k) !== i);
    if (dup !== undefined) {
      throw new KinsortError(`${where} ordinalLevels.${name} lists "${dup}" twice.`, 'bad-option');
    }
    const type = declared.get(name);
    if (type !== undefined && type !== 'ordinal') {
      throw new KinsortError(
        `${where}: column "${name}" is declared ${type} but also given ordinalLevels; pick one.`,
        'bad-option',
      );
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

function buildTable(raw: RawColumns, options: ReadTableOptions): Table {
  checkHeader(raw.names, raw.source);
  const rowCount = raw.columns[0]?.length ?? 0;
  if (rowCount === 0) throw new KinsortError(`${raw.source} has a header but no rows.`, 'empty');
  const markers = new Set((options.missingMarkers ?? DEFAULT_MISSING_MARKERS).map((m) => String(m).trim()));
  const { types, levels } = checkTypeOverrides(raw.names, options.types, options.ordinalLevels, 'readTable');
  const columns: TableColumn[] = raw.names.map((name, j) => {
    const where = (i: number) =>
      raw.lines ? `${raw.source}: line ${raw.lines[i]}, column "${name}"` : `${raw.source}: row ${i + 1}, column "${name}"`;
    const cells = raw.columns[j].map((value, i) => normaliseCell(value, markers, where, i));
    const inferred = inferType(cells);
    const declared = types.get(name);
    const values = convertNumbers(cells, declared === 'numeric' || (declared === undefined && inferred === 'numeric'));
    const column: TableColumn = { name, values, inferred };
    if (declared !== undefined) Object.assign(column, { declared });
    if (levels.has(name)) Object.assign(column, { ordinalLevels: levels.get(name) });
    return column;
  });
  return { kind: 'table', rowCount, columns };
}

/** Apply new type overrides to an existing table (values are not re-read). */
function redeclare(table: Table, options: ReadTableOptions): Table {
  const names = table.columns.map((c) => c.name);
  const { types, levels } = checkTypeOverrides(names, options.types, options.ordinalLevels, 'readTable');
  if (types.size === 0) return table;
  const columns = table.columns.map((c) => {
    const declared = types.get(c.name);
    if (declared === undefined) return c;
    const values = declared === 'numeric' ? convertNumbers(c.values, true) : c.values;
    return { ...c, values, declared, ...(levels.has(c.name) ? { ordinalLevels: levels.get(c.name) } : {}) };
  });
  return { kind: 'table', rowCount: table.rowCount, columns };
}

/**
 * Read records, a column object, CSV text, `number[][]`, a dataframe-like object, or an existing
 * Table into a Table. Types are inferred per column unless declared in `types` / `ordinalLevels`.
 */
export function readTable(input: unknown, options?: ReadTableOptions): Table {
  const opts = checkOptions(options, READ_OPTIONS, 'readTable');
  if (isTable(input)) return redeclare(input, opts);
  if (typeof input === 'string') return buildTable(parseCsvText(input, opts.delimiter), opts);
  if (opts.delimiter !== undefined) {
    throw new KinsortError('readTable: the delimiter option applies to CSV text only.', 'bad-option');
  }
  if (input === undefined || input === null) throw new KinsortError('readTable: no input given.', 'empty');
  return buildTable(rawColumnsFromShape(input), opts);
}

/** Read a CSV file (UTF-8; BOM stripped; `,` `;` or tab detected) into a Table. */
export function readCsvFile(path: string, options?: ReadTableOptions): Table {
  const opts = checkOptions(options, READ_OPTIONS, 'readCsvFile');
  return buildTable(csvFileColumns(path, opts.delimiter), opts);
}

/** A CSV file's header and cells: a regular file only, of bounded size (file-text.ts). */
function csvFileColumns(path: unknown, delimiter: string | undefined): RawColumns {
  if (typeof path !== 'string' || path === '') throw new KinsortError('readCsvFile: give a file path.', 'bad-argument');
  const text = readRegularTextFile(path, 'Cannot read CSV file');
  return { ...parseCsvText(text, delimiter), source: `CSV file "${path}"` };
}

/** The column named `name`, or a clear error with a "did you mean". */
export function tableColumn(table: Table, name: string, what = 'table'): TableColumn {
  requireColumn(name, table.columns.map((c) => c.name), what);
  return table.columns.find((c) => c.name === name)!;
}
