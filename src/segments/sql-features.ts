// The stored preparation as SQL layers: every used cell read as text by the text rule
// (kinsort-text-1), turned into a number or a level code, logged, scaled and weighted into the
// prepared features `kinsort_f_1 … kinsort_f_d`, in the definition's feature order, exactly as
// `assign` prepares a row (see sql.ts for the rules, line by line). The scoring SQL and the
// database passes (refineInDatabase) both start from these layers, so both read a row alike.
// In DuckDB a cell stored as DOUBLE or as an integer is read as its number directly, which is the
// number its printed text gives (test/engines/duckdb-stored-numbers.test.ts), at a fraction of the cost.
import { KinsortError } from '../core/errors';
import type { SqlDialect } from '../engines/dialect';
import type { PreparedColumn, Preparation } from '../prepare/types';
import { levelMatchOf, storedTextRule } from './sql-markers';

/** One SELECT of the chain: its name (for WITH) and its output columns. */
export interface Layer {
  name: string;
  columns: string[];
}

/** Every name the SQL makes up starts with this (a table column may not). */
export const PREFIX = 'kinsort_';

/** The prepared feature j (0-based) as the layers name it. */
export const featureColumn = (j: number, d: SqlDialect): string => d.quoteIdentifier(`${PREFIX}f_${j + 1}`);

/** 1 where a feature is beyond the dialect's bound (PostgreSQL: the row cannot be scored safely), else 0. */
export const beyondColumn = (d: SqlDialect): string => d.quoteIdentifier(`${PREFIX}beyond`);

/** Columns handed through the layers: as the first layer selects them from the table, and by name after. */
export interface CarriedColumns {
  readonly first: readonly string[];
  readonly later: readonly string[];
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
  if (col.center !== 0) e = d.sub(e, col.center);
  if (col.spread !== 1) e = d.div(e, col.spread);
  if (col.weight !== 1) e = d.mul(e, col.weight);
  return e;
}

/**
 * The layers from the table's cells to the prepared features (and, where the dialect has a bound
 * on feature size, the `kinsort_beyond` flag). The last layer outputs the carried columns, then
 * kinsort_f_1 … kinsort_f_dims (NULL where assign would refuse the row).
 */
export function preparedFeatureLayers(prep: Preparation, d: SqlDialect, dims: number, carry: CarriedColumns): Layer[] {
  const { missingMarkers: markers, decimalMark } = storedTextRule(prep);
  const q = (name: string) => d.quoteIdentifier(name);
  const r = (j: number) => q(`${PREFIX}r_${j + 1}`);
  const t = (j: number) => q(`${PREFIX}t_${j + 1}`);
  const v = (j: number) => q(`${PREFIX}v_${j + 1}`);
  const u = (j: number) => q(`${PREFIX}u_${j + 1}`);
  const f = (j: number) => featureColumn(j, d);
  const cols = prep.columns;

  // Numeric columns stored as numbers skip the printing and parsing where the dialect can tell
  // (DuckDB: the same number, see dialect.nativeNumber). Such a cell is not even printed: an engine
  // computes a layer's every column for every row, whatever the next layer's CASE takes.
  const native = decimalMark === '.' ? d.nativeNumber : undefined;
  const n = (j: number) => q(`${PREFIX}n_${j + 1}`);
  const raw = (c: PreparedColumn, j: number) => (native && c.type === 'numeric' ? [n(j)] : []);
  const cellText = (c: PreparedColumn, j: number) => {
    const text = d.asText(q(c.name), c.name);
    return raw(c, j).length && native ? `CASE WHEN ${native(q(c.name)).test} THEN NULL ELSE ${text} END` : text;
  };

  // 1. Each used cell as text, and the same text without leading/trailing ASCII spaces.
  const cells: Layer = {
    name: `${PREFIX}cells`,
    columns: [...carry.first, ...cols.flatMap((c, j) => [...raw(c, j).map((x) => `${q(c.name)} AS ${x}`), `${cellText(c, j)} AS ${r(j)}`])],
  };
  const trimmed: Layer = {
    name: `${PREFIX}trimmed`,
    columns: [...carry.later, ...cols.flatMap((c, j) => [...raw(c, j), r(j), `${d.trimSpaces(r(j))} AS ${t(j)}`])],
  };
  // 2. Each used cell as a number (numeric) or a level code (others); NULL where assign refuses.
  const missing = (j: number) => `${r(j)} IS NULL OR ${t(j)} IN (${['', ...markers].map((m) => d.quoteString(m)).join(', ')})`;
  const values: Layer = {
    name: `${PREFIX}values`,
    columns: [...carry.later, ...cols.map((c, j) => `${valueSql(c, j)} AS ${v(j)}`)],
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
      throw new KinsortError(`SQL: column "${c.name}" has type "${(c as PreparedColumn).type}", which has no SQL form.`, 'not-supported');
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
      ...carry.later,
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
    throw new KinsortError(`SQL: the preparation gives ${featureSql.length} features but the definition has ${dims}.`, 'bad-definition');
  }
  const features: Layer = { name: `${PREFIX}features`, columns: [...carry.later, ...featureSql.map((e, j) => `${e} AS ${f(j)}`)] };
  if (!Number.isFinite(d.featureBound)) return [cells, trimmed, values, logs, features];
  // Rows with a feature beyond the dialect's bound (PostgreSQL) get NULL distances (see its caveat).
  const guard: Layer = {
    name: `${PREFIX}guard`,
    columns: [
      ...carry.later,
      ...featureSql.map((_, j) => f(j)),
      `CASE WHEN ${featureSql.map((_, j) => `abs(${f(j)}) > ${d.doubleLiteral(d.featureBound)}`).join(' OR ')} THEN 1 ELSE 0 END AS ${beyondColumn(d)}`,
    ],
  };
  return [cells, trimmed, values, logs, features, guard];
}

/** The layers as WITH clauses, or (ClickHouse 18) as nested SELECTs, then the final SELECT. */
export function renderLayers(layers: readonly Layer[], final: Layer, from: string, d: SqlDialect, tail = ''): string {
  const fence = d.layerFence === 'offset' ? '\nOFFSET 0' : '';
  const select = (l: Layer, source: string, last = false) => `SELECT\n  ${l.columns.join(',\n  ')}\nFROM ${source}${last ? tail : fence}`;
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
