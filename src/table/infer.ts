// Type inference from values alone. The person can always override with `types`.
import { cellNumber, finiteNumber, levelKey } from './cells';
import type { Cell, InferredType } from './types';

/** Columns with more distinct non-numeric values than this (and mostly unique) read as free text. */
const TEXT_MIN_DISTINCT = 20;

/**
 * numeric: every non-missing value is a finite number, or most are (the few text cells are then
 * refused by name at preparation, since text in a numeric column is a classic input error);
 * binary: exactly two distinct values; text: mostly-unique strings (names, comments);
 * categorical otherwise. An all-missing column reads as numeric.
 */
export function inferType(values: readonly Cell[]): InferredType {
  let present = 0;
  let numeric = 0;
  // Counting distinct values past this cap changes no decision below (binary needs exactly 2; text
  // needs more than TEXT_MIN_DISTINCT and more than half the present values).
  const cap = Math.max(TEXT_MIN_DISTINCT, values.length / 2) + 1;
  const distinct = new Set<number | string>();
  for (const v of values) {
    if (v === null) continue;
    present++;
    const n = finiteNumber(v);
    if (n !== undefined) numeric++;
    if (distinct.size <= cap) distinct.add(n ?? levelKey(v));
  }
  if (present === 0) return 'numeric';
  if (distinct.size === 2) return 'binary';
  if (numeric * 2 > present) return 'numeric';
  if (distinct.size > TEXT_MIN_DISTINCT && distinct.size * 2 > present) return 'text';
  return 'categorical';
}

/**
 * Numeric-looking strings become numbers when the column reads as numbers (all its values do, or it
 * is numeric by inference or declaration); other cells are left as given.
 */
export function convertNumbers(values: Cell[], numericColumn: boolean): Cell[] {
  let all = true;
  for (const v of values) {
    if (v !== null && typeof v === 'string' && finiteNumber(v) === undefined) {
      all = false;
      break;
    }
  }
  if (!all && !numericColumn) return values;
  return values.map((v) => {
    if (typeof v !== 'string') return v;
    const n = cellNumber(v);
    return n === undefined ? v : n;
  });
}
