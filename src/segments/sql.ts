// A segment definition as one SELECT that scores rows where the data lives, in the dialect of the
// target engine (src/engines/). It means what `assign` means, rule for rule (the text rule
// kinsort-text-1, TEXT-RULE in docs):
// - every used cell is read as text; it is missing when NULL, empty, or (after removing leading
//   and trailing ASCII spaces U+0020, nothing else) one of the stored missing markers;
// - a numeric cell is a number only when its space-trimmed text matches the text rule's grammar
//   and is finite; anything else gives the row segment NULL (assign refuses it by id);
// - category levels compare by exact text (never trimmed or case-folded); an unseen categorical
//   level gives all that column's indicators 0; an unseen binary or ordinal level gives NULL;
// - log1p is computed the same way in every dialect (see logOnePlus), then
//   (x − centre) / spread × weight, in the JavaScript's order of operations;
// - the nearest centre by the stored metric, ties to the lower segment number; `far` is 1 when the
//   row is beyond every segment's stored `farBeyond`.
// In DuckDB a cell stored as DOUBLE or as an integer is read as its number directly, which is the
// number its printed text gives (test/engines/duckdb-stored-numbers.test.ts), at a fraction of the cost.
// The text grows linearly with k (the minimum of the k distances is one LEAST, then one CASE).
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import type { DialectName, SqlDialect } from '../engines/dialect';
import { dialectNamed } from '../engines/dialects';
import type { SqlEngine } from '../engines/engine';
import { checkSqlText, commentText } from '../engines/sql-safety';
import type { PreparedColumn, Preparation } from '../prepare/types';
import type { SegmentDefinition } from './definition-types';
import { levelMatchOf, storedTextRule } from './sql-markers';

export interface SqlOptions {
  /**
   * Table (or view) to score: a name, `schema.table` (split at each dot, every part quoted), or
   * the parts as an array when a part itself holds a dot: `['my.schema', 'riders']`.
   */
  table: string | readonly string[];
  /** Id column; default: the id column of the training table. */
  idColumn?: string;
  /** Target dialect (default 'duckdb', the embedded default); or give `engine`. */
  dialect?: DialectName;
  /** An engine `{ dialect, query }`: its dialect is used. */
  engine?: Pick<SqlEngine, 'dialect'>;
  /**
   * The engine's cap on a statement's text in bytes, when you have raised it (ClickHouse:
   * `max_query_size`, 262,144 by default). Longer SQL is refused with the reason.
   */
  maxQueryBytes?: number;
  /**
   * Columns of the table handed through every layer unchanged, as `kinsort_carry_1`, … after the
   * id (for summaries over the scored rows in one pass: profileInDatabase).
   */
  carry?: readonly string[];
}

/** The most segments a definition may turn into SQL (the text holds k × features figures). */
export const SQL_MAX_SEGMENTS = 1000;
/** The most centre figures (k × features) in one statement: about 10 MB of SQL text. */
export const SQL_MAX_FIGURES = 400_000;

/** SQLite: the distance is a chain of one addition per feature, within its depth limit of 1000. */
export const SQLITE_MAX_FEATURES = 900;

const PREFIX = 'kinsort_';
const OUTPUT_NAMES = ['segment', 'distance', 'far'];

interface Layer {
  name: string;
  columns: string[];
}

/** The table as quoted parts; anything that is not a plain (qualified) name is refused. */
function tableReference(table: SqlOptions['table'], dialect: SqlDialect): string {
  const parts = typeof table === 'string' ? table.split('.') : Array.isArray(table) ? [...table] : null;
  const shown = JSON.stringify(table).slice(0, 120);
  if (parts === null || parts.length < 1 || parts.length > 3 || parts.some((p) => typeof p !== 'string' || p.trim() === '')) {
    throw new KinsortError(
      `toSql: the table ${shown} is not a name: give "table", "schema.table" or "catalog.schema.table", or the parts as an array when a part holds a dot.`,
      'bad-argument',
    );
  }
  for (const p of parts) {
    if (/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/.test(p) || (typeof table === 'string' && /["`]/.test(p))) {
      throw new KinsortError(
        `toSql: the table ${shown} holds quotes or control characters; give the parts of a qualified name unquoted, e.g. { table: ['sales', 'riders'] }, and kinsort quotes each one.`,
        'bad-argument',
      );
    }
  }
  return parts.map((p) => dialect.quoteIdentifier(p)).join('.');
}

function chooseDialect(opts: SqlOptions): SqlDialect {
  if (opts.engine !== undefined && opts.dialect !== undefined && opts.engine.dialect !== opts.dialect) {
    throw new KinsortError(
      `toSql: dialect "${opts.dialect}" and the engine's dialect "${opts.engine.dialect}" differ; give one.`,
      'bad-argument',
    );
  }
  return dialectNamed(opts.engine?.dialect ?? opts.dialect ?? 'duckdb');
}

/**
 * log1p(v) for v ≥ 0, the same way in every engine: with u = 1 + v rounded, v when u = 1, else
 * ln(u) · (v / (u − 1)). The rounding of u cancels (Goldberg 1991, "What every computer scientist
 * should know about floating-point arithmetic", theorem 4): a few units in the last place of
 * Math.log1p, where LN(1 + v) would lose every digit for v near 1e-17.
 */
function logOnePlus(v: string, u: string, d: SqlDialect): string {
  return `CASE WHEN ${u} = ${d.doubleLiteral(1)} THEN ${v} ELSE ln(${u}) * (${v} / (${u} - ${d.doubleLiteral(1)})) END`;
}

/** (v − centre) / spread × weight, in the same order of operations as the JavaScript. */
function scaled(value: string, col: PreparedColumn, d: SqlDialect): string {
  let e = value;
  if (col.centre !== 0) e = d.sub(e, col.centre);
  if (col.spread !== 1) e = d.div(e, col.spread);
  if (col.weight !== 1) e = d.mul(e, col.weight);
  return e;
}

export function definitionToSql(definition: SegmentDefinition, options: SqlOptions): string {
  const opts = checkOptions(options, ['table', 'idColumn', 'dialect', 'engine', 'maxQueryBytes', 'carry'], 'toSql');
  if (opts.table === undefined || opts.table === null) {
    throw new KinsortError('toSql: give the table to score, e.g. toSql({ table: "riders", dialect: "duckdb" }).', 'bad-argument');
  }
  const d = chooseDialect(opts);
  const from = tableReference(opts.table, d);
  const prep = definition.preparation as unknown as Preparation;
  const idColumn = opts.idColumn ?? prep.idColumn;
  if (typeof idColumn !== 'string' || idColumn === '') {
    throw new KinsortError(
      'toSql: the training table had no id column (ids were row numbers); give idColumn, the column that identifies rows in the table to score.',
      'bad-argument',
    );
  }
  const lowerId = idColumn.toLowerCase();
  if (lowerId.startsWith(PREFIX) || OUTPUT_NAMES.includes(lowerId)) {
    throw new KinsortError(
      `toSql: the id column "${idColumn}" clashes (in some letter case) with a name the SQL uses (${OUTPUT_NAMES.join(', ')}, ${PREFIX}…); rename it in a view first.`,
      'bad-argument',
    );
  }
  checkSqlText(idColumn, 'the id column');
  const k = definition.segments.length;
  const dims = definition.features.length;
  if (k > SQL_MAX_SEGMENTS || k * dims > SQL_MAX_FIGURES) {
    throw new KinsortError(
      `toSql: ${k} segments × ${dims} features is beyond what kinsort writes as one statement (at most ${SQL_MAX_SEGMENTS} segments and ${SQL_MAX_FIGURES.toLocaleString('en-US')} centre figures).`,
      'too-large',
    );
  }
  if (d.name === 'sqlite' && dims > SQLITE_MAX_FEATURES) {
    // The distance adds its terms one after another, in assign's order; SQLite caps an expression's depth at 1000.
    throw new KinsortError(
      `toSql: ${dims} features is beyond what SQLite's expression depth limit (1000) allows in one distance (at most ${SQLITE_MAX_FEATURES}).`,
      'too-large',
    );
  }
  if (d.name === 'duckdb' || d.name === 'sqlite') {
    // Identifiers are case-insensitive there even when quoted: "X" and "x" would be one column.
    const seen = new Map<string, string>();
    for (const name of [idColumn, ...prep.columns.map((c) => c.name)]) {
      const other = seen.get(name.toLowerCase());
      if (other !== undefined && other !== name) {
        throw new KinsortError(
          `toSql: columns "${other}" and "${name}" differ only in letter case, which ${d.title} reads as one column.`,
          'not-supported',
        );
      }
      seen.set(name.toLowerCase(), name);
    }
  }

  const { missingMarkers: markers, decimalMark } = storedTextRule(prep);
  const q = (name: string) => d.quoteIdentifier(name);
  const id = q(idColumn);
  const r = (j: number) => q(`${PREFIX}r_${j + 1}`);
  const t = (j: number) => q(`${PREFIX}t_${j + 1}`);
  const v = (j: number) => q(`${PREFIX}v_${j + 1}`);
  const u = (j: number) => q(`${PREFIX}u_${j + 1}`);
  const f = (j: number) => q(`${PREFIX}f_${j + 1}`);
  const dist = (c: number) => q(`${PREFIX}d_${c + 1}`);
  const nearest = q(`${PREFIX}m`);
  const cols = prep.columns;
  const carry = opts.carry ?? [];
  if (!Array.isArray(carry) || carry.some((c) => typeof c !== 'string' || c === '')) {
    throw new KinsortError('toSql: carry must be a list of column names.', 'bad-option');
  }
  carry.forEach((c) => checkSqlText(c, 'a carried column'));
  const carried = carry.map((_, i) => carriedName(i, d));
  // The id and the carried columns, as every layer after the first hands them on.
  const pass = [id, ...carried];
  // Numeric columns stored as numbers skip the printing and parsing where the dialect can tell (DuckDB).
  const native = decimalMark === '.' ? d.nativeNumber : undefined;
  const n = (j: number) => q(`${PREFIX}n_${j + 1}`);
  const raw = (c: PreparedColumn, j: number) => (native && c.type === 'numeric' ? [n(j)] : []);

  // A stored number is not printed (its text would not be read): the engine computes a layer's
  // every column for every row, whatever the next layer's CASE takes.
  const cellText = (c: PreparedColumn, j: number) => {
    const text = d.asText(q(c.name), c.name);
    return raw(c, j).length && native ? `CASE WHEN ${native(q(c.name)).test} THEN NULL ELSE ${text} END` : text;
  };
  // 1. Each used cell as text, and the same text without leading/trailing ASCII spaces.
  const cells: Layer = {
    name: `${PREFIX}cells`,
    columns: [
      id,
      ...carry.map((c, i) => `${q(c)} AS ${carried[i]}`),
      ...cols.flatMap((c, j) => [...raw(c, j).map((x) => `${q(c.name)} AS ${x}`), `${cellText(c, j)} AS ${r(j)}`]),
    ],
  };
  const trimmed: Layer = {
    name: `${PREFIX}trimmed`,
    columns: [...pass, ...cols.flatMap((c, j) => [...raw(c, j), r(j), `${d.trimSpaces(r(j))} AS ${t(j)}`])],
  };
  // 2. Each used cell as a number (numeric) or a level code (others); NULL where assign refuses.
  const missing = (j: number) => `${r(j)} IS NULL OR ${t(j)} IN (${['', ...markers].map((m) => d.quoteString(m)).join(', ')})`;
  const values: Layer = {
    name: `${PREFIX}values`,
    columns: [...pass, ...cols.map((c, j) => `${valueSql(c, j)} AS ${v(j)}`)],
  };
  function valueSql(c: PreparedColumn, j: number): string {
    if (c.type === 'numeric') {
      const fill = typeof c.fill === 'number' && prep.missing === 'median' ? d.doubleLiteral(c.fill) : 'NULL';
      const byText = `CASE WHEN ${missing(j)} THEN ${fill} ELSE ${d.numberFromText(t(j), decimalMark)} END`;
      if (!native) return byText;
      const stored = native(n(j));
      return `CASE WHEN ${stored.test} THEN ${stored.value} ELSE ${byText} END`;
    }
    if (c.type !== 'categorical' && c.type !== 'binary' && c.type !== 'ordinal') {
      throw new KinsortError(`toSql: column "${c.name}" has type "${(c as PreparedColumn).type}", which has no SQL form.`, 'not-supported');
    }
    const levels = c.levels ?? [];
    const fillCode = typeof c.fill === 'string' && prep.missing === 'median' ? levels.indexOf(c.fill) : -2;
    const whenMissing = fillCode >= 0 ? String(fillCode) : c.type === 'categorical' && fillCode === -1 ? '-1' : 'NULL';
    // Exact text; a true/false binary column matches its two levels in any ASCII letter case.
    const caseless = levelMatchOf(c) === 'ascii-case';
    const cell = caseless ? d.lowerAscii(r(j)) : r(j);
    const whens = levels.map(
      (l, i) => `WHEN ${cell} = ${d.quoteString(caseless ? l.replace(/[A-Z]/g, (x) => x.toLowerCase()) : l)} THEN ${i}`,
    );
    const unseen = c.type === 'categorical' ? '-1' : 'NULL';
    return `CASE WHEN ${missing(j)} THEN ${whenMissing} ${whens.join(' ')} ELSE ${unseen} END`;
  }
  // 3. 1 + v for logged columns (NULL for a negative value, which assign refuses under log1p).
  const logs: Layer = {
    name: `${PREFIX}logs`,
    columns: [
      ...pass,
      ...cols.flatMap((c, j) =>
        c.type === 'numeric' && c.log
          ? [v(j), `CASE WHEN ${v(j)} >= ${d.doubleLiteral(0)} THEN ${d.doubleLiteral(1)} + ${v(j)} END AS ${u(j)}`]
          : [v(j)],
      ),
    ],
  };
  // 4. The prepared features, in the definition's feature order.
  const featureSql: string[] = [];
  for (const [j, c] of cols.entries()) {
    if (c.type === 'numeric') featureSql.push(scaled(c.log ? logOnePlus(v(j), u(j), d) : v(j), c, d));
    else if (c.type === 'categorical') {
      const one = d.doubleLiteral(c.weight);
      const zero = d.doubleLiteral(0);
      (c.levels ?? []).forEach((_, i) =>
        featureSql.push(`CASE WHEN ${v(j)} IS NULL THEN NULL WHEN ${v(j)} = ${i} THEN ${one} ELSE ${zero} END`),
      );
    } else if (c.type === 'binary')
      featureSql.push(
        scaled(`CASE WHEN ${v(j)} IS NULL THEN NULL WHEN ${v(j)} = 1 THEN ${d.doubleLiteral(1)} ELSE ${d.doubleLiteral(0)} END`, c, d),
      );
    else featureSql.push(scaled(`(${v(j)} + ${d.doubleLiteral(0)})`, c, d));
  }
  if (featureSql.length !== dims) {
    throw new KinsortError(`toSql: the preparation gives ${featureSql.length} features but the definition has ${dims}.`, 'bad-definition');
  }
  const features: Layer = { name: `${PREFIX}features`, columns: [...pass, ...featureSql.map((e, j) => `${e} AS ${f(j)}`)] };
  // 5. Distance to every centre: squared for Euclidean (the same order of additions as assign).
  const euclidean = definition.metric === 'euclidean';
  const bounded = Number.isFinite(d.featureBound);
  if (bounded && definition.segments.some((s) => s.center.some((x) => Math.abs(x) > d.featureBound))) {
    throw new KinsortError(
      `toSql: a centre figure is beyond ${d.featureBound} in size, which ${d.title} cannot score without overflow; check the definition.`,
      'not-supported',
    );
  }
  const big = q(`${PREFIX}beyond`);
  // Rows with a feature beyond the dialect's bound (PostgreSQL) get NULL distances (see caveats).
  const guard = (): Layer => ({
    name: `${PREFIX}guard`,
    columns: [
      ...pass,
      ...featureSql.map((_, j) => f(j)),
      `CASE WHEN ${featureSql.map((_, j) => `abs(${f(j)}) > ${d.doubleLiteral(d.featureBound)}`).join(' OR ')} THEN 1 ELSE 0 END AS ${big}`,
    ],
  });
  const distances: Layer = {
    name: `${PREFIX}distances`,
    columns: [
      ...pass,
      ...definition.segments.map((s, c) => {
        const terms = s.center.map((x, j) => {
          const diff = `(${f(j)} - ${d.doubleLiteral(x)})`;
          return definition.metric === 'manhattan' ? `abs${diff}` : d.square(diff);
        });
        const sum = terms.join(' + ');
        return `${bounded ? `CASE WHEN ${big} = 0 THEN ${sum} END` : sum} AS ${dist(c)}`;
      }),
    ],
  };
  // 6. The least distance (NULL when a feature is missing), then the first segment that reaches it.
  const least: Layer = {
    name: `${PREFIX}nearest`,
    columns: [
      ...pass,
      ...definition.segments.map((_, c) => dist(c)),
      `${d.least(definition.segments.map((_, c) => dist(c)))} AS ${nearest}`,
    ],
  };
  const limit = (c: number) => {
    const x = definition.segments[c].farBeyond;
    return d.doubleLiteral(euclidean ? x * x : x);
  };
  const final: Layer = {
    name: '',
    columns: [
      ...pass,
      `${d.firstEqual(
        definition.segments.map((_, c) => dist(c)),
        nearest,
      )} AS ${q('segment')}`,
      `${euclidean ? `sqrt(${nearest})` : nearest} AS ${q('distance')}`,
      // Beyond every threshold: the least of d − t is above 0 (exact: the sign of a difference of doubles never rounds away).
      `CASE WHEN ${nearest} IS NULL THEN NULL WHEN ${d.least(definition.segments.map((_, c) => `${dist(c)} - ${limit(c)}`))} > ${d.doubleLiteral(0)} THEN 1 ELSE 0 END AS ${q('far')}`,
    ],
  };
  const header = [
    `-- kinsort segment definition, written by ${commentText(definition.writtenBy)} (format ${Number(definition.formatVersion)}): ${k} segments, rule ${commentText(definition.rule)}, metric ${commentText(definition.metric)}.`,
    `-- Dialect: ${d.title}. Returns the id, segment (NULL where assign refuses the row), distance and far.`,
    ...d.caveats.map((c) => `-- ${commentText(c)}`),
  ];
  const sql =
    header.join('\n') +
    '\n' +
    render([cells, trimmed, values, logs, features, ...(bounded ? [guard()] : []), distances, least], final, from, d) +
    '\n';
  const cap = opts.maxQueryBytes ?? d.maxQueryBytes;
  if (cap !== undefined) {
    if (typeof cap !== 'number' || !(cap > 0))
      throw new KinsortError('toSql: maxQueryBytes must be a positive number of bytes.', 'bad-option');
    const bytes = Buffer.byteLength(sql, 'utf8');
    if (bytes > cap) {
      throw new KinsortError(
        `toSql: the SQL for ${k} segments is ${bytes.toLocaleString('en-US')} bytes, beyond ${d.title}'s cap on a statement (${cap.toLocaleString('en-US')} bytes` +
          `${d.name === 'clickhouse' ? ', max_query_size' : ''}). Raise the engine's setting and pass maxQueryBytes, or score with fewer segments.`,
        'too-large',
      );
    }
  }
  return sql;
}

/** The layers as WITH clauses, or (ClickHouse 18) as nested SELECTs. */
function render(layers: Layer[], final: Layer, from: string, d: SqlDialect): string {
  const fence = d.layerFence === 'offset' ? '\nOFFSET 0' : '';
  const select = (l: Layer, source: string, last = false) => `SELECT\n  ${l.columns.join(',\n  ')}\nFROM ${source}${last ? '' : fence}`;
  if (d.withClause) {
    const as = d.layerFence === 'materialized' ? 'AS MATERIALIZED' : 'AS';
    const parts = layers.map(
      (l, i) => `${d.quoteIdentifier(l.name)} ${as} (\n${select(l, i === 0 ? from : d.quoteIdentifier(layers[i - 1].name))}\n)`,
    );
    return `WITH ${parts.join(',\n')}\n${select(final, d.quoteIdentifier(layers[layers.length - 1].name), true)}`;
  }
  let source = from;
  for (const l of layers) source = `(\n${select(l, source)}\n) AS ${d.quoteIdentifier(l.name)}`;
  return select(final, source, true);
}

/** The name a carried column has in the scoring SQL's output: `kinsort_carry_1`, … */
export function carriedName(index: number, d: SqlDialect): string {
  return d.quoteIdentifier(`${PREFIX}carry_${index + 1}`);
}
