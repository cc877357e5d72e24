// The text rule `kinsort-text-1` (docs/stored-schema.md): the one place that says what a cell's
// text means — missing, a number, a level. Intake, preparation and assign all call these; the SQL
// side implements the same rule from the name and the lists stored in a definition.
import { KinsortError } from '../core/errors';
import type { Cell } from './types';

/** Name of the rule below, stored in every definition so scoring never guesses. */
export const TEXT_RULE = 'kinsort-text-1';

/** Strings that mean "no value" unless the caller gives its own list (compared after trimming ASCII spaces). */
export const DEFAULT_MISSING_MARKERS: readonly string[] = ['NA', 'N/A', 'n/a', '#N/A', 'NaN', 'nan', 'null', 'NULL'];

/** The character between a number's whole part and its fraction. */
export type DecimalMark = '.' | ',';
export const DECIMAL_MARKS: readonly DecimalMark[] = ['.', ','];

const NUMBER_DOT = /^-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?$/;
const NUMBER_COMMA = /^-?(0|[1-9][0-9]*)(,[0-9]+)?([eE][+-]?[0-9]+)?$/;
/** Text that a reader would take for a number written with a decimal comma or thousands separators. */
const COMMA_NUMBER = /^-?[0-9]{1,3}(,[0-9]{3})+(\.[0-9]+)?$|^-?[0-9]+,[0-9]+$/;
/** Codes: digits with a leading zero, or a number with a plus sign. Never numbers; they make a column categorical. */
const CODE = /^(\+[0-9.eE+-]+|0[0-9]+(\.[0-9]*)?)$/;

/** Remove leading and trailing ASCII spaces (U+0020) only: tabs and no-break spaces are text. */
export function trimSpaces(text: string): string {
  let a = 0;
  let b = text.length;
  while (a < b && text.charCodeAt(a) === 32) a++;
  while (b > a && text.charCodeAt(b - 1) === 32) b--;
  return a === 0 && b === text.length ? text : text.slice(a, b);
}

/** Whether a text cell is missing: empty after trimming ASCII spaces, or one of the markers. */
export function isMissingText(text: string, markers: ReadonlySet<string>): boolean {
  const t = trimSpaces(text);
  return t === '' || markers.has(t);
}

/**
 * The number a cell holds under the rule, or undefined when it is not a number. A JavaScript number
 * is itself (±Infinity included, so preparation can refuse it by name); text must match the plain
 * notation exactly (after trimming ASCII spaces) and be finite.
 */
export function cellNumber(cell: Cell, decimalMark: DecimalMark = '.'): number | undefined {
  if (typeof cell === 'number') return cell;
  if (typeof cell !== 'string') return undefined;
  const s = trimSpaces(cell);
  if (decimalMark === ',') {
    if (!NUMBER_COMMA.test(s)) return undefined;
    const v = Number(s.replace(',', '.'));
    return Number.isFinite(v) ? v : undefined;
  }
  if (!NUMBER_DOT.test(s)) return undefined;
  const v = Number(s);
  return Number.isFinite(v) ? v : undefined;
}

/** A finite number, or undefined. */
export function finiteNumber(cell: Cell, decimalMark: DecimalMark = '.'): number | undefined {
  const v = cellNumber(cell, decimalMark);
  return v !== undefined && Number.isFinite(v) ? v : undefined;
}

/** Text read as a number with a decimal comma or thousands separators ("1,5", "1,234"). */
export function looksLikeCommaNumber(cell: Cell): boolean {
  return typeof cell === 'string' && COMMA_NUMBER.test(trimSpaces(cell));
}

/** A code that looks numeric but is not a number ("007", "02134", "+5"). */
export function looksLikeCode(cell: Cell): boolean {
  return typeof cell === 'string' && CODE.test(trimSpaces(cell));
}

/** The level (and id) text of a present cell: exactly as given; a JavaScript number as JavaScript prints it. */
export function levelKey(cell: Exclude<Cell, null>): string {
  return typeof cell === 'number' ? String(cell) : cell;
}

const TRUE_FALSE = /^(true|false)$/i; // no `u` flag: only ASCII letters match case-insensitively

/** "true"/"false" in any ASCII letter case. */
export function isTrueFalse(text: string): boolean {
  return (text.length === 4 || text.length === 5) && TRUE_FALSE.test(text);
}

/**
 * Turn whatever a caller handed us into a Cell: null/undefined/NaN and missing markers become null,
 * booleans become "true"/"false", big integers and dates their exact text. Strings are kept as given.
 * Anything else is refused by position.
 */
export function normaliseCell(value: unknown, markers: ReadonlySet<string>, where: (row: number) => string, row: number): Cell {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return Number.isNaN(value) ? null : value;
  if (typeof value === 'string') return isMissingText(value, markers) ? null : value;
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (typeof value === 'bigint') return value.toString();
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : value.toISOString();
  throw new KinsortError(
    `${where(row)} holds ${Array.isArray(value) ? 'an array' : typeof value}; a cell must be a number, text, ` +
      `true/false, a date or empty.`,
    'bad-input',
  );
}

const byCodeUnit = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** Sort level texts: numerically when every level is a number (ties by code unit), else by code unit (locale-free). */
export function sortLevels(levels: Iterable<string>): string[] {
  const list = Array.from(new Set(levels));
  if (list.length > 0 && list.every((l) => finiteNumber(l) !== undefined)) {
    return list.sort((a, b) => Number(a) - Number(b) || byCodeUnit(a, b));
  }
  return list.sort(byCodeUnit);
}
