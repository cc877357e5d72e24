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
// The text grows linearly with k (the minimum of the k distances is one LEAST, then one CASE).
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import type { DialectName, SqlDialect } from '../engines/dialect';
import { dialectNamed } from '../engines/dialects';
import type { SqlEngine } from '../engines/engine';
import { checkSqlText, commentText } from '../engines/sql-safety';
import { tableReference } from '../engines/source';
import type { Preparation } from '../prepare/types';
import type { SegmentDefinition } from './definition-types';
import { beyondColumn, featureColumn, PREFIX, preparedFeatureLayers, renderLayers, type Layer } from './sql-features';
import { mixtureLayers } from './sql-mixture';

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

const OUTPUT_NAMES = ['segment', 'distance', 'far', 'probability'];

function chooseDialect(opts: SqlOptions): SqlDialect {
  if (opts.engine !== undefined && opts.dialect !== undefined && opts.engine.dialect !== opts.dialect) {
    throw new KinsortError(
      `toSql: dialect "${opts.dialect}" and the engine's dialect "${opts.engine.dialect}" differ; give one.`,
      'bad-argument',
    );
  }
  return dialectNamed(opts.engine?.dialect ?? opts.dialect ?? 'duckdb');
}

export function definitionToSql(definition: SegmentDefinition, options: SqlOptions): string {
  const opts = checkOptions(options, ['table', 'idColumn', 'dialect', 'engine', 'maxQueryBytes', 'carry'], 'toSql');
  if (opts.table === undefined || opts.table === null) {
    throw new KinsortError('toSql: give the table to score, e.g. toSql({ table: "riders", dialect: "duckdb" }).', 'bad-argument');
  }
  if (definition.rule === 'nearest-dense-row') {
    throw new KinsortError(
      'toSql: density definitions (rule nearest-dense-row) are scored in memory only for now (assign); their SQL is not written yet.',
      'not-supported',
    );
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
  // A mixture also writes each component's lower-triangle factor (d(d + 1)/2 figures).
  const figures = definition.rule === 'highest-posterior' ? (k * dims * (dims + 3)) / 2 : k * dims;
  if (k > SQL_MAX_SEGMENTS || figures > SQL_MAX_FIGURES) {
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

  const q = (name: string) => d.quoteIdentifier(name);
  const id = q(idColumn);
  const f = (j: number) => featureColumn(j, d);
  const dist = (c: number) => q(`${PREFIX}d_${c + 1}`);
  const nearest = q(`${PREFIX}m`);
  const carry = opts.carry ?? [];
  if (!Array.isArray(carry) || carry.some((c) => typeof c !== 'string' || c === '')) {
    throw new KinsortError('toSql: carry must be a list of column names.', 'bad-option');
  }
  carry.forEach((c) => checkSqlText(c, 'a carried column'));
  const carried = carry.map((_, i) => carriedName(i, d));
  // The id and the carried columns, as every layer after the first hands them on.
  const pass = [id, ...carried];
  // 1–4. The stored preparation as SQL: the prepared features, in the definition's feature order.
  const prepared = preparedFeatureLayers(prep, d, dims, { first: [id, ...carry.map((c, i) => `${q(c)} AS ${carried[i]}`)], later: pass });
  // 5. Distance to every centre: squared for Euclidean (the same order of additions as assign).
  const euclidean = definition.metric === 'euclidean';
  const bounded = Number.isFinite(d.featureBound);
  if (bounded && definition.segments.some((s) => s.center.some((x) => Math.abs(x) > d.featureBound))) {
    throw new KinsortError(
      `toSql: a centre figure is beyond ${d.featureBound} in size, which ${d.title} cannot score without overflow; check the definition.`,
      'not-supported',
    );
  }
  const big = beyondColumn(d);
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
  const mixture =
    definition.rule === 'highest-posterior'
      ? mixtureLayers(definition, d, pass.join(', '), f, bounded ? big : undefined, PREFIX)
      : undefined;
  const header = [
    `-- kinsort segment definition, written by ${commentText(definition.writtenBy)} (format ${Number(definition.formatVersion)}): ${k} segments, rule ${commentText(definition.rule)}, metric ${commentText(definition.metric)}.`,
    `-- Dialect: ${d.title}. Returns the id, segment (NULL where assign refuses the row), distance and far${mixture ? ', and the posterior probability of the segment' : ''}.`,
    ...d.caveats.map((c) => `-- ${commentText(c)}`),
  ];
  const sql =
    header.join('\n') +
    '\n' +
    renderLayers([...prepared, ...(mixture ? mixture.layers : [distances, least])], mixture ? mixture.final : final, from, d) +
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

/** The name a carried column has in the scoring SQL's output: `kinsort_carry_1`, … */
export function carriedName(index: number, d: SqlDialect): string {
  return d.quoteIdentifier(`${PREFIX}carry_${index + 1}`);
}
