// One cell → the number the transform works on, refusing bad cells by row and column.
import { KinsortError } from '../core/errors';
import { cellNumber, levelKey } from '../table/cells';
import type { Cell } from '../table/types';

/** A present numeric cell, after log1p when asked. Text, ±Infinity and (under log) negatives are refused. */
export function numericCell(cell: Exclude<Cell, null>, column: string, log: boolean, where: () => string): number {
  const v = cellNumber(cell);
  if (v === undefined) {
    throw new KinsortError(
      `${where()}, column "${column}" holds ${JSON.stringify(cell)}, which is not a number, but the column ` +
        `is used as numeric. Fix or blank the cell, or declare the column's type (types: { "${column}": ` +
        `'categorical' }).`,
      'bad-input',
    );
  }
  if (!Number.isFinite(v)) {
    throw new KinsortError(
      `${where()}, column "${column}" is ${v}; only finite numbers can be used (blank the cell to treat it ` +
        `as missing).`,
      'not-finite',
    );
  }
  if (!log) return v;
  if (v < 0) {
    throw new KinsortError(
      `${where()}, column "${column}" is ${v}, but log1p is asked for this column and needs values ≥ 0.`,
      'bad-input',
    );
  }
  return Math.log1p(v);
}

/** Index of a present cell's level in `levels`, or -1 when it is not among them. */
export function levelIndex(cell: Exclude<Cell, null>, levels: readonly string[]): number {
  return levels.indexOf(levelKey(cell));
}

/** Like levelIndex, but a level outside `levels` is an error (binary and ordinal columns). */
export function requireLevel(
  cell: Exclude<Cell, null>,
  levels: readonly string[],
  column: string,
  kind: string,
  where: () => string,
): number {
  const k = levelIndex(cell, levels);
  if (k < 0) {
    throw new KinsortError(
      `${where()}, column "${column}" holds ${JSON.stringify(levelKey(cell))}, which is not one of the ` +
        `${kind} column's levels: ${levels.map((l) => JSON.stringify(l)).join(', ')}.`,
      'bad-input',
    );
  }
  return k;
}
