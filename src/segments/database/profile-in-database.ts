// Profiles of a definition's segments computed where the rows live: the definition scores every
// row in SQL (its own scoring SELECT as a subquery) and the engine returns only aggregates — sizes,
// means and variances, level counts, and the order statistics behind the quartiles. Nothing is
// written to the database. The result is the cards' SegmentProfile[] plus the plain summaries.
//
// Quantiles are exact by default (Hyndman & Fan type 7, linear interpolation between order statistics, as
// src/core/quantile.ts): DuckDB quantile_cont and PostgreSQL percentile_cont interpolate in the
// engine (equal to kinsort's to a few units in the last place); on ClickHouse (sorted arrays) and
// SQLite (window-function ranks) the engine returns the two order statistics around each position
// and kinsort interpolates them with its own formula. Exact order statistics need every value of a
// column in the engine at once; `quantiles: 'approximate'` takes DuckDB's approx_quantile instead.
import { KinsortError } from '../../core/errors';
import { checkInteger, checkOptions } from '../../core/options';
import { report, type ProgressCallback } from '../../core/progress';
import { valueAtPosition } from '../../core/quantile';
import { dialectNamed } from '../../engines/dialects';
import type { SqlEngine } from '../../engines/engine';
import type { Preparation } from '../../prepare/types';
import type { SegmentDefinition } from '../definition-types';
import type { SegmentProfile } from '../profile';
import { summariesAsProfiles, type ColumnSummary, type GroupSummary, type NumericSummary } from './profile-as-cards';
import {
  clickhouseOrderSql,
  interpolatedQuantilesSql,
  keptKindSql,
  levelsSql,
  momentNames,
  momentsSql,
  momentsWithQuantilesSql,
  orderNames,
  PROBABILITIES,
  profiledSource,
  quantileName,
  ranksFor,
  sqliteOrderSql,
  squaresSql,
  typicalSql,
  type ProfiledColumn,
} from './profile-sql';

export interface DatabaseProfileOptions {
  /** The table (or view) holding the rows: a name, `schema.table`, or the parts as an array. */
  table: string | readonly string[];
  /** Id column in that table; default: the definition's training id column. */
  idColumn?: string;
  /** How many variables each card lists as standing out (default 6). */
  top?: number;
  /**
   * 'exact' (default): exact order statistics on every engine — the engine holds every value of a
   * column while it computes them (DuckDB and ClickHouse in memory; PostgreSQL and SQLite sort).
   * 'approximate': DuckDB's approx_quantile (a t-digest of fixed size per segment), for tables
   * whose columns do not fit in the engine's memory; the other engines compute them exactly.
   */
  quantiles?: 'exact' | 'approximate';
  /** Called after each query ("profile queries", done of total). */
  onProgress?: ProgressCallback;
}

export interface DatabaseProfile {
  /** One profile per segment of the definition (1..k), as the cards draw them. */
  readonly profiles: SegmentProfile[];
  /** Per segment, every used and kept column summarised. */
  readonly segments: readonly GroupSummary[];
  /** The same over all scored rows. */
  readonly allRows: GroupSummary;
  /** Rows the definition gives no segment (a cell assign would refuse): left out of every figure. */
  readonly unscored: number;
  /** Per segment: a member at the least distance from the centre (id as text) and that distance. */
  readonly typical: readonly { readonly id?: string; readonly distance: number }[];
  /** How the quantiles were computed on this engine, in words. */
  readonly quantiles: string;
  /** How many statements ran. */
  readonly queries: number;
}

const QUANTILE_WORDS: Record<string, string> = {
  duckdb: 'exact: DuckDB quantile_cont (type 7, interpolated by DuckDB)',
  postgres: 'exact: PostgreSQL percentile_cont (type 7, interpolated by PostgreSQL)',
  sqlite: 'exact: order statistics by row_number(), type-7 interpolation by kinsort',
  clickhouse: 'exact: order statistics from arraySort(groupArray(...)), type-7 interpolation by kinsort',
};

const APPROXIMATE_WORDS =
  'approximate: DuckDB approx_quantile (t-digest); within 1 % of the values in rank in the tests (test/engines/profile-in-database.test.ts)';

const num = (v: unknown): number => (v === null || v === undefined ? NaN : Number(v));

/** A segment number from the engine: 1..k, or undefined for rows with none. */
function segmentOf(v: unknown, k: number): number | undefined {
  if (v === null || v === undefined) return undefined;
  const s = Number(v);
  if (!Number.isInteger(s) || s < 1 || s > k)
    throw new KinsortError(`profileInDatabase: the engine returned segment ${String(v)}.`, 'bad-input');
  return s;
}

export async function profileInDatabase(
  engine: SqlEngine,
  definition: SegmentDefinition,
  options: DatabaseProfileOptions,
): Promise<DatabaseProfile> {
  const where = 'profileInDatabase';
  const opts = checkOptions(options, ['table', 'idColumn', 'top', 'quantiles', 'onProgress'], where);
  if (typeof engine?.query !== 'function') {
    throw new KinsortError(`${where}: give an engine { dialect, query } (duckdbEngine, postgresEngine, or your own).`, 'bad-argument');
  }
  if (opts.table === undefined || opts.table === null)
    throw new KinsortError(`${where}: give the table, e.g. { table: "riders" }.`, 'bad-argument');
  const top = opts.top === undefined ? 6 : checkInteger(opts.top, `${where} top`, 1);
  if (opts.quantiles !== undefined && opts.quantiles !== 'exact' && opts.quantiles !== 'approximate') {
    throw new KinsortError(`${where}: quantiles is 'exact' or 'approximate', not ${JSON.stringify(String(opts.quantiles))}.`, 'bad-option');
  }
  const approximate = opts.quantiles === 'approximate' && engine.dialect === 'duckdb';
  const d = dialectNamed(engine.dialect);
  const prep = definition.preparation as unknown as Preparation;
  const k = definition.segments.length;

  let queries = 0;
  let planned = 0;
  const run = async (sql: string) => {
    const rows = await engine.query(sql);
    queries++;
    report(opts.onProgress, { task: 'profile queries', done: queries, total: Math.max(planned, queries), detail: d.title });
    return rows;
  };

  // Kept columns carry no type in the preparation: a column whose every present cell is a number
  // under the text rule is numeric, as the in-memory intake reads it; any other cell makes it text.
  const keptNames = [...(prep.keep ?? [])];
  const used: ProfiledColumn[] = prep.columns.map((c) => ({
    name: c.name,
    role: 'used',
    kind: c.type === 'numeric' ? 'numeric' : 'categorical',
  }));
  planned = 2 + (keptNames.length ? 1 : 0) + used.length + keptNames.length;
  let kept: ProfiledColumn[] = [];
  if (keptNames.length > 0) {
    const [row] = await run(keptKindSql(definition, opts.table, d, keptNames, opts.idColumn));
    kept = keptNames.map((name, j) => ({
      name,
      role: 'kept',
      kind: num(row?.[`kinsort_text_${j + 1}`] ?? 0) > 0 ? 'categorical' : 'numeric',
    }));
  }
  const columns = [...used, ...kept];
  const numeric = columns.flatMap((c, j) => (c.kind === 'numeric' ? [j] : []));
  const categorical = columns.flatMap((c, j) => (c.kind === 'categorical' ? [j] : []));
  // DuckDB reads the moments and the quartiles in one pass (profile-sql.ts, momentsWithQuantilesSql).
  const together = d.name === 'duckdb' && numeric.length > 0;
  planned =
    queries +
    1 +
    categorical.length +
    (d.name === 'sqlite' ? 2 + numeric.length : d.name === 'clickhouse' ? 2 * numeric.length : together ? 0 : 1);

  const source = profiledSource(definition, opts.table, d, columns, opts.idColumn);

  // 1. Sizes, moments, least distance (and a typical member) per segment.
  const sizes = new Float64Array(k);
  const counts = columns.map(() => new Float64Array(k));
  const means = columns.map(() => new Float64Array(k).fill(NaN));
  const squares = columns.map(() => new Float64Array(k));
  const mins = columns.map(() => new Float64Array(k).fill(Infinity));
  const maxs = columns.map(() => new Float64Array(k).fill(-Infinity));
  const typical: { id?: string; distance: number }[] = Array.from({ length: k }, () => ({ distance: NaN }));
  let unscored = 0;
  // Quartiles and median per numeric column, per segment (index 0..k-1) and all rows (index k).
  const quantiles = columns.map(() => Array.from({ length: k + 1 }, () => PROBABILITIES.map(() => NaN)));
  const readQuantiles = (row: Record<string, unknown>, slot: number) => {
    for (const j of numeric) quantiles[j][slot] = PROBABILITIES.map((p) => num(row[quantileName(j, p)]));
  };
  const momentsStatement = together ? momentsWithQuantilesSql(source, columns, numeric, d, approximate) : momentsSql(source, columns, d);
  for (const row of await run(momentsStatement)) {
    if (together && num(row.kinsort_all) === 1) {
      readQuantiles(row, k);
      continue;
    }
    const s = segmentOf(row.segment, k);
    if (together && s !== undefined) readQuantiles(row, s - 1);
    if (s === undefined) {
      unscored += num(row[momentNames.rows]);
      continue;
    }
    sizes[s - 1] = num(row[momentNames.rows]);
    const id = row[momentNames.typical];
    typical[s - 1] = { id: id === null || id === undefined ? undefined : String(id), distance: num(row[momentNames.least]) };
    for (const j of numeric) {
      const n = num(row[momentNames.count(j)]);
      counts[j][s - 1] = n;
      if (n === 0) continue;
      means[j][s - 1] = num(row[momentNames.mean(j)]);
      mins[j][s - 1] = num(row[momentNames.min(j)]);
      maxs[j][s - 1] = num(row[momentNames.max(j)]);
      if (d.name !== 'sqlite') squares[j][s - 1] = n > 1 ? num(row[momentNames.variance(j)]) * (n - 1) : 0;
    }
  }
  if (d.name === 'sqlite') {
    // No variance aggregate: a second pass sums the squared deviations from each segment's mean.
    const bySegment = new Map<number, number[]>();
    for (let s = 0; s < k; s++)
      bySegment.set(
        s + 1,
        columns.map((_, j) => means[j][s]),
      );
    if (numeric.length > 0) {
      for (const row of await run(squaresSql(source, columns, d, bySegment))) {
        const s = segmentOf(row.segment, k)!;
        for (const j of numeric) if (counts[j][s - 1] > 0) squares[j][s - 1] = num(row[momentNames.variance(j)]);
      }
    }
    for (const row of await run(typicalSql(source, d))) {
      const s = segmentOf(row.segment, k)!;
      typical[s - 1] = { id: String(row[momentNames.typical]), distance: num(row[momentNames.least]) };
    }
  }

  // 2. Level counts per categorical column.
  const levelCounts = new Map<number, Map<string, number>[]>();
  const missingLevels = new Map<number, Float64Array>();
  for (const j of categorical) {
    const perSegment = Array.from({ length: k }, () => new Map<string, number>());
    const missing = new Float64Array(k);
    for (const row of await run(levelsSql(source, j, d))) {
      const s = segmentOf(row.segment, k)!;
      const level = row.kinsort_level;
      if (level === null || level === undefined) missing[s - 1] += num(row.kinsort_count);
      else perSegment[s - 1].set(String(level), num(row.kinsort_count));
    }
    levelCounts.set(j, perSegment);
    missingLevels.set(j, missing);
  }

  // 3. Quartiles and median where the moments did not bring them.
  const totalCount = (j: number) => counts[j].reduce((a, b) => a + b, 0);
  if (numeric.length > 0 && !together) {
    if (d.name === 'postgres') {
      for (const row of await run(interpolatedQuantilesSql(source, numeric, d))) {
        readQuantiles(row, num(row.kinsort_all) === 1 ? k : segmentOf(row.segment, k)! - 1);
      }
    } else if (d.name === 'clickhouse') {
      for (const j of numeric) {
        for (const grouped of [true, false]) {
          for (const row of await run(clickhouseOrderSql(source, j, d, grouped))) {
            const slot = grouped ? segmentOf(row.segment, k)! - 1 : k;
            const n = num(row[orderNames.size(j)]);
            quantiles[j][slot] = PROBABILITIES.map((p) => {
              const h = (n - 1) * p;
              const lo = num(row[orderNames.low(j, p)]);
              return valueAtPosition([lo, num(row[orderNames.high(j, p)])], h - Math.floor(h));
            });
          }
        }
      }
    } else {
      for (const j of numeric) {
        const segmentRanks = new Map<number, number[]>();
        for (let s = 0; s < k; s++) segmentRanks.set(s + 1, ranksFor(counts[j][s]));
        const allRanks = ranksFor(totalCount(j));
        const atRank = Array.from({ length: k + 1 }, () => new Map<number, number>());
        for (const row of await run(sqliteOrderSql(source, j, d, segmentRanks, allRanks))) {
          const s = segmentOf(row.segment, k)! - 1;
          const x = num(row.kinsort_x);
          atRank[s].set(num(row.kinsort_rank), x);
          atRank[k].set(num(row.kinsort_rank_all), x);
        }
        for (let slot = 0; slot <= k; slot++) {
          const n = slot === k ? totalCount(j) : counts[j][slot];
          if (n === 0) continue;
          quantiles[j][slot] = PROBABILITIES.map((p) => {
            const h = (n - 1) * p;
            const lo = Math.floor(h);
            return valueAtPosition([atRank[slot].get(lo + 1)!, atRank[slot].get(Math.min(lo + 2, n))!], h - lo);
          });
        }
      }
    }
  }

  // 4. The summaries, per segment and over all scored rows (moments combined exactly: Chan et al.).
  const summarise = (slot: number): GroupSummary => {
    const size = slot === k ? sizes.reduce((a, b) => a + b, 0) : sizes[slot];
    const cols: ColumnSummary[] = columns.map((c, j) => {
      if (c.kind === 'numeric') {
        const [q1, median, q3] = quantiles[j][slot];
        let count: number, mean: number, ss: number, min: number, max: number;
        if (slot < k) {
          count = counts[j][slot];
          mean = means[j][slot];
          ss = squares[j][slot];
          min = mins[j][slot];
          max = maxs[j][slot];
        } else {
          count = totalCount(j);
          let sum = 0;
          for (let s = 0; s < k; s++) if (counts[j][s] > 0) sum += counts[j][s] * means[j][s];
          mean = count > 0 ? sum / count : NaN;
          ss = 0;
          for (let s = 0; s < k; s++) if (counts[j][s] > 0) ss += squares[j][s] + counts[j][s] * (means[j][s] - mean) ** 2;
          min = Math.min(...mins[j]);
          max = Math.max(...maxs[j]);
        }
        const summary: NumericSummary = {
          name: c.name,
          role: c.role,
          kind: 'numeric',
          count,
          missing: size - count,
          mean: count > 0 ? mean : NaN,
          variance: count > 1 ? ss / (count - 1) : NaN,
          min: count > 0 ? min : NaN,
          max: count > 0 ? max : NaN,
          q1,
          median,
          q3,
        };
        return summary;
      }
      const perSegment = levelCounts.get(j)!;
      const tally = new Map<string, number>();
      for (let s = 0; s < k; s++) {
        if (slot !== k && s !== slot) continue;
        for (const [level, n] of perSegment[s]) tally.set(level, (tally.get(level) ?? 0) + n);
      }
      const missingRows = missingLevels.get(j)!;
      const missing = slot === k ? missingRows.reduce((a, b) => a + b, 0) : missingRows[slot];
      const count = [...tally.values()].reduce((a, b) => a + b, 0);
      const levels = [...tally]
        .map(([level, n]) => ({ level, count: n, share: n / count }))
        .sort((a, b) => b.count - a.count || (a.level < b.level ? -1 : a.level > b.level ? 1 : 0));
      return { name: c.name, role: c.role, kind: 'categorical', count, missing, levels };
    });
    return { segment: slot === k ? null : slot + 1, size, columns: cols };
  };
  const segments = Array.from({ length: k }, (_, s) => summarise(s));
  const allRows = summarise(k);
  const profiles = summariesAsProfiles({
    segments,
    allRows,
    typical,
    names: definition.segments.map((s) => ({ title: s.title, text: s.text })),
    top,
  });
  return { profiles, segments, allRows, unscored, typical, quantiles: approximate ? APPROXIMATE_WORDS : QUANTILE_WORDS[d.name], queries };
}
