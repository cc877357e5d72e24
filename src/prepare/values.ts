// One cell → the number the transform works on, refusing bad cells by row and column. Numbers and
// levels are read under the text rule (table/cells.ts), never by a looser parse.
import { KinsortError } from '../core/errors';
import { cellNumber, isTrueFalse, levelKey, type DecimalMark } from '../table/cells';
import type { Cell } from '../table/types';

export type LevelMatch = 'exact' | 'ascii-case';

/** A present numeric cell, after log1p when asked. Text, ±Infinity and (under log) negatives are refused. */
export function numericCell(
  cell: Exclude<Cell, null>,
  column: string,
  log: boolean,
  where: (row: number) => string,
  row: number,
  decimalMark: DecimalMark = '.',
): number {
  const v = cellNumber(cell, decimalMark);
  if (v === undefined) {
    throw new KinsortError(
      `${where(row)}, column "${column}" holds ${JSON.stringify(cell)}, which is not a number under the text rule ` +
        `(plain digits, optional "-", ${decimalMark === ',' ? 'decimal comma' : 'decimal point'} and exponent; no "+", leading zeros, ` +
        `tabs or Infinity), but the column is used as numeric. Fix or blank the cell, or declare the column's type ` +
        `(types: { "${column}": 'categorical' }).`,
      'bad-input',
    );
  }
  if (!Number.isFinite(v)) {
    throw new KinsortError(
      `${where(row)}, column "${column}" is ${v}; only finite numbers can be used (blank the cell to treat it ` + `as missing).`,
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

/**
 * A numeric column's cells with every present text parsed once under the text rule (numbers stay
 * numbers, null stays missing); a text that is not a number is refused naming the row and column.
 */
export function parseNumericColumn(
  cells: readonly Cell[],
  column: string,
  where: (row: number) => string,
  decimalMark: DecimalMark,
): Cell[] {
  const out = new Array<Cell>(cells.length);
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (c === null || typeof c === 'number') {
      out[i] = c;
      continue;
    }
    const v = cellNumber(c, decimalMark);
    out[i] = v === undefined ? numericCell(c, column, false, where, i, decimalMark) : v;
  }
  return out;
}

/** Level → code lookup, built once per column. */
export interface LevelCodes {
  readonly levels: readonly string[];
  readonly match: LevelMatch;
  readonly byKey: ReadonlyMap<string, number>;
}

/** The key a text is looked up by: itself, or (ascii-case) true/false in lower case. */
function matchKey(text: string, match: LevelMatch): string {
  return match === 'ascii-case' && isTrueFalse(text) ? text.toLowerCase() : text;
}

export function levelCodes(levels: readonly string[], match: LevelMatch = 'exact'): LevelCodes {
  return { levels, match, byKey: new Map(levels.map((l, k) => [matchKey(l, match), k])) };
}

/** Code of a present cell's level, or -1 when it is not among the levels. */
export function levelIndex(cell: Exclude<Cell, null>, codes: LevelCodes): number {
  return codes.byKey.get(matchKey(levelKey(cell), codes.match)) ?? -1;
}

/** Like levelIndex, but a level outside `levels` is an error (binary and ordinal columns). */
export function requireLevel(
  cell: Exclude<Cell, null>,
  codes: LevelCodes,
  column: string,
  kind: string,
  where: (row: number) => string,
  row: number,
): number {
  const k = levelIndex(cell, codes);
  if (k < 0) {
    throw new KinsortError(
      `${where(row)}, column "${column}" holds ${JSON.stringify(levelKey(cell))}, which is not one of the ` +
        `${kind} column's levels (compared ${codes.match === 'exact' ? 'exactly, text as given' : 'ignoring ASCII letter case'}): ` +
        `${codes.levels.map((l) => JSON.stringify(l)).join(', ')}.`,
      'bad-input',
    );
  }
  return k;
}
