// Cell-level rules shared by every input shape: what counts as missing, what counts as a number.
import { KinsortError } from '../core/errors';
import type { Cell } from './types';

/** Strings that mean "no value" unless the caller gives its own list. */
export const DEFAULT_MISSING_MARKERS: readonly string[] = ['', 'NA', 'NaN', 'null', 'N/A'];

const NUMBER_PATTERN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const INFINITY_PATTERN = /^[+-]?(inf|infinity)$/i;

/**
 * The number a cell holds, or undefined when it is not a number. Infinity is returned as such so
 * preparation can refuse it by name rather than treat it as text.
 */
export function cellNumber(cell: Cell): number | undefined {
  if (typeof cell === 'number') return cell;
  if (typeof cell !== 'string') return undefined;
  const s = cell.trim();
  if (NUMBER_PATTERN.test(s)) return Number(s);
  if (INFINITY_PATTERN.test(s)) return s.startsWith('-') ? -Infinity : Infinity;
  return undefined;
}

/** A finite number, or undefined. */
export function finiteNumber(cell: Cell): number | undefined {
  const v = cellNumber(cell);
  return v !== undefined && Number.isFinite(v) ? v : undefined;
}

/** The level key of a categorical cell (numbers and strings compare as their text). */
export function levelKey(cell: Exclude<Cell, null>): string {
  return typeof cell === 'number' ? String(cell) : cell.trim();
}

/**
 * Turn whatever a caller handed us into a Cell: null/undefined/NaN and missing markers become null,
 * booleans become "true"/"false", dates become ISO text. Anything else is refused by position.
 */
export function normaliseCell(
  value: unknown,
  markers: ReadonlySet<string>,
  where: (row: number) => string,
  row: number,
): Cell {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return Number.isNaN(value) ? null : value;
  if (typeof value === 'string') return markers.has(value.trim()) ? null : value;
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (typeof value === 'bigint') return Number(value);
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : value.toISOString();
  throw new KinsortError(
    `${where(row)} holds ${Array.isArray(value) ? 'an array' : typeof value}; a cell must be a number, text, ` +
      `true/false, a date or empty.`,
    'bad-input',
  );
}

/** Sort level keys: numerically when every key is a number, else by code unit (locale-free). */
export function sortLevels(levels: Iterable<string>): string[] {
  const list = Array.from(new Set(levels));
  if (list.length > 0 && list.every((l) => finiteNumber(l) !== undefined)) {
    return list.sort((a, b) => Number(a) - Number(b));
  }
  return list.sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
}
