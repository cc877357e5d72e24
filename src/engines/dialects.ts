// The four dialects kinsort writes scoring SQL for. Each was run for real in the tests
// (test/engines/): DuckDB (embedded), PostgreSQL 15, SQLite 3 (better-sqlite3) and ClickHouse 18.16
// (two shards behind a Distributed table).
import { KinsortError } from '../core/errors';
import { DecimalMark, DialectName, DIALECT_NAMES, numberGrammar, SqlDialect } from './dialect';
import { checkSqlText, powerOfTwoDecimal } from './sql-safety';

/** Standard SQL quoting: double quotes around identifiers, single quotes around text, doubled inside. */
function standardIdentifier(name: string): string {
  return '"' + checkSqlText(name, 'the name').replace(/"/g, '""') + '"';
}
function standardString(text: string): string {
  return "'" + checkSqlText(text, 'the text').replace(/'/g, "''") + "'";
}

/** JavaScript's shortest round-trip digits, always with an exponent ("1.5E0", "-3E-7"). */
function exponentDigits(value: number): string {
  if (!Number.isFinite(value)) {
    // Reached from a damaged or overflowing definition (e.g. a farBeyond of 1e308 squared).
    throw new KinsortError(
      `SQL: a figure of the definition comes out as ${value}, which SQL cannot hold; check the definition file.`,
      'bad-definition',
    );
  }
  const text = String(value === 0 ? 0 : value).toUpperCase();
  return text.includes('E') ? text.replace('E+', 'E') : text + 'E0';
}

/** In standard SQL a literal with an exponent is approximate (a double), never an exact decimal. */
function standardDouble(value: number): string {
  const t = exponentDigits(value);
  return value < 0 ? `(${t})` : t;
}

/** The text with its decimal comma (if that is the stored mark) written as a point, for a cast. */
const dotted = (t: string, mark: DecimalMark) => (mark === ',' ? `replace(${t}, ',', '.')` : t);

const digitsOnly = (x: string) => `rtrim(${x}, '0123456789') = ''`;

/** A chain of two-argument (or n-argument, up to `width`) minima: text linear in the count. */
function leastTree(exprs: readonly string[], width: number, fn: string): string {
  let level = [...exprs];
  while (level.length > 1) {
    const next: string[] = [];
    for (let i = 0; i < level.length; i += width) {
      const group = level.slice(i, i + width);
      next.push(group.length === 1 ? group[0] : `${fn}(${group.join(', ')})`);
    }
    level = next;
  }
  return level[0];
}

/** A searched CASE: the first WHEN that holds wins, so ties go to the lower position. */
const firstEqualCase = (exprs: readonly string[], value: string) =>
  `CASE WHEN ${value} IS NULL THEN NULL ${exprs.map((e, i) => `WHEN ${e} = ${value} THEN ${i + 1}`).join(' ')} END`;

const plainArithmetic = (literal: (v: number) => string) => ({
  sub: (a: string, c: number) => `(${a} - ${literal(c)})`,
  div: (a: string, c: number) => `${a} / ${literal(c)}`,
  mul: (a: string, c: number) => `(${a}) * ${literal(c)}`,
  square: (diff: string) => `${diff} * ${diff}`,
  featureBound: Infinity,
});

/**
 * The least double x ≥ 0 (or, with `negative`, the least −x) at which `changes(x)` becomes true,
 * or undefined when it never does: a binary search over the ordered bit patterns of the doubles
 * (`changes` must be false at 0 and, once true, stay true as x grows).
 */
function firstDouble(changes: (x: number) => boolean, negative = false): number | undefined {
  const bits = new BigUint64Array(1);
  const value = new Float64Array(bits.buffer);
  const at = (i: bigint) => ((bits[0] = i), negative ? -value[0] : value[0]);
  let lo = 0n;
  let hi = 0x7ff0000000000000n; // Infinity
  if (!changes(at(hi - 1n))) return undefined;
  while (hi - lo > 1n) {
    const mid = (lo + hi) / 2n;
    if (changes(at(mid))) hi = mid;
    else lo = mid;
  }
  return Math.abs(at(hi));
}

/** The least |x| at which `op(x)` overflows to ±Infinity (x ≥ 0, or x ≤ 0 with `negative`). */
export function overflowFrom(op: (x: number) => number, negative = false): number | undefined {
  return firstDouble((x) => !Number.isFinite(op(x)), negative);
}

/** The least |x| > 0 at which `op(x)` is not 0 (below it, the result underflows to 0). */
export function underflowBelow(op: (x: number) => number): number | undefined {
  return firstDouble((x) => op(x) !== 0);
}

/**
 * a op c as JavaScript computes it, where PostgreSQL would stop the query: ±Infinity where the
 * result overflows and, for × and /, 0 where a non-zero result underflows to zero.
 */
function pgGuarded(a: string, op: (x: number) => number, sql: string, underflows: boolean): string {
  const up = overflowFrom(op);
  const down = overflowFrom(op, true);
  const whens: string[] = [];
  if (up !== undefined) whens.push(`WHEN ${a} >= ${pgDouble(up)} THEN '${op(up) > 0 ? '' : '-'}Infinity'::float8`);
  if (down !== undefined) whens.push(`WHEN ${a} <= ${pgDouble(-down)} THEN '${op(-down) > 0 ? '' : '-'}Infinity'::float8`);
  const tiny = underflows ? underflowBelow(op) : undefined;
  if (tiny !== undefined && tiny > 5e-324) whens.push(`WHEN abs(${a}) < ${pgDouble(tiny)} THEN ${pgDouble(0)}`);
  return whens.length === 0 ? `(${sql})` : `(CASE ${whens.join(' ')} ELSE ${sql} END)`;
}

/** The least |x| whose square is not 0 (smaller squares underflow; PostgreSQL would stop). */
const SQUARE_NONZERO = underflowBelow((x) => x * x)!;

const pgArithmetic = {
  sub: (a: string, c: number) => pgGuarded(a, (x) => x - c, `${a} - ${pgDouble(c)}`, false),
  div: (a: string, c: number) => pgGuarded(a, (x) => x / c, `${a} / ${pgDouble(c)}`, true),
  mul: (a: string, c: number) => pgGuarded(a, (x) => x * c, `${a} * ${pgDouble(c)}`, true),
  square: (diff: string) => `CASE WHEN abs${diff} < ${pgDouble(SQUARE_NONZERO)} THEN ${pgDouble(0)} ELSE ${diff} * ${diff} END`,
  // Squares of differences of features and centres both within 1e150 stay below 1e301 each, and
  // a sum of up to 10^7 of them within the double range.
  featureBound: 1e150,
};

/** DuckDB column types whose every finite value the text rule reads back exactly from its printed text. */
const NATIVE_DUCKDB_TYPES = ['DOUBLE', 'BIGINT', 'INTEGER', 'SMALLINT', 'TINYINT', 'UBIGINT', 'UINTEGER', 'USMALLINT', 'UTINYINT'];

const duckdb: SqlDialect = {
  name: 'duckdb',
  title: 'DuckDB',
  withClause: true,
  layerFence: 'none',
  quoteIdentifier: standardIdentifier,
  quoteString: standardString,
  doubleLiteral: standardDouble,
  // DuckDB's CSV reader types yes/no, t/f and true/false columns BOOLEAN: their text is lost, so
  // such a column stops the query with the reason instead of scoring every row NULL.
  asText: (e, column) =>
    `CASE WHEN typeof(${e}) = 'BOOLEAN' THEN error(${standardString(
      `kinsort: column ${JSON.stringify(column)} is BOOLEAN in DuckDB, so the text of its cells is lost; read it as text, e.g. read_csv(..., all_varchar = true)`,
    )}) ELSE CAST(${e} AS VARCHAR) END`,
  trimSpaces: (e) => `trim(${e}, ' ')`,
  // TRY_CAST: DuckDB may evaluate a CASE branch for rows the WHEN excludes; it never raises.
  numberFromText: (t, mark) => {
    const v = `TRY_CAST(${dotted(t, mark)} AS DOUBLE)`;
    return `CASE WHEN regexp_full_match(${t}, ${standardString(numberGrammar(mark))}) AND isfinite(${v}) THEN ${v} END`;
  },
  // DOUBLE prints as the shortest text that reads back to it, integers exactly; a finite such cell
  // is that number under the text rule. typeof() is fixed when the query is planned, so for any
  // other column type the test is constant false. FLOAT and DECIMAL print a shorter text than
  // their double value, so they keep the text rule.
  nativeNumber: (e) => ({
    test: `(typeof(${e}) IN (${NATIVE_DUCKDB_TYPES.map(standardString).join(', ')}) AND isfinite(TRY_CAST(${e} AS DOUBLE)))`,
    value: `TRY_CAST(${e} AS DOUBLE)`,
  }),
  least: (exprs) => leastTree(exprs, 100, 'LEAST'),
  // One list search: DuckDB plans a CASE of k branches in time growing with k² (2 s at k = 300).
  firstEqual: (exprs, value) => `CASE WHEN ${value} IS NULL THEN NULL ELSE list_position(list_value(${exprs.join(', ')}), ${value}) END`,
  lowerAscii: (e) => `lower(${e})`,
  ...plainArithmetic(standardDouble),
  caveats: [],
};

// PostgreSQL raises an error (for the whole query) on a double beyond the range, in either
// direction, where JavaScript gives Infinity or 0. The text is first read as an exact NUMERIC and
// compared with the exact rounding boundaries, so only in-range text reaches the double cast.
const OVERFLOW_AT = (2n ** 1024n - 2n ** 970n).toString(); // halfway between the largest double and 2^1024
const UNDERFLOW_AT = powerOfTwoDecimal(-1075); // halfway between 0 and the least subnormal
/** The significant digits of that halfway point (no trailing zeros). */
const OVERFLOW_DIGITS = OVERFLOW_AT.replace(/0+$/, '');
const pgDouble = (v: number) => `'${exponentDigits(v)}'::float8`;

const postgres: SqlDialect = {
  name: 'postgres',
  title: 'PostgreSQL',
  withClause: true,
  layerFence: 'offset',
  quoteIdentifier: standardIdentifier,
  // With a backslash inside, an E'' literal: its meaning does not depend on standard_conforming_strings.
  quoteString: (text) =>
    /\\/.test(checkSqlText(text, 'the text')) ? "E'" + text.replace(/\\/g, '\\\\').replace(/'/g, "''") + "'" : standardString(text),
  // A bare 1.5E0 is NUMERIC in PostgreSQL (exact decimal arithmetic): every figure is typed double.
  doubleLiteral: pgDouble,
  asText: (e) => `CAST(${e} AS TEXT)`,
  trimSpaces: (e) => `btrim(${e}, ' ')`,
  numberFromText: (text, mark) => {
    const t = dotted(text, mark);
    const exact = `abs(CAST(${t} AS NUMERIC))`;
    return [
      `CASE WHEN ${text} !~ ${standardString(`^${numberGrammar(mark)}$`)} THEN NULL`,
      // An exponent of five digits or more (beyond NUMERIC's range): 0 if the digits are all zero or it is negative.
      `WHEN ${t} ~ '[eE][+-]?0*[1-9][0-9]{4,}$' THEN CASE WHEN ${t} ~ '^-?[0.]*[eE]' OR ${t} ~ '[eE]-' THEN ${pgDouble(0)} END`,
      `WHEN ${exact} >= ${OVERFLOW_AT} THEN NULL`,
      `WHEN ${exact} <= ${UNDERFLOW_AT} THEN ${pgDouble(0)}`,
      `ELSE CAST(${t} AS DOUBLE PRECISION) END`,
    ].join(' ');
  },
  least: (exprs) => leastTree(exprs, 100, 'LEAST'),
  firstEqual: firstEqualCase,
  lowerAscii: (e) => `lower(${e})`,
  ...pgArithmetic,
  caveats: [
    'PostgreSQL stops a query when double arithmetic overflows: a row with a prepared feature beyond 1e150 in size (a distance beyond about 1e150) gets segment NULL here, where assign gives it a segment at that distance.',
  ],
};

// SQLite has no regular expressions without a loaded extension: the grammar is checked by parts.
function sqliteNumber(text: string, mark: DecimalMark): string {
  // With a decimal comma, a '.' is not allowed and the ',' is checked (and read) as the '.'.
  const t = dotted(text, mark);
  const m = `substr(${t}, 1 + (substr(${t}, 1, 1) = '-'))`; // without one leading minus
  const p = `instr(lower(${m}) || 'e', 'e')`; // position of the exponent mark (or one past the end)
  const mant = `substr(${m}, 1, ${p} - 1)`;
  const exp = `substr(${m}, ${p} + 1)`;
  const q = `instr(${mant} || '.', '.')`;
  const int = `substr(${mant}, 1, ${q} - 1)`;
  const frac = `substr(${mant}, ${q} + 1)`;
  const expDigits = `substr(${exp}, 1 + (substr(${exp}, 1, 1) IN ('+', '-')))`;
  const valid = [
    `(${int} = '0' OR (substr(${int}, 1, 1) BETWEEN '1' AND '9' AND ${digitsOnly(int)}))`,
    `(${q} > length(${mant}) OR (${frac} <> '' AND ${digitsOnly(frac)}))`,
    `(${p} > length(${m}) OR (${expDigits} <> '' AND ${digitsOnly(expDigits)}))`,
  ].join(' AND ');
  const v = `CAST(${t} AS REAL)`;
  const noDot = mark === ',' ? `instr(${text}, '.') = 0 AND ` : '';
  return `CASE WHEN ${noDot}${valid} AND abs(${v}) <= 1.7976931348623157E308 THEN ${v} END`;
}

const sqlite: SqlDialect = {
  name: 'sqlite',
  title: 'SQLite',
  withClause: true,
  layerFence: 'materialized',
  quoteIdentifier: standardIdentifier,
  quoteString: standardString,
  doubleLiteral: standardDouble,
  // A REAL cast to text keeps 15 digits; printf with 17 significant digits reads back exactly.
  asText: (e) => `CASE WHEN typeof(${e}) = 'real' THEN printf('%!.17g', ${e}) ELSE CAST(${e} AS TEXT) END`,
  trimSpaces: (e) => `trim(${e}, ' ')`,
  numberFromText: sqliteNumber,
  // The many-argument scalar min; SQLite caps a call's arguments, hence groups of 100.
  least: (exprs) => leastTree(exprs, 100, 'min'),
  firstEqual: firstEqualCase,
  lowerAscii: (e) => `lower(${e})`,
  ...plainArithmetic(standardDouble),
  caveats: [],
};

function clickhouseString(text: string): string {
  // ClickHouse reads backslash escapes inside string literals: escape the backslash itself too.
  return "'" + checkSqlText(text, 'the text').replace(/\\/g, '\\\\').replace(/'/g, "\\'") + "'";
}

/** ClickHouse 18 cannot parse a subnormal literal: it is written as an exact product of two normal ones. */
function clickhouseDouble(value: number): string {
  if (value !== 0 && Math.abs(value) < 2.2250738585072014e-308) {
    return `(${standardDouble(value * 2 ** 600)} * ${standardDouble(2 ** -600)})`;
  }
  return standardDouble(value);
}

const clickhouse: SqlDialect = {
  name: 'clickhouse',
  title: 'ClickHouse',
  withClause: false,
  // max_query_size: ClickHouse parses at most this much of a statement unless the setting is raised.
  maxQueryBytes: 262_144,
  layerFence: 'none',
  quoteIdentifier: (name) => '`' + checkSqlText(name, 'the name').replace(/\\/g, '\\\\').replace(/`/g, '\\`') + '`',
  quoteString: clickhouseString,
  doubleLiteral: clickhouseDouble,
  asText: (e) => `toString(${e})`,
  trimSpaces: (e) => `replaceRegexpAll(${e}, '^ +| +$', '')`,
  numberFromText: (t, mark) => {
    const v = `toFloat64OrNull(${mark === ',' ? `replaceAll(${t}, ',', '.')` : t})`;
    // ClickHouse 18 reads text just beyond the largest double as that double; JavaScript (correctly
    // rounded) gives Infinity from the halfway point on: compare the significant digits with it.
    const digits = `replaceRegexpAll(replaceRegexpAll(replaceRegexpOne(${t}, '[eE].*$', ''), '[-.,]', ''), '^0+|0+$', '')`;
    const beyondHalfway = `(abs(${v}) = 1.7976931348623157E308 AND ${digits} >= '${OVERFLOW_DIGITS}')`;
    // A zero with a huge exponent ("0e99999") reads as NaN there: every zero is 0.
    return `CASE WHEN NOT match(${t}, ${clickhouseString(`^${numberGrammar(mark)}$`)}) THEN NULL WHEN ${digits} = '' THEN 0E0 WHEN isFinite(${v}) AND NOT ${beyondHalfway} THEN ${v} END`;
  },
  // Two-argument least in a balanced tree: linear text, logarithmic depth.
  least: (exprs) => leastTree(exprs, 2, 'least'),
  firstEqual: firstEqualCase,
  lowerAscii: (e) => `lower(${e})`,
  ...plainArithmetic(clickhouseDouble),
  caveats: [
    'ClickHouse 18 reads a subnormal number (below 2.2e-308 in size) in text as 0, where JavaScript keeps it.',
    'ClickHouse 18 prints a Float64 column as text with up to one unit in the last place of error; keep raw cells in String columns for exact agreement.',
  ],
};

const DIALECTS: Record<DialectName, SqlDialect> = { duckdb, postgres, sqlite, clickhouse };

export function dialectNamed(name: unknown): SqlDialect {
  if (typeof name === 'string' && Object.prototype.hasOwnProperty.call(DIALECTS, name)) return DIALECTS[name as DialectName];
  throw new KinsortError(
    `SQL: unknown dialect ${JSON.stringify(String(name)).slice(0, 60)}; kinsort writes SQL for ${DIALECT_NAMES.join(', ')}.`,
    'bad-option',
  );
}
