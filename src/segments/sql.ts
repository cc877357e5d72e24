// A segment definition as one portable SELECT: the stored preparation and the nearest centre,
// computed where the data lives.
//
// Only the portable core of SQL is used — CAST, CASE, COALESCE, + - * /, ABS, LN, SQRT, a WITH
// clause, no engine-specific functions, no window functions, no LATERAL/UNNEST — so the same text
// runs on an embedded engine (tested with DuckDB on CSV and Parquet) and on a distributed SQL
// engine (Trino / Presto, Spark SQL, …) when a table outgrows one machine.
//
// Rules, the same as `assign`:
// - numeric: COALESCE(x, fill) under the 'median' policy, LN(1 + x) when logged, then
//   (x − centre) / spread × weight; categorical: one indicator per training level (an unseen
//   level gives all indicators 0); binary: 0/1 by the two training levels (and, for a yes/no-like
//   pair, by 'true' / 'false', which is what an engine that typed the column BOOLEAN casts it to;
//   assign would refuse such text, so the two differ only on a column that mixes both spellings).
// - nearest centre by squared Euclidean (or Manhattan) distance, ties to the lower segment number.
// - a row with a missing feature value under 'refuse' or 'drop' gets segment NULL (assign reports it by
//   id); a binary or ordinal value never seen in training also gives NULL.
// - `far` is 1 when the row is farther than every segment's stored `farBeyond` distance.
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import type { PreparedColumn, Preparation } from '../prepare/types';
import type { SegmentDefinition } from './definition-types';
import { doubleLiteral, quoteIdentifier, quoteString } from './sql-text';

export interface SqlOptions {
  /** Table (or view) to score; written as given when it contains a dot or a quote, else quoted. */
  table: string;
  /** Id column; default: the id column of the training table. */
  idColumn?: string;
}

const FEATURE_PREFIX = 'kinsort_feature_';
const DISTANCE_PREFIX = 'kinsort_distance_';

function tableReference(table: string): string {
  // Qualified names (schema.table) and already quoted names are the caller's to write; a plain
  // name is quoted so spaces or reserved words cannot break the statement.
  return /[."]/.test(table) ? table : quoteIdentifier(table);
}

/** The value of one raw column as a double, with the missing-value fill applied. */
function numericValue(col: PreparedColumn): string {
  const raw = `CAST(${quoteIdentifier(col.name)} AS DOUBLE PRECISION)`;
  return typeof col.fill === 'number' ? `COALESCE(${raw}, ${doubleLiteral(col.fill)})` : raw;
}

function textValue(col: PreparedColumn): string {
  // TRIM: levels are compared trimmed, as the intake compares them.
  const raw = `TRIM(CAST(${quoteIdentifier(col.name)} AS VARCHAR))`;
  return col.fill !== null && col.fill !== undefined ? `COALESCE(${raw}, ${quoteString(String(col.fill))})` : raw;
}

const FALSE_WORDS = ['no', 'n', 'false', 'f', '0', 'off'];
const TRUE_WORDS = ['yes', 'y', 'true', 't', '1', 'on'];

/**
 * Engines may read a yes/no (or 0/1, t/f, …) column as BOOLEAN, and a boolean cast to text is
 * 'true' / 'false'. When the two training levels are such a pair, those texts are matched too.
 */
function booleanAliases(levels: readonly string[]): string[] {
  const [a, b] = levels.map((l) => l.toLowerCase());
  let falseCode: number;
  if (FALSE_WORDS.includes(a) && TRUE_WORDS.includes(b)) falseCode = 0;
  else if (TRUE_WORDS.includes(a) && FALSE_WORDS.includes(b)) falseCode = 1;
  else return [];
  const out: string[] = [];
  if (!levels.includes('false')) out.push(`WHEN 'false' THEN ${falseCode}E0`);
  if (!levels.includes('true')) out.push(`WHEN 'true' THEN ${1 - falseCode}E0`);
  return out;
}

/** (v − centre) / spread × weight, in the same order of operations as the JavaScript. */
function scaled(value: string, col: PreparedColumn): string {
  let e = value;
  if (col.centre !== 0) e = `(${e} - ${doubleLiteral(col.centre)})`;
  if (col.spread !== 1) e = `${e} / ${doubleLiteral(col.spread)}`;
  if (col.weight !== 1) e = `(${e}) * ${doubleLiteral(col.weight)}`;
  return e;
}

/** The SQL expressions of the features one used column produces, in feature order. */
export function columnFeatureSql(col: PreparedColumn): string[] {
  const levels = col.levels ?? [];
  switch (col.type) {
    case 'numeric': {
      const v = numericValue(col);
      return [scaled(col.log ? `LN(1E0 + ${v})` : v, col)];
    }
    case 'ordinal': {
      const text = textValue(col);
      const rank = `CASE ${text} ${levels.map((l, r) => `WHEN ${quoteString(l)} THEN ${doubleLiteral(r)}`).join(' ')} ELSE NULL END`;
      return [scaled(rank, col)];
    }
    case 'binary': {
      const text = textValue(col);
      const whens = [`WHEN ${quoteString(levels[0])} THEN 0E0`, `WHEN ${quoteString(levels[1])} THEN 1E0`, ...booleanAliases(levels)];
      const code = `CASE ${text} ${whens.join(' ')} ELSE NULL END`;
      return [scaled(code, col)];
    }
    case 'categorical': {
      const text = textValue(col);
      // NULL stays NULL (a missing value); any other unseen level: every indicator 0.
      return levels.map((l) => {
        const indicator = `CASE WHEN ${text} IS NULL THEN NULL WHEN ${text} = ${quoteString(l)} THEN 1E0 ELSE 0E0 END`;
        return scaled(indicator, col);
      });
    }
    default:
      throw new KinsortError(`toSql: column "${col.name}" has type "${(col as PreparedColumn).type}", which has no SQL form.`, 'not-supported');
  }
}

function distanceSql(features: number, center: number[], metric: SegmentDefinition['metric']): string {
  const terms: string[] = [];
  for (let j = 0; j < features; j++) {
    const diff = `(${quoteIdentifier(FEATURE_PREFIX + (j + 1))} - ${doubleLiteral(center[j])})`;
    terms.push(metric === 'manhattan' ? `ABS${diff}` : `${diff} * ${diff}`);
  }
  return terms.join('\n      + ');
}

export function definitionToSql(definition: SegmentDefinition, options: SqlOptions): string {
  const opts = checkOptions(options, ['table', 'idColumn'], 'toSql');
  if (typeof opts.table !== 'string' || opts.table.trim() === '') {
    throw new KinsortError('toSql: give the table to score, e.g. toSql({ table: "riders" }).', 'bad-argument');
  }
  const prep = definition.preparation as unknown as Preparation;
  const idColumn = opts.idColumn ?? prep.idColumn;
  if (typeof idColumn !== 'string' || idColumn === '') {
    throw new KinsortError(
      'toSql: the training table had no id column (ids were row numbers); give idColumn, the column that identifies rows in the table to score.',
      'bad-argument',
    );
  }
  if (idColumn.startsWith(FEATURE_PREFIX) || idColumn.startsWith(DISTANCE_PREFIX) || idColumn === 'segment') {
    throw new KinsortError(`toSql: the id column "${idColumn}" clashes with a name the SQL uses; rename it in a view first.`, 'bad-argument');
  }
  const featureSql = prep.columns.flatMap(columnFeatureSql);
  const dims = definition.features.length;
  if (featureSql.length !== dims) {
    throw new KinsortError(`toSql: the preparation gives ${featureSql.length} features but the definition has ${dims}.`, 'bad-definition');
  }
  const k = definition.segments.length;
  const id = quoteIdentifier(idColumn);
  const d = (c: number) => quoteIdentifier(DISTANCE_PREFIX + (c + 1));
  // The stored distance is Euclidean (a square root) but comparing squares picks the same segment.
  const euclidean = definition.metric === 'euclidean';
  const prepared = featureSql.map((e, j) => `    ${e} AS ${quoteIdentifier(FEATURE_PREFIX + (j + 1))}`).join(',\n');
  const distances = definition.segments
    .map((s, c) => `    ${distanceSql(dims, s.center, definition.metric)}\n      AS ${d(c)}`)
    .join(',\n');
  // First WHEN wins, and each test is "<=" against every other segment: ties go to the lower number.
  const whens = definition.segments
    .slice(0, k - 1)
    .map((_, c) => {
      const others = definition.segments.map((__, o) => o).filter((o) => o !== c);
      return `      WHEN ${others.map((o) => `${d(c)} <= ${d(o)}`).join(' AND ')} THEN ${c + 1}`;
    });
  const segmentCase = [`CASE`, `      WHEN ${d(0)} IS NULL THEN NULL`, ...whens, `      ELSE ${k}`, `    END`].join('\n');
  const chosen = `CASE "segment" ${definition.segments.map((_, c) => `WHEN ${c + 1} THEN ${d(c)}`).join(' ')} END`;
  const threshold = (c: number) => {
    const t = definition.segments[c].farBeyond;
    return doubleLiteral(euclidean ? t * t : t);
  };
  const farAll = definition.segments.map((_, c) => `${d(c)} > ${threshold(c)}`).join(' AND ');
  return [
    `-- kinsort segment definition (${definition.writtenBy}, format ${definition.formatVersion}): ${k} segments, rule ${definition.rule}, metric ${definition.metric}.`,
    `-- Portable SQL: runs unchanged on embedded and distributed engines. Missing feature values give segment NULL${
      prep.missing === 'median' ? ' only where no fill applies' : ''
    }.`,
    `WITH prepared AS (`,
    `  SELECT`,
    `    ${id},`,
    prepared,
    `  FROM ${tableReference(opts.table)}`,
    `),`,
    `distances AS (`,
    `  SELECT`,
    `    ${id},`,
    distances,
    `  FROM prepared`,
    `),`,
    `nearest AS (`,
    `  SELECT`,
    `    distances.*,`,
    `    ${segmentCase} AS "segment"`,
    `  FROM distances`,
    `)`,
    `SELECT`,
    `  ${id},`,
    `  "segment",`,
    `  ${euclidean ? `SQRT(${chosen})` : chosen} AS "distance",`,
    `  CASE WHEN "segment" IS NULL THEN NULL WHEN ${farAll} THEN 1 ELSE 0 END AS "far"`,
    `FROM nearest`,
  ].join('\n') + '\n';
}
