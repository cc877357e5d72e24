// What differs between SQL engines, as one small interface: quoting, literals, the text form of a
// cell, trimming ASCII spaces, the number grammar of the text rule, and the minimum of many values.
// Everything else the scoring SQL uses (CASE, + - * /, comparisons, IN, IS NULL, nested SELECTs)
// is the common core every supported engine reads the same way.

export type DialectName = 'duckdb' | 'postgres' | 'sqlite' | 'clickhouse';
export const DIALECT_NAMES: readonly DialectName[] = ['duckdb', 'postgres', 'sqlite', 'clickhouse'];

/**
 * The text rule's number grammar (kinsort-text-1), applied after removing leading and trailing
 * ASCII spaces: no '+', no leading zeros, no '1.' or '.5', no Infinity, no hex.
 */
export const NUMBER_GRAMMAR = '-?(0|[1-9][0-9]*)(\\.[0-9]+)?([eE][+-]?[0-9]+)?';

/** The character between a number's whole part and its fraction, as stored in the definition. */
export type DecimalMark = '.' | ',';

/** The grammar for a decimal mark (',' in place of '.'). */
export function numberGrammar(mark: DecimalMark): string {
  return mark === ',' ? NUMBER_GRAMMAR.replace('\\.', ',') : NUMBER_GRAMMAR;
}

export interface SqlDialect {
  readonly name: DialectName;
  /** A readable engine name for messages. */
  readonly title: string;
  /** Whether `WITH name AS (…)` may be used (ClickHouse 18 has none: nested SELECTs instead). */
  readonly withClause: boolean;
  /**
   * How each layer is kept from being merged into the next: an engine that inlines a layer
   * substitutes its expressions at every use and computes them again (the k distances read every
   * feature 2k times). 'offset': `OFFSET 0` (PostgreSQL does not pull such a subquery up);
   * 'materialized': `AS MATERIALIZED` (SQLite); 'none'.
   */
  readonly layerFence: 'offset' | 'materialized' | 'none';
  quoteIdentifier(name: string): string;
  quoteString(text: string): string;
  /** A double-precision literal that reads back to exactly `value` (finite only). */
  doubleLiteral(value: number): string;
  /**
   * The cell as text (NULL stays NULL); for a number column, a text that reads back to the same
   * double. `column` names the column in an error raised where the text is known to be lost.
   */
  asText(expr: string, column: string): string;
  /** `expr` without leading and trailing U+0020 spaces (no other whitespace). */
  trimSpaces(expr: string): string;
  /**
   * The number a trimmed, present text holds under the text rule, as a double, or NULL when it is
   * not one (grammar not matched, or not finite). `t` is a column reference, read several times.
   */
  numberFromText(t: string, mark: DecimalMark): string;
  /**
   * Where the engine can tell that a cell is stored as a number whose text the text rule reads back
   * to the same double (with '.' as the decimal mark): the test, and that double. The text rule is
   * then skipped for the cell: the same value, without printing and parsing it (DuckDB only:
   * printing every cell of a wide Parquet file as text costs more than the rest of the scoring).
   */
  readonly nativeNumber?: (expr: string) => { readonly test: string; readonly value: string };
  /** The least of several doubles, none NULL (the caller tests for missing rows first). */
  least(exprs: readonly string[]): string;
  /** The 1-based position of the first of `exprs` equal to `value` (NULL when `value` is NULL). */
  firstEqual(exprs: readonly string[], value: string): string;
  /** ASCII lower case of a text (for `true`/`false` in any letter case). */
  lowerAscii(expr: string): string;
  /**
   * a − c, a / c, a × c for a double expression and a stored figure c. PostgreSQL stops the whole
   * query when a double operation overflows (JavaScript gives ±Infinity) or a product or quotient
   * underflows to 0: there each is guarded to give what JavaScript gives.
   */
  sub(a: string, c: number): string;
  div(a: string, c: number): string;
  mul(a: string, c: number): string;
  /** diff × diff (a parenthesised expression); PostgreSQL also stops on underflow to 0. */
  square(diff: string): string;
  /**
   * Beyond this size a prepared feature makes the row's distances unsafe to compute (PostgreSQL:
   * overflow stops the query); such a row gets segment NULL. Infinity where no bound is needed.
   */
  readonly featureBound: number;
  /** The engine's default cap on a statement's text, in UTF-8 bytes (undefined: none that matters). */
  readonly maxQueryBytes?: number;
  /** What this dialect cannot do exactly, stated once in the SQL header and in the README. */
  readonly caveats: readonly string[];
}
