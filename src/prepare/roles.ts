// Column roles: the id, the used (feature) columns with their types, and the profile-only columns.
import { KinsortError } from '../core/errors';
import { checkTypeOverrides } from '../table/read';
import { requireColumn } from '../table/names';
import { cellNumber } from '../table/cells';
import type { Cell, DeclaredType, Table } from '../table/types';
import type { PrepareOptions } from './types';

export interface UsedColumn {
  name: string;
  type: DeclaredType;
  /** ordinal only: level order, lowest first. */
  ordinalLevels?: string[];
}

export interface Roles {
  idColumn: string | null;
  use: UsedColumn[];
  keep: string[];
  notes: string[];
}

function nameList(value: unknown, option: string, names: readonly string[]): string[] {
  if (value === undefined) return [];
  if (!Array.isArray(value)) {
    throw new KinsortError(`prepareTable: ${option} must be an array of column names.`, 'bad-option');
  }
  const list = value.map((v) => requireColumn(v, names, `prepareTable ${option}`));
  const dup = list.find((n, i) => list.indexOf(n) !== i);
  if (dup !== undefined) throw new KinsortError(`prepareTable: ${option} lists "${dup}" twice.`, 'bad-option');
  return list;
}

/** Every cell present and a distinct whole number (at least 3 rows): it reads like a row id. */
function looksLikeRowIds(values: readonly Cell[]): boolean {
  if (values.length < 3) return false;
  const seen = new Set<number>();
  for (const v of values) {
    const n = v === null ? undefined : cellNumber(v);
    if (n === undefined || !Number.isInteger(n) || seen.has(n)) return false;
    seen.add(n);
  }
  return true;
}

export function resolveRoles(table: Table, opts: PrepareOptions): Roles {
  const names = table.columns.map((c) => c.name);
  const notes: string[] = [];
  const idColumn = opts.id === undefined ? null : requireColumn(opts.id, names, 'prepareTable id');
  const keep = nameList(opts.keep, 'keep', names);
  const overrides = checkTypeOverrides(names, opts.types, opts.ordinalLevels, 'prepareTable');
  if (idColumn !== null && keep.includes(idColumn)) {
    throw new KinsortError(`prepareTable: "${idColumn}" is the id column; it cannot also be in keep.`, 'bad-option');
  }
  let useNames: string[];
  if (opts.use !== undefined) {
    useNames = nameList(opts.use, 'use', names);
    for (const n of useNames) {
      if (n === idColumn) {
        throw new KinsortError(`prepareTable: "${n}" is the id column; it cannot also be a feature in use.`, 'bad-option');
      }
      if (keep.includes(n)) {
        throw new KinsortError(`prepareTable: "${n}" is in both use and keep; a column is either a feature or profile-only.`, 'bad-option');
      }
    }
  } else {
    useNames = [];
    const text: string[] = [];
    for (const c of table.columns) {
      if (c.name === idColumn || keep.includes(c.name)) continue;
      const declared = overrides.types.get(c.name) ?? c.declared;
      if (c.rowNames && declared === undefined) continue;
      if (declared === undefined && c.inferred === 'text') text.push(c.name);
      else useNames.push(c.name);
    }
    if (text.length > 0) {
      notes.push(
        `Not used as features because they read as free text (mostly distinct values): ${text.join(', ')}. ` +
          `Declare a type in types, or list them in use or keep.`,
      );
    }
  }
  if (useNames.length === 0) throw new KinsortError('prepareTable: no feature columns to use.', 'empty');
  for (const name of [...useNames, ...keep]) {
    const column = table.columns.find((c) => c.name === name)!;
    if (column.commaNumberRow !== undefined && (overrides.types.get(name) ?? column.declared) === undefined) {
      const cell = column.values[column.commaNumberRow];
      throw new KinsortError(
        `prepareTable: column "${name}" holds numbers written with a decimal comma or thousands separator ` +
          `(row ${column.commaNumberRow + 1}: ${JSON.stringify(cell)}); kinsort does not guess which. Read the data with ` +
          `decimalMark: ',' if "," is the decimal mark, remove thousands separators, or declare the column's type ` +
          `(types: { "${name}": 'categorical' }) to keep the texts as levels.`,
        'bad-input',
      );
    }
  }
  if (idColumn === null) {
    for (const name of useNames) {
      const column = table.columns.find((c) => c.name === name)!;
      if (looksLikeRowIds(column.values)) {
        notes.push(
          `Column "${name}" holds a different whole number in every row, as a row id does, and it is used as a ` +
            `feature because no id column is named. If it identifies rows, give { id: '${name}' }.`,
        );
      }
    }
  }

  const use = useNames.map((name): UsedColumn => {
    const column = table.columns.find((c) => c.name === name)!;
    const type = overrides.types.get(name) ?? column.declared ?? column.inferred;
    if (type === 'text') {
      throw new KinsortError(
        `prepareTable: column "${name}" reads as free text (mostly distinct values), so it cannot be a ` +
          `feature as it is. Declare it in types (e.g. { "${name}": 'categorical' }) or move it to keep.`,
        'bad-input',
      );
    }
    const levels = overrides.levels.get(name) ?? column.ordinalLevels;
    if (type === 'ordinal') {
      if (levels === undefined) {
        throw new KinsortError(`prepareTable: column "${name}" is ordinal; give its level order in ordinalLevels.`, 'bad-option');
      }
      return { name, type, ordinalLevels: [...levels] };
    }
    return { name, type };
  });
  return { idColumn, use, keep, notes };
}
