// Type inference from values alone, under the text rule (cells.ts). The person can always
// override with `types`.
import { cellNumber, isTrueFalse, levelKey, looksLikeCode, looksLikeCommaNumber, type DecimalMark } from './cells';
import type { Cell, InferredType } from './types';

/** Columns with more distinct non-numeric values than this (and mostly unique) read as free text. */
const TEXT_MIN_DISTINCT = 20;

export interface Inference {
  type: InferredType;
  /** binary: the two levels are true/false in ASCII letters of any case (one column, not three levels). */
  anyCase?: boolean;
  /** 0-based row of the first cell written with a decimal comma or thousands separators, when the rest are numbers. */
  commaNumberRow?: number;
}

/**
 * numeric: every non-missing value is a number, or most are and no cell is a code (the few text
 * cells are then refused by name at preparation: text in a numeric column is a classic input error,
 * never silently a level); a column holding a code ("007", "+5") is categorical;
 * binary: exactly two distinct texts, or true/false in any letter case; text: mostly-unique strings
 * (names, comments); categorical otherwise. An all-missing column reads as numeric.
 */
export function inferType(values: readonly Cell[], decimalMark: DecimalMark = '.'): Inference {
  let present = 0;
  let numeric = 0;
  let trueFalse = 0;
  let codes = 0;
  let commaRow = -1;
  let commaOrNumber = 0;
  // Counting distinct values past this cap changes no decision below (binary needs exactly 2; text
  // needs more than TEXT_MIN_DISTINCT and more than half the present values).
  const cap = Math.max(TEXT_MIN_DISTINCT, values.length / 2) + 1;
  const distinct = new Set<string>();
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null) continue;
    present++;
    const n = cellNumber(v, decimalMark);
    if (n !== undefined) {
      numeric++;
      commaOrNumber++;
    } else if (decimalMark === '.' && looksLikeCommaNumber(v)) {
      commaOrNumber++;
      if (commaRow < 0) commaRow = i;
    } else if (looksLikeCode(v)) codes++;
    if (typeof v === 'string' && isTrueFalse(v)) trueFalse++;
    if (distinct.size <= cap) distinct.add(levelKey(v));
  }
  if (present === 0) return { type: 'numeric' };
  if (trueFalse === present && distinct.size > 2) return { type: 'binary', anyCase: true };
  if (distinct.size === 2) return trueFalse === present ? { type: 'binary', anyCase: true } : { type: 'binary' };
  if (commaRow >= 0 && commaOrNumber === present) return { type: 'categorical', commaNumberRow: commaRow };
  if (numeric === present) return { type: 'numeric' };
  if (codes === 0 && numeric * 2 > present) return { type: 'numeric' };
  if (distinct.size > TEXT_MIN_DISTINCT && distinct.size * 2 > present) return { type: 'text' };
  return { type: 'categorical' };
}
