// densitySegments(): HDBSCAN (Campello, Moulavi & Sander 2013; McInnes & Healy 2017) — segments
// as the most persistent dense regions, rows outside them marked as noise, with GLOSH outlier
// scores. Steps, one file each: core distances, mutual reachability, its minimum spanning tree
// (single-linkage hierarchy), the condensed tree, excess-of-mass selection, GLOSH.
import { KinsortError, checkChoice } from '../../core/errors';
import { RowsInput, isMatrix, toMatrix } from '../../core/matrix';
import { checkInteger, checkOptions } from '../../core/options';
import { ProgressCallback, report } from '../../core/progress';
import { Dissimilarity, isDissimilarity } from '../../measure/condensed';
import { MetricName, ROW_METRICS, checkExponent } from '../../measure/metrics';
import { mergeTicker } from '../hierarchy/ticker';
import { condenseTree } from './condensed-tree';
import { coreDistances } from './core-distances';
import { selectByExcessOfMass } from './excess-of-mass';
import { gloshScores } from './glosh';
import { PairSource, pairsFromDissimilarity, pairsFromRows } from './pair-source';
import { spanningHierarchy } from './spanning-hierarchy';

/** The assignment value of a noise row. */
export const NOISE = -1;

export interface DensitySegmentsOptions {
  /** Fewest rows a segment may have (≥ 2). A group that splits off with fewer rows is noise at that density. */
  minSize: number;
  /**
   * How many rows (the row itself counted as the first) must lie within a row's core distance
   * (default: minSize). Larger values smooth the density; R dbscan's `minPts` sets both this and minSize.
   */
  minSamples?: number;
  /** For rows only: the metric (default euclidean). A Dissimilarity carries its own. */
  metric?: MetricName;
  /** Minkowski exponent, with metric "minkowski". */
  p?: number;
  /** Called about a hundred times while the spanning tree grows (task "density segments"). */
  onProgress?: ProgressCallback;
}

/** One cluster of the condensed tree, as the summary reports it. */
export interface DensityBranch {
  /** Position in `branches`; 0 is the root (all rows). */
  readonly branch: number;
  /** The branch it split from (-1 for the root). */
  readonly from: number;
  /** Distance (1/λ) at which it appeared; Infinity for the root. */
  readonly bornAtDistance: number;
  /** Rows it held when it appeared. */
  readonly rows: number;
  /** Its excess of mass (the stability of Campello et al.); NaN when identical rows make it infinite. */
  readonly excessOfMass: number;
  /** The segment it became (0-based), or -1 when it was not chosen. */
  readonly segment: number;
}

export interface DensitySegmentsResult {
  readonly kind: 'density';
  /** Segment of each row, 0..segmentCount-1, or NOISE (-1) for rows in no segment. */
  readonly assignment: Int32Array;
  /** Number of segments (noise not counted). */
  readonly segmentCount: number;
  /** Rows per segment. */
  readonly sizes: number[];
  /** Rows marked as noise. */
  readonly noiseCount: number;
  /** 1 for noise rows: the same information as assignment === NOISE, as a mask. */
  readonly noise: Uint8Array;
  /**
   * How firmly each row sits in its segment, in [0, 1]: the λ at which the row leaves the condensed
   * tree divided by the largest such λ in its segment (1 = among the densest). 0 for noise.
   */
  readonly strength: Float64Array;
  /** GLOSH outlier score of each row, in [0, 1]. */
  readonly outlierScores: Float64Array;
  /** Core distance of each row. */
  readonly coreDistances: Float64Array;
  /** The condensed tree's branches, root first. */
  readonly branches: DensityBranch[];
  readonly minSize: number;
  readonly minSamples: number;
  readonly metric: string;
}

const WHERE = 'densitySegments';
const OPTIONS = ['minSize', 'minSamples', 'metric', 'p', 'onProgress'] as const;

/**
 * Density segments by HDBSCAN, with GLOSH outlier scores.
 *
 * `input` is rows (`number[][]` or a Matrix) with a metric, or a Dissimilarity (used as given).
 * Cost: O(n²) distance evaluations for the core distances and O(n²) for Prim's spanning tree on
 * the mutual reachability distance (computed when needed, not stored): O(n²) time in all, and
 * O(n) memory beyond the rows or the given dissimilarity. No n × n matrix is built.
 *
 * Deterministic. Ties: Prim starts at row 0 and prefers the smallest row index among equal
 * candidates; merges of equal height keep the order Prim found them; a cluster whose excess of
 * mass equals the sum of its children's is kept whole. Segments are numbered by their first row.
 */
export function densitySegments(input: RowsInput | Dissimilarity, options: DensitySegmentsOptions): DensitySegmentsResult {
  const opts = checkOptions(options, OPTIONS, WHERE);
  if (options === undefined || opts.minSize === undefined) {
    throw new KinsortError(`${WHERE}: option minSize is required: the fewest rows a segment may have (a whole number ≥ 2).`, 'bad-option');
  }
  if (opts.onProgress !== undefined && typeof opts.onProgress !== 'function') {
    throw new KinsortError(`${WHERE}: option onProgress must be a function (event) => void.`, 'bad-option');
  }
  const source = sourceOf(input, opts);
  const n = source.size;
  const minSize = checkInteger(opts.minSize, `${WHERE}: minSize`, 2);
  if (minSize > n) {
    throw new KinsortError(
      `${WHERE}: minSize is ${minSize} but there are only ${n} rows; a segment cannot be larger than the data.`,
      'bad-option',
    );
  }
  const minSamples = checkInteger(opts.minSamples ?? minSize, `${WHERE}: minSamples`, 1);
  if (minSamples > n) {
    throw new KinsortError(
      `${WHERE}: minSamples is ${minSamples} but there are only ${n} rows (the row itself counts as one).`,
      'bad-option',
    );
  }
  report(opts.onProgress, { task: 'density segments', done: 0, total: n - 1, detail: 'core distances' });
  const core = coreDistances(source, minSamples);
  const merges = spanningHierarchy(source, core, mergeTicker(opts.onProgress, n, 'mutual reachability'));
  const tree = condenseTree(n, merges, minSize);
  const selection = selectByExcessOfMass(tree);
  const outlierScores = gloshScores(tree);

  // Number segments by their first row, so the numbering does not depend on the tree's layout.
  const segmentOfCluster = new Int32Array(tree.clusterCount).fill(NOISE);
  let segmentCount = 0;
  const assignment = new Int32Array(n);
  for (let r = 0; r < n; r++) {
    const c = selection.rowChosen[r];
    if (c < 0) assignment[r] = NOISE;
    else {
      if (segmentOfCluster[c] === NOISE) segmentOfCluster[c] = segmentCount++;
      assignment[r] = segmentOfCluster[c];
    }
  }
  const sizes = new Array<number>(segmentCount).fill(0);
  const noise = new Uint8Array(n);
  let noiseCount = 0;
  const top = new Float64Array(segmentCount);
  for (let r = 0; r < n; r++) {
    const s = assignment[r];
    if (s === NOISE) {
      noise[r] = 1;
      noiseCount++;
    } else {
      sizes[s]++;
      if (tree.rowJoins[r] > top[s]) top[s] = tree.rowJoins[r];
    }
  }
  const strength = new Float64Array(n);
  for (let r = 0; r < n; r++) {
    const s = assignment[r];
    if (s === NOISE) continue;
    const lambda = tree.rowJoins[r];
    strength[r] = top[s] === Infinity ? (lambda === Infinity ? 1 : 0) : top[s] > 0 ? lambda / top[s] : 1;
  }
  const branches: DensityBranch[] = [];
  for (let c = 0; c < tree.clusterCount; c++) {
    branches.push({
      branch: c,
      from: tree.parent[c],
      bornAtDistance: 1 / tree.birth[c],
      rows: tree.rows[c],
      excessOfMass: selection.stability[c],
      segment: segmentOfCluster[c],
    });
  }
  report(opts.onProgress, {
    task: 'density segments',
    done: n - 1,
    total: n - 1,
    detail: `${segmentCount} segments, ${noiseCount} noise rows`,
  });
  return {
    kind: 'density',
    assignment,
    segmentCount,
    sizes,
    noiseCount,
    noise,
    strength,
    outlierScores,
    coreDistances: core,
    branches,
    minSize,
    minSamples,
    metric: source.metric,
  };
}

function sourceOf(input: RowsInput | Dissimilarity, opts: DensitySegmentsOptions): PairSource {
  if (isDissimilarity(input)) {
    if (opts.metric !== undefined || opts.p !== undefined) {
      throw new KinsortError(
        `${WHERE}: options metric and p apply to rows; this dissimilarity was already computed (metric "${input.metric}").`,
        'bad-option',
      );
    }
    return pairsFromDissimilarity(input);
  }
  if (!Array.isArray(input) && !isMatrix(input)) {
    throw new KinsortError(`${WHERE}: give rows (number[][] or a Matrix) or a dissimilarity.`, 'bad-input');
  }
  let metric: MetricName;
  try {
    metric = checkChoice(opts.metric ?? 'euclidean', ROW_METRICS, 'metric');
  } catch (e) {
    if (e instanceof KinsortError) throw new KinsortError(`${WHERE}: ${e.message}`, e.code);
    throw e;
  }
  const p = checkExponent(metric, opts.p, WHERE);
  const rows = toMatrix(input, { what: `${WHERE}: rows`, minRows: 2 });
  if (rows.cols === 0) throw new KinsortError(`${WHERE}: the rows have no columns.`, 'empty');
  return pairsFromRows(rows, metric, p);
}
