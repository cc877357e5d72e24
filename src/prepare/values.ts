// One cell → the number the transform works on, refusing bad cells by row and column.
import { KinsortError } from '../core/errors';
import { cellNumber, levelKey } from '../table/cells';
import type { Cell } from '../table/types';

/** A present numeric cell, after log1p when asked. Text, ±Infinity and (under log) negatives are refused. */
export function numericCell(
  cell: Exclude<Cell, null>,
  column: string,
  log: boolean,
  where: (row: number) => string,
  row: number,
): number {
  const v = cellNumber(cell);
  if (v === undefined) {
    throw new KinsortError(
      `${where(row)}, column "${column}" holds ${JSON.stringify(cell)}, which is not a number, but the column ` +
        `is used as numeric. Fix or blank the cell, or declare the column's type (types: { "${column}": ` +
        `'categorical' }).`,
      'bad-input',
    );
  }
  if (!Number.isFinite(v)) {
    throw new KinsortError(
      `${where(row)}, column "${column}" is ${v}; only finite numbers can be used (blank the cell to treat it ` +
        `as missing).`,
      'not-finite',
    );
  }
  if (!log) return v;
  if (v < 0) {
    throw new KinsortError(
      `${where(row)}, column "${column}" is ${v}, but log1p is asked for this column and needs values ≥ 0.`,
      'bad-input',
    );
  }
  return Math.log1p(v);
}

/** Level → code lookup, built once per column. */
export function levelCodes(levels: readonly string[]): Map<string, number> {
  return new Map(levels.map((l, k) => [l, k]));
}

/** Code of a present cell's level, or -1 when it is not among the levels. */
export function levelIndex(cell: Exclude<Cell, null>, codes: ReadonlyMap<string, number>): number {
  return codes.get(levelKey(cell)) ?? -1;
}

/** Like levelIndex, but a level outside `levels` is an error (binary and ordinal columns). */
export function requireLevel(
  cell: Exclude<Cell, null>,
  codes: ReadonlyMap<string, number>,
  column: string,
  kind: string,
  where: (row: number) => string,
  row: number,
): number {
  const k = levelIndex(cell, codes);
  if (k < 0) {
    throw new KinsortError(
      `${where(row)}, column "${column}" holds ${JSON.stringify(levelKey(cell))}, which is not one of the ` +
        `${kind} column's levels: ${[...codes.keys()].map((l) => JSON.stringify(l)).join(', ')}.`,
      'bad-input',
    );
  }
  return k;
}
