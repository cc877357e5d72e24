// The fluent seg.refineInDatabase(engine, { table }): k-means fitted on a sample, refined by Lloyd
// iterations in SQL over the whole table (segments/database/refine.ts), then profiled there
// (profileInDatabase). The result is a new segmentation whose centres are the refined ones, whose
// sizes, within-SS and profiles (cards, write-up) describe every row of the table, and whose
// sample rows are relabelled by the refined centres (so its definition reproduces them all).
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import type { ProgressCallback } from '../core/progress';
import type { SqlEngine } from '../engines/engine';
import { insideNotebookKernel, progressDisplay } from '../notebook';
import { nearestCenters } from '../segments/assign-nearest';
import { profileInDatabase, type DatabaseProfile } from '../segments/database/profile-in-database';
import { refineInDatabase, type DatabaseRefinement } from '../segments/database/refine';
import type { SegmentDefinition } from '../segments/definition-types';
import type { TableName } from '../engines/source';
import type { PreparedData } from '../prepare';
import type { SegmentationParts } from './segmentation';

export interface RefineSegmentationOptions {
  /** The table (or view) holding every row: a name, "schema.table", or the parts as an array. */
  table: TableName;
  /** Stop when no centre would move farther than this (prepared units; default 1e-6). 0: only when no row moves. */
  tolerance?: number;
  /** Most Lloyd iterations, each one query over the table (default 50). */
  maxIterations?: number;
  /** Id column of the table, for the profiles' typical members (default: the study's id column). */
  idColumn?: string;
  /**
   * The profiles' quartiles: 'exact' (default) or 'approximate' (DuckDB's approx_quantile; exact ones
   * hold every value of a column in the engine at once, too much for a table larger than memory).
   */
  quantiles?: 'exact' | 'approximate';
  onProgress?: ProgressCallback;
}

/** What a refined segmentation knows of the whole table. */
export interface TableFigures extends DatabaseRefinement {
  /** The table read, in words (`table "riders"`). */
  readonly source: string;
  /** The segments' profiles over every row of the table (profileInDatabase). */
  readonly profile: DatabaseProfile;
}

/** What the refinement needs of the segmentation it starts from. */
export interface RefineStart {
  readonly method: string;
  readonly k: number;
  readonly data: PreparedData;
  readonly options: Record<string, unknown>;
  readonly assignment: Int32Array;
  definition(): SegmentDefinition;
}

const WHERE = 'refineInDatabase';
const METHOD_WORDS: Record<string, string> = {
  kmedoids: 'k-medoids, whose medoids are rows',
  hierarchy: 'a hierarchy cut',
  mixture: 'a Gaussian mixture, whose segments are not nearest-centre ones',
  density: 'density segments, which have no centres',
};

export async function refineSegmentation(
  start: RefineStart,
  engine: SqlEngine,
  options: RefineSegmentationOptions,
  /** The definition of a segmentation made of these parts, with the start's names. */
  definitionOf: (parts: SegmentationParts) => SegmentDefinition,
): Promise<SegmentationParts> {
  const opts = checkOptions(options, ['table', 'tolerance', 'maxIterations', 'idColumn', 'quantiles', 'onProgress'], WHERE);
  if (start.method !== 'kmeans') {
    throw new KinsortError(
      `${WHERE}: only a k-means segmentation can be refined over a table (Lloyd iterations move each centre to its segment's mean); ` +
        `this one is ${METHOD_WORDS[start.method] ?? start.method}. Fit s.kmeans({ k: ${start.k} }) on the sample and refine that.`,
      'not-supported',
    );
  }
  if (opts.table === undefined)
    throw new KinsortError(`${WHERE}: give the table holding every row, e.g. { table: 'riders' }.`, 'bad-argument');
  const onProgress = opts.onProgress ?? (insideNotebookKernel() ? progressDisplay('Refining in the database') : undefined);
  const refined = await refineInDatabase(engine, start.definition(), {
    table: opts.table,
    tolerance: opts.tolerance,
    maxIterations: opts.maxIterations,
    onProgress,
  });
  if (refined.emptySegments.length > 0) {
    throw new KinsortError(
      `${WHERE} on ${refined.engine}: no row of the table is nearest segment ${refined.emptySegments.join(', ')} after ${refined.iterations} iterations ` +
        `(an empty segment keeps its centre, and it won no rows back). Fit the sample with fewer segments, or a larger sample.`,
      'bad-assignment',
    );
  }
  // The sample's rows, relabelled by the refined centres.
  const m = start.data.matrix;
  const near = nearestCenters(m.data, m.rows, Float64Array.from(refined.centers.flat()), start.k, m.cols, 'euclidean');
  const inSample = new Array<number>(start.k).fill(0);
  for (const s of near.segment) inSample[s]++;
  const bare = inSample.findIndex((n) => n === 0);
  if (bare >= 0) {
    throw new KinsortError(
      `${WHERE} on ${refined.engine}: segment ${bare + 1} holds ${refined.sizes[bare].toLocaleString('en-US')} rows of the table but none of the sample's ` +
        `${m.rows.toLocaleString('en-US')}, so no definition can be built from the sample; draw a larger sample.`,
      'bad-assignment',
    );
  }
  let moved = 0;
  for (let i = 0; i < m.rows; i++) if (near.segment[i] !== start.assignment[i]) moved++;
  const parts: SegmentationParts = {
    method: 'kmeans',
    options: start.options,
    assignment: near.segment,
    centers: refined.centers.map((c) => [...c]),
    fit: refined,
    objective: { name: 'withinSS', value: refined.withinSS },
    data: start.data,
  };
  // The profiles need the refined definition, names included.
  const profile = await profileInDatabase(engine, definitionOf(parts), {
    table: opts.table,
    idColumn: opts.idColumn,
    quantiles: opts.quantiles,
    onProgress,
  });
  const source = `table ${JSON.stringify(typeof opts.table === 'string' ? opts.table : opts.table.join('.'))}`;
  const how =
    refined.stoppedBy === 'no-row-moved'
      ? 'when no row moved'
      : refined.stoppedBy === 'tolerance'
        ? `when no centre would move farther than the tolerance (${refined.nextShift.toPrecision(3)})`
        : `at maxIterations, still moving (the next step would shift a centre by ${refined.nextShift.toPrecision(3)})`;
  return {
    ...parts,
    population: { ...refined, source, profile },
    notes: [
      `Refined over every row of ${source} on ${refined.engine}: ${refined.iterations} Lloyd iteration(s) in SQL, stopped ${how}. ` +
        `Sizes, within-SS and profiles describe its ${refined.rows.toLocaleString('en-US')} scored rows` +
        (refined.unscored > 0 ? ` (${refined.unscored.toLocaleString('en-US')} rows the definition cannot score were left out)` : '') +
        `; ${moved.toLocaleString('en-US')} of the sample's ${m.rows.toLocaleString('en-US')} rows changed segment under the refined centres.`,
    ],
  };
}
