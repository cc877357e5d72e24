// The SQL behind profileInDatabase: the definition's scoring SELECT (sql.ts) as a subquery with the
// profiled columns carried through, each cell read by the stored text rule (missing markers,
// number grammar, exact level text), then the aggregates: sizes and moments, level counts, and
// the order statistics the quartiles need. Nested SELECTs only, so every dialect (ClickHouse 18
// has no WITH) reads the same text; nothing is written to the database.
import type { SqlDialect } from '../../engines/dialect';
import type { Preparation } from '../../prepare/types';
import type { SegmentDefinition } from '../definition-types';
import { storedTextRule } from '../sql-markers';
import { carriedName, definitionToSql } from '../sql';

export type ProfiledKind = 'numeric' | 'categorical';

export interface ProfiledColumn {
  readonly name: string;
  /** 'used': a column the definition scores with; 'kept': a profile-only column. */
  readonly role: 'used' | 'kept';
  readonly kind: ProfiledKind;
}

/** Names inside the profile SQL: the prefix the scoring SQL keeps for itself. */
const SEGMENT = 'segment';
const DISTANCE = 'distance';
const ID = 'kinsort_id';
const cell = (j: number) => `kinsort_p_${j + 1}`;

/** The table's cells as text, for the text rule (every profiled column, the id, the segment). */
export function profiledSource(
  definition: SegmentDefinition,
  table: string | readonly string[],
  d: SqlDialect,
  columns: readonly ProfiledColumn[],
  idColumn: string | undefined,
): string {
  const prep = definition.preparation as unknown as Preparation;
  const scoring = definitionToSql(definition, {
    table,
    dialect: d.name,
    idColumn,
    carry: columns.map((c) => c.name),
  }).trimEnd();
  const q = (name: string) => d.quoteIdentifier(name);
  const { missingMarkers, decimalMark } = storedTextRule(prep);
  const id = q(idColumn ?? (prep.idColumn as string));
  const r = (j: number) => q(`kinsort_r_${j + 1}`);
  const t = (j: number) => q(`kinsort_t_${j + 1}`);
  // A number stored as such is read directly where the dialect can tell (as the scoring SQL does).
  const native = decimalMark === '.' ? d.nativeNumber : undefined;
  const n = (j: number) => q(`kinsort_n_${j + 1}`);
  const stored = (c: ProfiledColumn, j: number) => (native && c.kind === 'numeric' ? [n(j)] : []);
  const texts = [
    `${q(SEGMENT)}`,
    `${q(DISTANCE)}`,
    `${d.asText(id, 'id')} AS ${q(ID)}`,
    ...columns.flatMap((c, j) => {
      const text = d.asText(carriedName(j, d), c.name);
      if (!stored(c, j).length || !native) return [`${text} AS ${r(j)}`];
      const x = carriedName(j, d);
      return [`${x} AS ${n(j)}`, `CASE WHEN ${native(x).test} THEN NULL ELSE ${text} END AS ${r(j)}`];
    }),
  ];
  const trimmed = [
    q(SEGMENT),
    q(DISTANCE),
    q(ID),
    ...columns.flatMap((c, j) => [...stored(c, j), r(j), `${d.trimSpaces(r(j))} AS ${t(j)}`]),
  ];
  const markers = ['', ...missingMarkers].map((m) => d.quoteString(m)).join(', ');
  const values = columns.map((c, j) => {
    const missing = `${r(j)} IS NULL OR ${t(j)} IN (${markers})`;
    // Numbers by the number grammar; levels exactly as stored (never trimmed).
    const value = c.kind === 'numeric' ? d.numberFromText(t(j), decimalMark) : r(j);
    const byText = `CASE WHEN ${missing} THEN NULL ELSE ${value} END`;
    if (!stored(c, j).length || !native) return `${byText} AS ${q(cell(j))}`;
    const x = native(n(j));
    return `CASE WHEN ${x.test} THEN ${x.value} ELSE ${byText} END AS ${q(cell(j))}`;
  });
  return (
    `SELECT ${[q(SEGMENT), q(DISTANCE), q(ID), ...values].join(', ')} FROM (\n` +
    `SELECT ${trimmed.join(', ')} FROM (\n` +
    `SELECT ${texts.join(', ')} FROM (\n${scoring}\n) AS ${q('kinsort_scored')}\n` +
    `) AS ${q('kinsort_texts')}\n) AS ${q('kinsort_trimmed')}`
  );
}

/**
 * Per kept column, how many present cells are not numbers under the text rule (a kept column
 * holding such a cell is profiled by its levels, as the in-memory intake would read it). The
 * definition's scoring SELECT is the row source here too, so the table is named in one place.
 */
export function keptKindSql(
  definition: SegmentDefinition,
  table: string | readonly string[],
  d: SqlDialect,
  names: readonly string[],
  idColumn: string | undefined,
): string {
  const prep = definition.preparation as unknown as Preparation;
  const { missingMarkers, decimalMark } = storedTextRule(prep);
  const scoring = definitionToSql(definition, { table, dialect: d.name, idColumn, carry: names }).trimEnd();
  const q = (name: string) => d.quoteIdentifier(name);
  const markers = ['', ...missingMarkers].map((m) => d.quoteString(m)).join(', ');
  const r = (j: number) => q(`kinsort_r_${j + 1}`);
  const t = (j: number) => q(`kinsort_t_${j + 1}`);
  const texts = names.map((n, j) => `${d.asText(carriedName(j, d), n)} AS ${r(j)}`);
  const trimmed = names.flatMap((_, j) => [r(j), `${d.trimSpaces(r(j))} AS ${t(j)}`]);
  const counts = names.map(
    (_, j) =>
      `sum(CASE WHEN ${r(j)} IS NULL OR ${t(j)} IN (${markers}) THEN 0 WHEN ${d.numberFromText(t(j), decimalMark)} IS NULL THEN 1 ELSE 0 END) AS ${q(`kinsort_text_${j + 1}`)}`,
  );
  return (
    `SELECT ${counts.join(', ')} FROM (\nSELECT ${trimmed.join(', ')} FROM (\nSELECT ${texts.join(', ')} FROM (\n${scoring}\n) AS ${q('kinsort_scored')}\n` +
    `) AS ${q('kinsort_texts')}\n) AS ${q('kinsort_trimmed')}`
  );
}

export const momentNames = {
  rows: 'kinsort_rows',
  least: 'kinsort_least',
  typical: 'kinsort_typical',
  count: (j: number) => `kinsort_n_${j + 1}`,
  mean: (j: number) => `kinsort_mean_${j + 1}`,
  variance: (j: number) => `kinsort_var_${j + 1}`,
  min: (j: number) => `kinsort_min_${j + 1}`,
  max: (j: number) => `kinsort_max_${j + 1}`,
};

/** The sample variance aggregate where the engine has a numerically stable one; SQLite has none. */
function varianceAggregate(d: SqlDialect, x: string): string | undefined {
  if (d.name === 'duckdb' || d.name === 'postgres') return `var_samp(${x})`;
  if (d.name === 'clickhouse') return `varSampStable(${x})`;
  return undefined;
}

/** The id of one member at the least distance from its segment's centre, where one aggregate gives it. */
function typicalAggregate(d: SqlDialect): string | undefined {
  const id = d.quoteIdentifier(ID);
  const dist = d.quoteIdentifier(DISTANCE);
  if (d.name === 'duckdb') return `arg_min(${id}, ${dist})`;
  if (d.name === 'clickhouse') return `argMin(${id}, ${dist})`;
  if (d.name === 'postgres') return `(array_agg(${id} ORDER BY ${dist}, ${id}))[1]`;
  return undefined;
}

/** The moment aggregates: rows, least distance, a typical member, and per numeric column the count, mean, variance, least and most. */
function momentParts(columns: readonly ProfiledColumn[], d: SqlDialect): string[] {
  const q = (name: string) => d.quoteIdentifier(name);
  const parts = [`count(*) AS ${q(momentNames.rows)}`, `min(${q(DISTANCE)}) AS ${q(momentNames.least)}`];
  const typical = typicalAggregate(d);
  if (typical) parts.push(`${typical} AS ${q(momentNames.typical)}`);
  columns.forEach((c, j) => {
    if (c.kind !== 'numeric') return;
    const x = q(cell(j));
    parts.push(`count(${x}) AS ${q(momentNames.count(j))}`, `avg(${x}) AS ${q(momentNames.mean(j))}`);
    const variance = varianceAggregate(d, x);
    if (variance) parts.push(`${variance} AS ${q(momentNames.variance(j))}`);
    parts.push(`min(${x}) AS ${q(momentNames.min(j))}`, `max(${x}) AS ${q(momentNames.max(j))}`);
  });
  return parts;
}

/**
 * Per segment (NULL: rows the definition gives no segment): rows, least distance, a typical
 * member's id, and per numeric column the count of values, mean, sample variance, least and most.
 */
export function momentsSql(source: string, columns: readonly ProfiledColumn[], d: SqlDialect): string {
  const q = (name: string) => d.quoteIdentifier(name);
  return `SELECT ${[q(SEGMENT), ...momentParts(columns, d)].join(', ')} FROM (\n${source}\n) AS ${q('kinsort_profiled')} GROUP BY ${q(SEGMENT)}`;
}

/**
 * DuckDB: the moments and the quartiles in one pass over the table instead of two (measured on 20
 * million rows × 8 columns with approximate quartiles: 28.9 s against 13.0 + 44.5 s). The
 * grouping sets give one row per segment (NULL: the unscored rows, as in momentsSql) and one over
 * all rows (kinsort_all = 1), whose moments are not read: the overall moments are combined from
 * the segments' (exactly, as before). The quantiles leave the unscored rows out by a FILTER.
 * PostgreSQL keeps two statements: its typical member aggregates every id of a group into an
 * array, which over all rows would hold every id of the table.
 */
export function momentsWithQuantilesSql(
  source: string,
  columns: readonly ProfiledColumn[],
  numeric: readonly number[],
  d: SqlDialect,
  approximate: boolean,
): string {
  const q = (name: string) => d.quoteIdentifier(name);
  const lists = quantileLists(numeric, d, approximate, `${q(SEGMENT)} IS NOT NULL`);
  const inner = [q(SEGMENT), `GROUPING(${q(SEGMENT)}) AS ${q('kinsort_all')}`, ...momentParts(columns, d), ...lists.aggregates];
  return (
    `SELECT ${[`${q('kinsort_grouped')}.*`, ...lists.elements].join(', ')} FROM (\n` +
    `SELECT ${inner.join(', ')} FROM (\n${source}\n) AS ${q('kinsort_profiled')} GROUP BY GROUPING SETS ((${q(SEGMENT)}), ())\n` +
    `) AS ${q('kinsort_grouped')}`
  );
}

/** SQLite: per segment, the sum of squared deviations from the segment's own mean (second pass). */
export function squaresSql(
  source: string,
  columns: readonly ProfiledColumn[],
  d: SqlDialect,
  means: ReadonlyMap<number, readonly number[]>,
): string {
  const q = (name: string) => d.quoteIdentifier(name);
  const seg = q(SEGMENT);
  const parts = [seg];
  columns.forEach((c, j) => {
    if (c.kind !== 'numeric') return;
    const whens = [...means].filter(([, m]) => Number.isFinite(m[j])).map(([s, m]) => `WHEN ${seg} = ${s} THEN ${d.doubleLiteral(m[j])}`);
    if (whens.length === 0) return;
    const centre = `CASE ${whens.join(' ')} END`;
    parts.push(`sum((${q(cell(j))} - ${centre}) * (${q(cell(j))} - ${centre})) AS ${q(momentNames.variance(j))}`);
  });
  return `SELECT ${parts.join(', ')} FROM (\n${source}\n) AS ${q('kinsort_profiled')} WHERE ${seg} IS NOT NULL GROUP BY ${seg}`;
}

/** SQLite: the typical member is the row at the least distance (SQLite takes a bare column from the min row). */
export function typicalSql(source: string, d: SqlDialect): string {
  const q = (name: string) => d.quoteIdentifier(name);
  return `SELECT ${q(SEGMENT)}, min(${q(DISTANCE)}) AS ${q(momentNames.least)}, ${q(ID)} AS ${q(momentNames.typical)} FROM (\n${source}\n) AS ${q('kinsort_profiled')} WHERE ${q(SEGMENT)} IS NOT NULL GROUP BY ${q(SEGMENT)}`;
}

/** Per segment, how many rows hold each level of one column (NULL level: missing). */
export function levelsSql(source: string, j: number, d: SqlDialect): string {
  const q = (name: string) => d.quoteIdentifier(name);
  return `SELECT ${q(SEGMENT)}, ${q(cell(j))} AS ${q('kinsort_level')}, count(*) AS ${q('kinsort_count')} FROM (\n${source}\n) AS ${q('kinsort_profiled')} WHERE ${q(SEGMENT)} IS NOT NULL GROUP BY ${q(SEGMENT)}, ${q(cell(j))}`;
}

/** The quantile probabilities every profile gives: the quartiles and the median. */
export const PROBABILITIES = [0.25, 0.5, 0.75] as const;

export const quantileName = (j: number, p: number) => `kinsort_q${Math.round(p * 100)}_${j + 1}`;
const lowName = (j: number, p: number) => `kinsort_lo${Math.round(p * 100)}_${j + 1}`;
const highName = (j: number, p: number) => `kinsort_hi${Math.round(p * 100)}_${j + 1}`;
export const orderNames = { low: lowName, high: highName, size: (j: number) => `kinsort_sorted_${j + 1}` };

/**
 * PostgreSQL: percentile_cont (Hyndman & Fan type 7, over exact order statistics), per segment and
 * for all rows (segment NULL) in one pass through GROUPING SETS. DuckDB takes the same aggregates
 * (quantile_cont, or approx_quantile) inside momentsWithQuantilesSql. All three probabilities come
 * from one aggregate per column (a list of them), so each column is sorted, or digested, once and
 * not three times: measured on DuckDB, 20 million rows × 8 columns with approx_quantile, 53 s
 * instead of 70 s. The outer SELECT names the list's elements.
 */
export function interpolatedQuantilesSql(source: string, numeric: readonly number[], d: SqlDialect): string {
  const q = (name: string) => d.quoteIdentifier(name);
  const lists = quantileLists(numeric, d, false);
  const inner = [q(SEGMENT), `GROUPING(${q(SEGMENT)}) AS ${q('kinsort_all')}`, ...lists.aggregates];
  return (
    `SELECT ${[q(SEGMENT), q('kinsort_all'), ...lists.elements].join(', ')} FROM (\n` +
    `SELECT ${inner.join(', ')} FROM (\n${source}\n) AS ${q('kinsort_profiled')} WHERE ${q(SEGMENT)} IS NOT NULL GROUP BY GROUPING SETS ((${q(SEGMENT)}), ())\n` +
    `) AS ${q('kinsort_lists')}`
  );
}

/**
 * One quantile aggregate per column over the list of probabilities (named kinsort_ql_j), and the
 * outer SELECT's names for the list's elements; `filter` keeps only the rows it admits.
 */
function quantileLists(
  numeric: readonly number[],
  d: SqlDialect,
  approximate: boolean,
  filter?: string,
): { aggregates: string[]; elements: string[] } {
  const q = (name: string) => d.quoteIdentifier(name);
  const list = (j: number) => q(`kinsort_ql_${j + 1}`);
  const probabilities = PROBABILITIES.join(', ');
  const only = filter ? ` FILTER (WHERE ${filter})` : '';
  const aggregates: string[] = [];
  const elements: string[] = [];
  for (const j of numeric) {
    const x = q(cell(j));
    // approx_quantile: a t-digest of fixed size per group, where the exact one holds every value.
    const agg =
      d.name === 'duckdb'
        ? `${approximate ? 'approx_quantile' : 'quantile_cont'}(${x}, [${probabilities}])`
        : `percentile_cont(ARRAY[${probabilities}]::double precision[]) WITHIN GROUP (ORDER BY ${x})`;
    aggregates.push(`${agg}${only} AS ${list(j)}`);
    PROBABILITIES.forEach((p, i) => elements.push(`${list(j)}[${i + 1}] AS ${q(quantileName(j, p))}`));
  }
  return { aggregates, elements };
}

/**
 * ClickHouse: the values sorted per group (per segment, or all rows when `grouped` is false) and
 * the two order statistics around each type-7 position (n − 1)·p; the interpolation is done in
 * JavaScript with kinsort's own formula, so the quantiles equal the in-memory ones exactly.
 */
export function clickhouseOrderSql(source: string, j: number, d: SqlDialect, grouped: boolean): string {
  const q = (name: string) => d.quoteIdentifier(name);
  const a = q('kinsort_a');
  const n = `length(${a})`;
  const parts = [grouped ? q(SEGMENT) : `NULL AS ${q(SEGMENT)}`, `${n} AS ${q(orderNames.size(j))}`];
  for (const p of PROBABILITIES) {
    const lo = `toUInt64(floor((${n} - 1) * ${p})) + 1`;
    parts.push(`arrayElement(${a}, ${lo}) AS ${q(lowName(j, p))}`, `arrayElement(${a}, least(${lo} + 1, ${n})) AS ${q(highName(j, p))}`);
  }
  const inner = `SELECT ${grouped ? `${q(SEGMENT)}, ` : ''}arraySort(groupArray(${q(cell(j))})) AS ${a} FROM (\n${source}\n) AS ${q('kinsort_profiled')} WHERE ${q(SEGMENT)} IS NOT NULL AND ${q(cell(j))} IS NOT NULL${grouped ? ` GROUP BY ${q(SEGMENT)}` : ''}`;
  return `SELECT ${parts.join(', ')} FROM (\n${inner}\n)`;
}

/**
 * SQLite: each value's rank within its segment and among all rows (window functions), keeping
 * only the ranks the type-7 positions need; the interpolation is done in JavaScript.
 */
export function sqliteOrderSql(
  source: string,
  j: number,
  d: SqlDialect,
  segmentRanks: ReadonlyMap<number, readonly number[]>,
  allRanks: readonly number[],
): string {
  const q = (name: string) => d.quoteIdentifier(name);
  const x = q(cell(j));
  const seg = q(SEGMENT);
  const inner = `SELECT ${seg}, ${x} AS ${q('kinsort_x')}, row_number() OVER (PARTITION BY ${seg} ORDER BY ${x}) AS ${q('kinsort_rank')}, row_number() OVER (ORDER BY ${x}) AS ${q('kinsort_rank_all')} FROM (\n${source}\n) AS ${q('kinsort_profiled')} WHERE ${seg} IS NOT NULL AND ${x} IS NOT NULL`;
  const wanted = [...segmentRanks]
    .filter(([, ranks]) => ranks.length > 0)
    .map(([s, ranks]) => `(${seg} = ${s} AND ${q('kinsort_rank')} IN (${ranks.join(', ')}))`);
  if (allRanks.length > 0) wanted.push(`${q('kinsort_rank_all')} IN (${allRanks.join(', ')})`);
  return `SELECT ${seg}, ${q('kinsort_x')}, ${q('kinsort_rank')}, ${q('kinsort_rank_all')} FROM (\n${inner}\n) AS ${q('kinsort_ranked')} WHERE ${wanted.length ? wanted.join(' OR ') : '0 = 1'}`;
}

/** 1-based ranks of the order statistics around each type-7 position, for n values. */
export function ranksFor(n: number): number[] {
  if (n === 0) return [];
  const out = new Set<number>();
  for (const p of PROBABILITIES) {
    const lo = Math.floor((n - 1) * p);
    out.add(lo + 1);
    out.add(Math.min(lo + 2, n));
  }
  return [...out].sort((a, b) => a - b);
}
