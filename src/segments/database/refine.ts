// k-means refined over a whole table where it lives: Lloyd iterations, each one aggregate SELECT
// (lloyd-sql.ts), starting from a definition's centres (typically k-means on a sample) and reading
// rows through the definition's stored preparation, as the scoring SQL does. Nothing is written to
// the database: no table, no temporary table; each iteration's SELECT returns at most k + 1 rows.
//
// Iteration t compares every row with the centres C(t−1) (C(0): the definition's) and returns,
// per nearest centre, the rows, their within-segment sum of squares around C(t−1), and the sums
// giving the means C(t); from t = 2 on it also counts the rows whose nearest centre under C(t−1)
// differs from the one under C(t−2), the rows that moved. It stops after the first iteration in
// which
//   - no row moved (the partition is a fixed point: C(t−1) are the means of their own segments), or
//   - no centre would move farther than `tolerance` (Euclidean, prepared units), or
//   - `maxIterations` iterations have run.
// The result is C(t−1) and the figures of the rows nearest them (sizes, within-SS), so the
// centres, the sizes and the within-SS always describe one and the same partition: scoring the
// table with the returned centres gives exactly these sizes. `nextShift` says how far one more
// mean step would still move the centres (rounding only, at a fixed point).
//
// An empty segment (no row nearest its centre) keeps its centre for the next iteration, so it can
// win rows back; one still empty when the iterations stop is listed in `emptySegments` (the fluent
// refineInDatabase refuses such a result, naming the segment).
//
// Engines agree up to the order of floating-point summation (docs/database-path.md): a segment of
// n rows gets sums within (n − 1)·2⁻⁵³ relative of the exact ones on any engine (sums of
// non-negative squares; the centre sums are of differences from the current centre), so centres
// and within-SS differ between engines by about n·1.1e-16 relative at worst and √n·1.1e-16
// typically, and the partitions differ only where a row is that close to a tie between two centres.
import { KinsortError } from '../../core/errors';
import { checkInteger, checkNumber, checkOptions } from '../../core/options';
import { report, type ProgressCallback } from '../../core/progress';
import { dialectNamed } from '../../engines/dialects';
import type { SqlEngine } from '../../engines/engine';
import { runQuery } from '../../engines/run-query';
import { rowSource, type TableName } from '../../engines/source';
import type { Preparation } from '../../prepare/types';
import type { SegmentDefinition } from '../definition-types';
import { SQL_MAX_FIGURES, SQL_MAX_SEGMENTS, SQLITE_MAX_FEATURES } from '../sql';
import { lloydStepSql, STEP_COLUMNS } from './lloyd-sql';

export interface RefineInDatabaseOptions {
  /** The table (or view) holding every row: a name, "schema.table", or the parts as an array. */
  table?: TableName;
  /** Or a SELECT of your own, run as a subquery (one of table and query). */
  query?: string;
  /** Stop when no centre would move farther than this (prepared units; default 1e-6). 0: only when no row moves. */
  tolerance?: number;
  /** Most iterations, each one query over the table (default 50). */
  maxIterations?: number;
  /** Called after each iteration: done = iterations so far, detail = rows seen, moved, shift. */
  onProgress?: ProgressCallback;
}

/** One iteration, as reported. */
export interface RefineIteration {
  readonly iteration: number;
  /** Rows that got a segment (the rest could not be scored). */
  readonly rows: number;
  /** Rows whose nearest centre changed from the iteration before (null in the first). */
  readonly moved: number | null;
  /** Within-segment sum of squares around this iteration's centres. */
  readonly withinSS: number;
  /** The farthest any centre moves to its segment's mean (Euclidean, prepared units). */
  readonly shift: number;
}

export interface DatabaseRefinement {
  /** The centres the last iteration compared rows with (segment order, prepared space). */
  readonly centers: number[][];
  /** Rows of the table nearest each centre, segment 1 first. */
  readonly sizes: number[];
  /** Their within-segment sum of squares around `centers`. */
  readonly withinSS: number;
  /** Rows scored (the sum of sizes). */
  readonly rows: number;
  /** Rows the definition cannot score (a cell assign refuses), left out of every figure. */
  readonly unscored: number;
  readonly iterations: number;
  /** Statements sent (one per iteration). */
  readonly queries: number;
  /** Rows scored, over all iterations. */
  readonly rowsSeen: number;
  readonly stoppedBy: 'no-row-moved' | 'tolerance' | 'max-iterations';
  /** Whether it stopped at a fixed point or within tolerance (not at maxIterations). */
  readonly converged: boolean;
  /** How far one more mean step would move the centres (the last iteration's shift). */
  readonly nextShift: number;
  /** Segments (1-based) no row is nearest when it stopped. */
  readonly emptySegments: number[];
  readonly history: RefineIteration[];
  /** The engine, in words. */
  readonly engine: string;
}

const OPTION_NAMES = ['table', 'query', 'tolerance', 'maxIterations', 'onProgress'];
const WHERE = 'refineInDatabase';

/** A count or sum from a driver (bigint, numeric text, number) as a number; NULL as NaN. */
const numberOf = (v: unknown): number => (v === null || v === undefined ? NaN : Number(v));

export async function refineInDatabase(
  engine: SqlEngine,
  definition: SegmentDefinition,
  options: RefineInDatabaseOptions,
): Promise<DatabaseRefinement> {
  if (engine === null || typeof engine !== 'object' || typeof engine.query !== 'function') {
    throw new KinsortError(
      `${WHERE}: give an engine { dialect, query } first (duckdbEngine, postgresEngine, or your own).`,
      'bad-argument',
    );
  }
  const opts = checkOptions(options, OPTION_NAMES, WHERE);
  if (definition?.method?.name !== 'kmeans' || definition.rule !== 'nearest-center' || definition.metric !== 'euclidean') {
    throw new KinsortError(
      `${WHERE}: only k-means segments can be refined over a table (Lloyd iterations move each centre to its segment's mean); ` +
        `this definition is ${definition?.method?.name === 'kmedoids' ? 'k-medoids, whose medoids are rows' : definition?.method?.name === 'hierarchy' ? 'a hierarchy cut' : `a ${String(definition?.method?.name)} definition`}. Fit k-means on the sample to refine it.`,
      'not-supported',
    );
  }
  const d = dialectNamed(engine.dialect);
  const source = rowSource(opts.table, opts.query, d, WHERE);
  const tolerance = checkNumber(opts.tolerance ?? 1e-6, `${WHERE}: tolerance`, 0);
  const maxIterations = checkInteger(opts.maxIterations ?? 50, `${WHERE}: maxIterations`, 1, 10_000);
  const preparation = definition.preparation as unknown as Preparation;
  const k = definition.segments.length;
  const dims = definition.features.length;
  if (k > SQL_MAX_SEGMENTS || 2 * k * dims > SQL_MAX_FIGURES || (d.name === 'sqlite' && dims > SQLITE_MAX_FEATURES)) {
    throw new KinsortError(`${WHERE}: ${k} segments × ${dims} features is beyond what kinsort writes as one statement.`, 'too-large');
  }
  const columns = preparation.columns.map((c) => c.name);

  let current = definition.segments.map((s) => [...s.center]);
  let previous: number[][] | null = null;
  const history: RefineIteration[] = [];
  let rowsSeen = 0;
  for (let t = 1; ; t++) {
    const sql = lloydStepSql(d, { preparation, dims, from: source.from, current, previous });
    if (d.maxQueryBytes !== undefined && Buffer.byteLength(sql, 'utf8') > d.maxQueryBytes) {
      throw new KinsortError(
        `${WHERE}: one iteration's SQL for ${k} segments × ${dims} features is beyond ${d.title}'s cap on a statement (${d.maxQueryBytes.toLocaleString('en-US')} bytes).`,
        'too-large',
      );
    }
    const step = readStep(await runQuery(engine, sql, { where: WHERE, source, columns }), k, dims, d.title);
    rowsSeen += step.rows;
    // The means of this iteration's segments; an empty segment keeps its centre.
    const next = current.map((center, c) =>
      step.sizes[c] === 0 ? [...center] : center.map((x, j) => x + step.sums[c][j] / step.sizes[c]),
    );
    const shift = Math.max(...current.map((center, c) => Math.hypot(...center.map((x, j) => next[c][j] - x))));
    const moved = previous === null ? null : step.moved;
    history.push({ iteration: t, rows: step.rows, moved, withinSS: step.within, shift });
    report(opts.onProgress, {
      task: 'refining in the database',
      done: t,
      total: maxIterations,
      detail: `${d.title}: query ${t}, ${step.rows.toLocaleString('en-US')} rows seen, ${moved === null ? 'first pass' : `${moved.toLocaleString('en-US')} moved`}, centre shift ${shift.toPrecision(3)}`,
    });
    const stoppedBy = moved === 0 ? 'no-row-moved' : shift <= tolerance ? 'tolerance' : t >= maxIterations ? 'max-iterations' : undefined;
    if (stoppedBy !== undefined) {
      return {
        centers: current,
        sizes: step.sizes,
        withinSS: step.within,
        rows: step.rows,
        unscored: step.unscored,
        iterations: t,
        queries: t,
        rowsSeen,
        stoppedBy,
        converged: stoppedBy !== 'max-iterations',
        nextShift: shift,
        emptySegments: step.sizes.flatMap((n, c) => (n === 0 ? [c + 1] : [])),
        history,
        engine: d.title,
      };
    }
    previous = current;
    current = next;
  }
}

interface Step {
  sizes: number[];
  sums: number[][];
  within: number;
  moved: number;
  rows: number;
  unscored: number;
}

/** The iteration's rows (one per segment with rows, NULL for the unscored) as figures. */
function readStep(rows: Record<string, unknown>[], k: number, dims: number, title: string): Step {
  const step: Step = {
    sizes: new Array<number>(k).fill(0),
    sums: Array.from({ length: k }, () => new Array<number>(dims).fill(0)),
    within: 0,
    moved: 0,
    rows: 0,
    unscored: 0,
  };
  for (const r of rows) {
    const count = numberOf(r[STEP_COLUMNS.rows]);
    if (r[STEP_COLUMNS.segment] === null || r[STEP_COLUMNS.segment] === undefined) {
      step.unscored += count;
      continue;
    }
    const s = numberOf(r[STEP_COLUMNS.segment]);
    if (!Number.isInteger(s) || s < 1 || s > k || !Number.isFinite(count)) {
      throw new KinsortError(
        `${WHERE} on ${title}: the engine returned segment ${String(r[STEP_COLUMNS.segment])}, outside 1..${k}.`,
        'query-failed',
      );
    }
    step.sizes[s - 1] = count;
    step.rows += count;
    step.within += numberOf(r[STEP_COLUMNS.within]);
    step.moved += numberOf(r[STEP_COLUMNS.moved]);
    for (let j = 0; j < dims; j++) step.sums[s - 1][j] = numberOf(r[STEP_COLUMNS.difference(j)]);
  }
  if (!Number.isFinite(step.within) || step.sums.some((row) => row.some((x) => !Number.isFinite(x)))) {
    throw new KinsortError(`${WHERE} on ${title}: the engine returned a sum that is not a finite number.`, 'query-failed');
  }
  return step;
}
