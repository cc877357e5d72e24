// The fluent entry: study(table, roles).prepare(options) gives a prepared study whose calls each
// return a result that draws itself. Every call here is thin sugar over a functional twin.
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import type { ProgressCallback } from '../core/progress';
import { readTable, type Table } from '../table';
import { prepareTable, type PrepareOptions, type PreparedData } from '../prepare';
import { dissimilarity, type DissimilarityOptions } from '../measure/dissimilarity';
import type { Dissimilarity } from '../measure/condensed';
import { kmeans, kmedoids, type KmeansOptions } from '../methods/partition';
import { densitySegments } from '../methods/density';
import { takeRows } from '../core/matrix';
import { agglomerate, type LinkageMethod } from '../methods/hierarchy';
import { project, type Projection } from '../methods/project';
import { compareK, type CompareKOptions, type CompareKResult } from '../assess/compare-k';
import { kEvidenceView, screeView } from '../views';
import { insideNotebookKernel, progressDisplay } from '../notebook';
import { showable, type Showable } from './showable';
import { Segmentation } from './segmentation';
import { Hierarchy } from './hierarchy';
import { rowsAt, segmentMeans } from './centres';
import { ruleAgreement, settleKmeans } from './reproduce';
import { VariableHierarchy } from './variable-hierarchy';
import { variableColumns } from './variable-columns';
import { variableTree, type CorrelationKind, type CorrelationStrength, type VariableLinkage } from '../methods/variables';
import { installWrongStepGuards, PREPARED_STUDY_CALLS, type PrepareTheStudyFirst } from './wrong-step';
import { fitMixture, type StudyMixtureOptions } from './mixture-fit';
import { compareMixtures, type CompareMixturesOptions, type CompareMixturesResult } from '../assess/compare-mixtures';
import { mixtureEvidenceView } from '../views/mixture-evidence';

/** Which columns play which part. */
export interface StudyRoles {
  /** Column of unique row ids. */
  id?: string;
  /** Feature columns used for fitting (default: every column but id and keep). */
  use?: readonly string[];
  /** Profile-only columns, kept to describe segments. */
  keep?: readonly string[];
  /** Override the inferred type of a column. */
  types?: PrepareOptions['types'];
  /** Level order of ordinal columns, lowest first. */
  ordinalLevels?: PrepareOptions['ordinalLevels'];
  /** Reading (when the input is not a Table yet): texts meaning missing besides an empty cell. */
  missingMarkers?: readonly string[];
  /** Reading (when the input is not a Table yet): '.' (default) or ','. */
  decimalMark?: '.' | ',';
}

export type StudyPrepareOptions = Pick<PrepareOptions, 'scale' | 'log' | 'weights' | 'missing'>;

const ROLE_NAMES = ['id', 'use', 'keep', 'types', 'ordinalLevels', 'missingMarkers', 'decimalMark'];
const PREPARE_NAMES = ['scale', 'log', 'weights', 'missing'];

/** Start a study of a table: records, column object, CSV text, dataframe-like object or number[][]. */
export function study(input: unknown, roles: StudyRoles = {}): Study {
  checkOptions(roles, ROLE_NAMES, 'study');
  const { missingMarkers, decimalMark, ...rest } = roles;
  const table = readTable(input, { missingMarkers, decimalMark });
  return new Study(table, rest);
}

export class Study {
  // Asked of a study before .prepare(): typed as markers, they throw saying to prepare first.
  declare readonly dissimilarity: PrepareTheStudyFirst;
  declare readonly compareK: PrepareTheStudyFirst;
  declare readonly kmeans: PrepareTheStudyFirst;
  declare readonly kmedoids: PrepareTheStudyFirst;
  declare readonly agglomerate: PrepareTheStudyFirst;
  declare readonly project: PrepareTheStudyFirst;
  declare readonly variableTree: PrepareTheStudyFirst;
  declare readonly mixture: PrepareTheStudyFirst;
  declare readonly compareMixtures: PrepareTheStudyFirst;

  constructor(
    readonly table: Table,
    readonly roles: StudyRoles,
  ) {}

  /** Column names with their inferred types and how many values are missing. */
  columns(): { name: string; type: string; missing: number }[] {
    return this.table.columns.map((c) => ({
      name: c.name,
      type: c.inferred,
      missing: c.values.reduce<number>((n, v) => n + (v === null ? 1 : 0), 0),
    }));
  }

  /** Fit the preparation (scaling, one-hot, missing-value policy) and apply it. */
  prepare(options: StudyPrepareOptions = {}): PreparedStudy {
    checkOptions(options, PREPARE_NAMES, 'prepare');
    const data = prepareTable(this.table, { ...this.roles, ...options } as PrepareOptions);
    return new PreparedStudy(data, { study: this, options: { ...options } });
  }
}

installWrongStepGuards(
  Study.prototype,
  PREPARED_STUDY_CALLS,
  (name) =>
    `${name}: this study is not prepared yet. Call .prepare() on it first, e.g. ` +
    `study(table, { id, use }).prepare({ scale: 'zscore', missing: 'median' }).${name}(…); ` +
    `the preparation fixes the scaling and missing-value policy that every method and the definition use.`,
);

/** Progress shown in place inside the notebook kernel, unless the caller gave its own callback. */
function progressFor(given: ProgressCallback | undefined, title: string): ProgressCallback | undefined {
  if (given) return given;
  return insideNotebookKernel() ? progressDisplay(title) : undefined;
}

export class PreparedStudy {
  private readonly dissimilarities = new Map<string, Dissimilarity>();

  /** The study and options this was prepared from, for use(names): absent when built by hand. */
  private readonly origin?: { study: Study; options: StudyPrepareOptions };

  constructor(
    readonly data: PreparedData,
    origin?: { study: Study; options: StudyPrepareOptions },
  ) {
    this.origin = origin;
  }

  get ids(): readonly string[] {
    return this.data.ids;
  }

  get report(): PreparedData['report'] {
    return this.data.report;
  }

  get preparation(): PreparedData['preparation'] {
    return this.data.preparation;
  }

  get featureNames(): readonly string[] {
    return this.data.featureNames;
  }

  /** Pairwise dissimilarities of the prepared rows ('gower' works on the unscaled mixed columns). */
  dissimilarity(options: DissimilarityOptions = {}): Dissimilarity {
    const opts = checkOptions(options, ['metric', 'p', 'weights'], 'dissimilarity');
    const metric = opts.metric ?? 'euclidean';
    const key = opts.weights === undefined ? `${metric}:${opts.p ?? ''}` : '';
    const cached = key ? this.dissimilarities.get(key) : undefined;
    if (cached) return cached;
    const input = metric === 'gower' ? { ...this.data.mixed, rowLabels: this.data.ids } : this.data.matrix;
    const d = dissimilarity(input, opts);
    if (key) this.dissimilarities.set(key, d);
    return d;
  }

  /** The evidence for how many segments: every criterion over a range of k, with a recommendation. */
  compareK(options: CompareKOptions = {}): CompareKResult & Showable {
    const onProgress = progressFor(options.onProgress, 'Comparing k');
    const result = compareK(this.data.matrix, { ...options, onProgress });
    return showable(result, () => kEvidenceView(result));
  }

  /** k-means on the prepared rows. */
  kmeans(options: KmeansOptions): Segmentation {
    const onProgress = progressFor(options?.onProgress, 'k-means restarts');
    const fit = kmeans(this.data.matrix, { ...options, onProgress });
    // The definition scores by nearest centre; settle the fit so centres and segments are a fixed
    // point of exactly that rule, and assign on the training rows gives the fitted segments.
    // A fit that already is one keeps its own centres unchanged.
    const asFitted = ruleAgreement(this.data.matrix, fit.assignment, fit.centers, 'euclidean', 'nearest-center');
    const settled =
      asFitted.reproduced === asFitted.rows
        ? { assignment: fit.assignment, centers: fit.centers, steps: 0, moved: 0, fixedPoint: true }
        : settleKmeans(this.data.matrix, fit.assignment, fit.k);
    const notes: string[] = [];
    if (settled.moved > 0 || !settled.fixedPoint) {
      notes.push(
        `k-means ${fit.converged ? 'converged within its tolerance' : `stopped at maxIterations (${options.maxIterations ?? fit.iterations})`} before its ` +
          `centres and segments fully agreed; ${settled.steps} more Lloyd step(s) moved ${settled.moved} row(s)` +
          (settled.fixedPoint
            ? ', so the nearest-centre rule now gives every training row its segment.'
            : ', and it is still not a fixed point (see ruleAgreement()).'),
      );
    }
    const { withinSS } = segmentMeans(this.data.matrix, settled.assignment, fit.k);
    return new Segmentation({
      method: 'kmeans',
      options: { k: fit.k, seed: options.seed ?? 0, restarts: options.restarts ?? 10, ...pick(options, ['maxIterations', 'tolerance']) },
      assignment: settled.assignment,
      centers: settled.centers,
      fit,
      objective: { name: 'withinSS', value: settled.moved > 0 ? withinSS : fit.withinSS },
      data: this.data,
      notes,
    });
  }

  /**
   * A Gaussian mixture on the prepared rows (EM; 5 restarts unless given). The segmentation's
   * membership() gives each row's probabilities; its definition scores new rows by the
   * highest-posterior rule.
   */
  mixture(options: StudyMixtureOptions): Segmentation {
    return fitMixture(this.data, options, progressFor(options?.onProgress, 'mixture restarts'));
  }

  /** Gaussian mixtures over a range of k and covariance shapes, compared by BIC (lower is better), with a view. */
  compareMixtures(options: CompareMixturesOptions = {}): CompareMixturesResult & Showable {
    const onProgress = progressFor(options?.onProgress, 'Comparing mixtures');
    const result = compareMixtures(this.data.matrix, { ...options, onProgress });
    return showable(result, () => mixtureEvidenceView(result));
  }

  /** k-medoids (PAM) on the prepared rows, or on Gower dissimilarities of the mixed columns. */
  kmedoids(options: { k: number; metric?: DissimilarityOptions['metric']; seed?: number; onProgress?: ProgressCallback }): Segmentation {
    const opts = checkOptions(options, ['k', 'metric', 'seed', 'onProgress'], 'kmedoids');
    const metric = opts.metric ?? 'euclidean';
    const d = this.dissimilarity({ metric });
    const fit = kmedoids(d, { k: opts.k, seed: opts.seed, onProgress: progressFor(opts.onProgress, 'k-medoids') });
    return new Segmentation({
      method: 'kmedoids',
      // PAM is deterministic: no seed shapes the result, so none is stored.
      options: { k: fit.k, metric },
      assignment: fit.assignment,
      centers: rowsAt(this.data.matrix, fit.medoids),
      medoids: [...fit.medoids],
      fit,
      objective: { name: 'cost', value: fit.cost },
      data: this.data,
      dissimilarity: d,
    });
  }

  /**
   * Density segments (HDBSCAN) on the prepared rows: segments where rows are dense, the rest marked
   * as noise (`assignment` -1, `segments` 0), shown and counted in every view. `fit` holds the
   * outlier scores, membership strengths and condensed-tree branches. O(n²) time, O(n) memory.
   */
  density(options: {
    minSize: number;
    minSamples?: number;
    metric?: DissimilarityOptions['metric'];
    onProgress?: ProgressCallback;
  }): Segmentation {
    const opts = checkOptions(options, ['minSize', 'minSamples', 'metric', 'onProgress'], 'density');
    const metric = opts.metric ?? 'euclidean';
    if (metric === 'gower') {
      throw new KinsortError(
        'density: the gower metric needs the whole mixed table; use a row metric (euclidean, manhattan, …) on the prepared rows.',
        'bad-option',
      );
    }
    const fit = densitySegments(this.data.matrix, {
      minSize: opts.minSize,
      ...(opts.minSamples === undefined ? {} : { minSamples: opts.minSamples }),
      metric,
      onProgress: progressFor(opts.onProgress, 'Density segments'),
    });
    if (fit.segmentCount === 0) {
      throw new KinsortError(
        `density: no segment found: all ${fit.noiseCount} rows are noise at minSize ${fit.minSize}, minSamples ${fit.minSamples}. ` +
          'A smaller minSize or minSamples finds smaller dense groups.',
        'bad-option',
      );
    }
    // Segment means over the segment members only (noise is in no segment).
    const kept = [...fit.assignment.keys()].filter((i) => fit.assignment[i] >= 0);
    const means = segmentMeans(
      takeRows(this.data.matrix, kept),
      Int32Array.from(kept, (i) => fit.assignment[i]),
      fit.segmentCount,
    );
    return new Segmentation({
      method: 'density',
      options: { minSize: fit.minSize, minSamples: fit.minSamples, metric },
      assignment: fit.assignment,
      centers: means.centers,
      fit,
      objective: { name: 'noise rows', value: fit.noiseCount },
      data: this.data,
      notes:
        fit.noiseCount > 0
          ? [
              `${fit.noiseCount.toLocaleString('en-US')} of ${fit.assignment.length.toLocaleString('en-US')} rows are in no segment (noise); they are kept and shown as noise.`,
            ]
          : [],
    });
  }

  /** An agglomerative hierarchy of the prepared rows (Ward, average, complete, single, …). */
  agglomerate(options: { method: LinkageMethod; metric?: DissimilarityOptions['metric']; onProgress?: ProgressCallback }): Hierarchy {
    const opts = checkOptions(options, ['method', 'metric', 'onProgress'], 'agglomerate');
    if (!opts.method) {
      throw new KinsortError('agglomerate: give a linkage method, e.g. { method: "ward" }.', 'bad-option');
    }
    const metric = opts.metric ?? 'euclidean';
    const vectors = metric === 'euclidean' && ['ward', 'centroid', 'median'].includes(opts.method);
    const used = vectors ? undefined : this.dissimilarity({ metric });
    // Progress opens with the work estimate (rows², minutes at 200,000 rows), then about 100 ticks.
    const progress = progressFor(opts.onProgress, 'Agglomerating');
    const tree = agglomerate(used ?? this.data.matrix, { method: opts.method, ...(progress ? { progress } : {}) });
    return new Hierarchy(tree, this.data, { linkage: opts.method, metric }, used);
  }

  /**
   * Which variables go together: a hierarchy of the used columns (unscaled, after imputation and
   * log), 1 − r² by default. Binary columns enter coded 0/1, ordinal ones by level rank; unordered
   * categorical columns are left out and listed in `leftOut` with the reason.
   */
  variableTree(
    options: { similarity?: CorrelationKind; strength?: CorrelationStrength; method?: VariableLinkage } = {},
  ): VariableHierarchy {
    const opts = checkOptions(options, ['similarity', 'strength', 'method'], 'variableTree');
    const { matrix, leftOut, entered } = variableColumns(this.data.mixed);
    return new VariableHierarchy(variableTree(matrix, opts), leftOut, entered);
  }

  /**
   * The same study prepared again with the same options, using only `columns` (e.g. the
   * representatives of a variable tree's groups): prepared.use(vars.representatives({ k: 4 })).
   */
  use(columns: readonly string[]): PreparedStudy {
    if (!Array.isArray(columns) || columns.length === 0 || columns.some((c) => typeof c !== 'string')) {
      throw new KinsortError(
        'use: give a non-empty list of column names, e.g. prepared.use(vars.representatives({ k: 4 })).',
        'bad-option',
      );
    }
    if (!this.origin) {
      throw new KinsortError(
        'use: this prepared study was built by hand, not by study(…).prepare(…); start a new study with { use } instead.',
        'not-supported',
      );
    }
    const { study: from, options } = this.origin;
    return new Study(from.table, { ...from.roles, use: [...columns] }).prepare(options);
  }

  /** Principal components of the prepared rows; `.show()` draws the scree. */
  project(options: { components?: number } = {}): Projection & Showable {
    const opts = checkOptions(options, ['components'], 'project');
    const components = opts.components ?? Math.min(this.data.matrix.cols, 10);
    const p = project(this.data.matrix, { components });
    return showable(p, () => screeView(p));
  }
}

function pick(source: object, keys: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const key of keys) {
    const v = (source as Record<string, unknown>)[key];
    if (v !== undefined) out[key] = v;
  }
  return out;
}
