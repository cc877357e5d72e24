// Pieces of portable SQL text: quoted identifiers, string literals and double literals.
import { KinsortError } from '../core/errors';

/** A double-quoted identifier, with any double quote inside doubled (SQL standard). */
export function quoteIdentifier(name: string): string {
  return '"' + String(name).replace(/"/g, '""') + '"';
}

/** A single-quoted string literal, with any single quote inside doubled. */
export function quoteString(text: string): string {
  return "'" + String(text).replace(/'/g, "''") + "'";
}

/**
 * A double-precision literal. JavaScript's shortest round-trip digits, always with an exponent
 * ("1.5E0", "-3E-7"), because in standard SQL a literal with an exponent is approximate (double)
 * while "1.5" would be an exact decimal on many engines and change the arithmetic.
 */
export function doubleLiteral(value: number): string {
  if (!Number.isFinite(value)) {
    // Reached from a damaged or overflowing definition (e.g. a farBeyond of 1e308 squared).
    throw new KinsortError(`SQL: a figure of the definition comes out as ${value}, which SQL cannot hold; check the definition file.`, 'bad-definition');
  }
  const text = String(value === 0 ? 0 : value).toUpperCase();
  const withExponent = text.includes('E') ? text.replace('E+', 'E') : text + 'E0';
  return value < 0 ? `(${withExponent})` : withExponent;
}
