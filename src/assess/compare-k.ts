// One comparison over a range of k: k-means at each k, every criterion in one table (with the
// bootstrap stability of the segments), a recommended k and the reasons for it in plain sentences.
// The rule that picks k lives in k-choice.ts (K_CHOICE_RULE states it in words), the sentences
// in k-reasons.ts.
//
// Cost on many rows: the k-means fits of the table use all rows. The gap statistic's reference sets
// and the stability resamples are drawn on one seeded sample of `sampleRows` rows (default 4,000):
// both criteria compare proportions and per-row averages, whose sampling error falls like
// 1/√rows, so a few thousand rows settle them while their cost stops growing with the table (see
// k-stability.ts and gapOnSample below).
import { KinsortError } from '../core/errors';
import { Matrix, RowsInput, takeRows, toMatrix } from '../core/matrix';
import { checkInteger, checkOptions } from '../core/options';
import { ProgressCallback, report } from '../core/progress';
import { countDistinctRows } from '../methods/partition/distinct-rows';
import { kmeans } from '../methods/partition/kmeans';
import { createRandom, Seed } from '../random';
import { calinskiHarabasz } from './calinski-harabasz';
import { daviesBouldin } from './davies-bouldin';
import { gapFromDataFit, GapStatisticResult, withinForK } from './gap-statistic';
import { chooseK, K_CHOICE_RULE, stabilitySuggestion } from './k-choice';
import { explain, headlineFor } from './k-reasons';
import { stabilityAcrossK } from './k-stability';
import { predictionStrengthAcrossK, PREDICTION_STRENGTH_FROM } from './prediction-strength';
import { findKnee } from './knee';
import { silhouettesOfLabellings } from './silhouettes-of-labellings';

export interface CompareKOptions {
  /** Smallest k (default 2; the measures other than the gap need two segments). */
  from?: number;
  /** Largest k (default 8, or fewer when there are fewer rows). */
  to?: number;
  seed?: Seed;
  /**
   * k-means restarts at each k (default 10). Above 20,000 rows they run on a seeded sample of
   * 10,000 rows and the best start is finished on all rows (Bradley & Fayyad 1998).
   */
  restarts?: number;
  /** Gap reference sets (default 20). */
  references?: number;
  /** Compute the gap statistic (default true). */
  gap?: boolean;
  /** Compute the bootstrap stability of the segments at each k (default true). */
  stability?: boolean;
  /** Compute the prediction strength at each k (Tibshirani & Walther 2005; default true). */
  predictionStrength?: boolean;
  /** Bootstrap resamples per k for the stability (default 20). */
  resamples?: number;
  /** Above this many rows, gap reference sets and stability resamples use a seeded sample of this size (default 4,000). */
  sampleRows?: number;
  /** Rows used for the silhouette, which costs n² distances; above this a seeded sample is used (default 10,000). */
  silhouetteRows?: number;
  onProgress?: ProgressCallback;
}

export interface CompareKRow {
  readonly k: number;
  readonly withinSS: number;
  readonly silhouette: number;
  readonly calinskiHarabasz: number;
  readonly daviesBouldin: number;
  /** Present when the gap statistic was computed. */
  readonly gap?: number;
  readonly gapSE?: number;
  /** Mean bootstrap Jaccard over the segments (Hennig 2007); present when stability was computed. */
  readonly stability?: number;
  /** The lowest segment's mean bootstrap Jaccard. */
  readonly weakestStability?: number;
  /** Mean bootstrap Jaccard of each segment, in segment order (0..k-1) of `assignments`. */
  readonly stabilityBySegment?: number[];
  /** Prediction strength (Tibshirani & Walther 2005), mean over random halvings; present when computed. */
  readonly predictionStrength?: number;
}

export interface CompareKByCriterion {
  readonly silhouette: number;
  readonly calinskiHarabasz: number;
  readonly daviesBouldin: number;
  /** The gap statistic's k (may be 1: no more structure than uniform reference data); absent when not computed. */
  readonly gap?: number;
  /** Knee of the within-SS curve; absent when the curve has no clear bend. */
  readonly knee?: number;
  /** The largest k whose every segment is stable; absent when none is or stability was not computed. */
  readonly stability?: number;
  /** The largest k with prediction strength ≥ 0.8; absent when none reaches it or it was not computed. */
  readonly predictionStrength?: number;
}

export interface CompareKResult {
  readonly kind: 'k-comparison';
  readonly table: CompareKRow[];
  /** The recommended k: 1 when the rows show no clustering structure. */
  readonly recommended: number;
  /** One line naming the recommendation and the rule behind it. */
  readonly headline: string;
  /** The rule, in words (K_CHOICE_RULE). */
  readonly rule: string;
  /** Whether the gap statistic found no more structure than in structureless reference data. */
  readonly noStructure: boolean;
  readonly reasons: string[];
  readonly byCriterion: CompareKByCriterion;
  /** The full gap table (from k = 1), when computed. */
  readonly gapTable?: GapStatisticResult['table'];
  /** The k-means assignment at each k of the table, in table order. */
  readonly assignments: Int32Array[];
  /** Rows of the seeded sample used by the gap statistic and stability (all rows when not sampled). */
  readonly sampleRows: number;
}

const COMPARE_K_OPTIONS = [
  'from',
  'to',
  'seed',
  'restarts',
  'references',
  'gap',
  'stability',
  'predictionStrength',
  'resamples',
  'sampleRows',
  'silhouetteRows',
  'onProgress',
] as const;

/** The recommendation rule (kept under its former name for callers that quote it). */
export const COMPARE_K_RULE = K_CHOICE_RULE;

// Uniform reference sets have no competing optima for restarts to escape (every start lands on an
// equally good cut of the box), so two restarts each suffice; R's cluster::clusGap runs its
// clustering function as given, kmeans with one start by default.
const REFERENCE_RESTARTS = 2;
// Resamples are refitted as the data were, but with fewer restarts: the k-means++ start of a
// resample already sits near the original solution when the segments are real.
const RESAMPLE_RESTARTS = 2;
// Restarts search for the best start; on many rows a seeded sample of this size places the
// centres as well as all rows do (each centre is a mean of hundreds of rows or more), so the
// search runs there and one k-means on all rows finishes from its best start.
const START_ROWS = 10_000;
// Random halvings for the prediction strength (the paper uses a few repeats of two-fold splits).
const PREDICTION_SPLITS = 5;

export function compareK(rows: RowsInput, options?: CompareKOptions): CompareKResult {
  const where = 'compareK';
  const opts = checkOptions(options, COMPARE_K_OPTIONS, where);
  const m = toMatrix(rows, { what: `${where} rows`, minRows: 3 });
  const from = checkInteger(opts.from ?? 2, `${where}: from`, 2, m.rows - 1);
  const to = checkInteger(opts.to ?? Math.min(8, m.rows - 1), `${where}: to`, from, m.rows - 1);
  if (to - from < 1) {
    throw new KinsortError(`${where}: from = ${from} and to = ${to} leave a single k; give a range of at least two.`, 'bad-k');
  }
  const seed = opts.seed ?? 0;
  const restarts = checkInteger(opts.restarts ?? 10, `${where}: restarts`, 1);
  const useGap = opts.gap ?? true;
  const useStability = opts.stability ?? true;
  const usePrediction = opts.predictionStrength ?? true;
  const references = checkInteger(opts.references ?? 20, `${where}: references`, 1);
  const resamples = checkInteger(opts.resamples ?? 20, `${where}: resamples`, 2);
  const sampleRows = checkInteger(opts.sampleRows ?? 4_000, `${where}: sampleRows`, 50);
  const silhouetteRows = checkInteger(opts.silhouetteRows ?? 10_000, `${where}: silhouetteRows`, 2);

  const ks: number[] = [];
  for (let k = from; k <= to; k++) ks.push(k);
  const gapKs: number[] = [];
  for (let k = 1; k <= to; k++) gapKs.push(k);
  const total = ks.length + (useGap ? references + (from - 2) : 0) + (useStability ? ks.length : 0) + (usePrediction ? 1 : 0);
  let done = 0;
  const step = (detail: string) => report(opts.onProgress, { task: 'k comparison', done: ++done, total, detail });

  const forSilhouette = seededSample(m, silhouetteRows, seed, 'silhouette sample');
  const silhouetteRowsM = forSilhouette ? takeRows(m, forSilhouette) : m;
  // A sample must hold at least `to` distinct rows to be segmented at every k; rows with few
  // distinct values (one-hot columns only, say) fall back to all rows.
  const drawn = seededSample(m, sampleRows, seed, 'evidence sample');
  const sample = drawn && countDistinctRows(takeRows(m, drawn), to) >= to ? drawn : undefined;
  const table: CompareKRow[] = [];
  const assignments: Int32Array[] = [];
  const centresByK = new Map<number, number[][]>();
  const withinByK = new Map<number, number>();
  const startRows = m.rows > 2 * START_ROWS ? takeRows(m, seededSample(m, START_ROWS, seed, 'start sample')!) : undefined;
  const starts = startRows && countDistinctRows(startRows, to) >= to ? startRows : undefined;
  const silhouetteLabels: Int32Array[] = [];
  for (const k of ks) {
    const fit = starts ? kmeans(m, { k, start: kmeans(starts, { k, seed, restarts }).centers }) : kmeans(m, { k, seed, restarts });
    withinByK.set(k, fit.withinSS);
    centresByK.set(k, fit.centers);
    silhouetteLabels.push(forSilhouette ? Int32Array.from(forSilhouette, (i) => fit.assignment[i]) : fit.assignment);
    table.push({
      k,
      withinSS: fit.withinSS,
      silhouette: NaN, // all k at once below: the distances between the rows are the same at every k
      calinskiHarabasz: calinskiHarabasz(m, fit.assignment),
      daviesBouldin: daviesBouldin(m, fit.assignment),
    });
    assignments.push(fit.assignment);
    step(`k = ${k}`);
  }
  const silhouettes = silhouettesOfLabellings(silhouetteRowsM, silhouetteLabels, `${where}: silhouette`);
  for (let t = 0; t < table.length; t++) table[t] = { ...table[t], silhouette: silhouettes[t].average };

  let gapResult: GapStatisticResult | undefined;
  if (useGap) {
    const onReference = () => step('gap reference set');
    gapResult = sample
      ? gapOnSample(takeRows(m, sample), gapKs, centresByK, { references, seed, restarts, onReference, onExtraK: step }, where)
      : gapOnAllRows(m, gapKs, withinByK, { references, seed, restarts, onReference, onExtraK: step }, where);
    for (let t = 0; t < table.length; t++) {
      const row = gapResult.table[table[t].k - 1];
      table[t] = { ...table[t], gap: row.gap, gapSE: row.se };
    }
  }

  if (useStability) {
    const random = createRandom(seed).fork('stability');
    const byK = stabilityAcrossK(m, sample, ks, assignments, {
      resamples,
      restarts: Math.min(restarts, RESAMPLE_RESTARTS),
      random,
      onK: (k) => step(`stability, k = ${k}`),
    });
    for (let t = 0; t < table.length; t++) {
      table[t] = { ...table[t], stability: byK[t].mean, weakestStability: byK[t].weakest, stabilityBySegment: byK[t].bySegment };
    }
  }

  if (usePrediction) {
    const random = createRandom(seed).fork('prediction strength');
    const strengths = predictionStrengthAcrossK(sample ? takeRows(m, sample) : m, ks, {
      splits: PREDICTION_SPLITS,
      restarts: Math.min(restarts, RESAMPLE_RESTARTS),
      random,
    });
    for (let t = 0; t < table.length; t++) table[t] = { ...table[t], predictionStrength: strengths[t] };
    step('prediction strength');
  }

  const byCriterion = chooseByCriterion(table, gapResult);
  const choice = chooseK({
    ks,
    silhouette: table.map((r) => r.silhouette),
    weakestStability: useStability ? table.map((r) => r.weakestStability!) : undefined,
    gap: byCriterion.gap,
    knee: byCriterion.knee,
  });
  const evidenceRows = sample ? sample.length : m.rows;
  const reasons = explain(table, byCriterion, choice, gapResult, {
    silhouetteSampled: forSilhouette?.length,
    evidenceRows,
    sampled: sample !== undefined,
    resamples: useStability ? resamples : undefined,
    splits: usePrediction ? PREDICTION_SPLITS : undefined,
  });
  return {
    kind: 'k-comparison',
    table,
    recommended: choice.recommended,
    headline: headlineFor(choice, byCriterion, useStability),
    rule: K_CHOICE_RULE,
    noStructure: choice.noStructure,
    reasons,
    byCriterion,
    ...(gapResult ? { gapTable: gapResult.table } : {}),
    assignments,
    sampleRows: evidenceRows,
  };
}

/**
 * A seeded sample of `limit` rows (in row order) for the silhouette, the same sample compareK
 * uses; undefined when all rows fit.
 */
export function silhouetteSample(m: Matrix, limit: number, seed: Seed): { indices: Int32Array; rows: Matrix } | undefined {
  const indices = seededSample(m, limit, seed, 'silhouette sample');
  return indices && { indices, rows: takeRows(m, indices) };
}

interface GapSteps {
  references: number;
  seed: Seed;
  restarts: number;
  onReference: () => void;
  onExtraK: (detail: string) => void;
}

/** The gap statistic on all rows, reusing the table's fits for log W_k. */
function gapOnAllRows(m: Matrix, gapKs: number[], withinByK: Map<number, number>, s: GapSteps, where: string): GapStatisticResult {
  const logW = gapKs.map((k) => {
    if (!withinByK.has(k)) {
      // k below `from` is fitted only for the gap (k = 1 needs no k-means).
      withinByK.set(k, withinForK(m, k, s.seed, s.restarts));
      if (k > 1) s.onExtraK(`k = ${k} (gap only)`);
    }
    return Math.log(withinByK.get(k)!);
  });
  return gapFromDataFit(
    m,
    gapKs,
    logW,
    { references: s.references, seed: s.seed, restarts: REFERENCE_RESTARTS, onProgress: s.onReference },
    where,
  );
}

/**
 * The gap statistic of a seeded sample of the rows: the data's W_k and the reference sets both
 * have the sample's size, so the statistic is exactly Tibshirani et al.'s, for those rows (their
 * simulations used 50 to 200 rows; a few thousand leave its standard error small). W_k of the
 * sample starts k-means from the centres found on all rows, which the sample shares.
 */
function gapOnSample(sample: Matrix, gapKs: number[], centresByK: Map<number, number[][]>, s: GapSteps, where: string): GapStatisticResult {
  const logW = gapKs.map((k) => {
    if (k === 1) return Math.log(withinForK(sample, 1, s.seed, 1));
    const centres = centresByK.get(k);
    if (centres) return Math.log(kmeans(sample, { k, start: centres }).withinSS);
    s.onExtraK(`k = ${k} (gap only)`);
    return Math.log(withinForK(sample, k, s.seed, s.restarts));
  });
  return gapFromDataFit(
    sample,
    gapKs,
    logW,
    { references: s.references, seed: s.seed, restarts: REFERENCE_RESTARTS, onProgress: s.onReference },
    where,
  );
}

/** Sorted indices of a seeded sample of `limit` rows, or undefined when all rows fit. */
function seededSample(m: Matrix, limit: number, seed: Seed, stream: string): Int32Array | undefined {
  if (m.rows <= limit) return undefined;
  const random = createRandom(seed).fork(stream);
  const order = random.shuffle(Int32Array.from({ length: m.rows }, (_, i) => i));
  return order.subarray(0, limit).sort();
}

function bestBy(table: readonly CompareKRow[], value: (r: CompareKRow) => number, larger: boolean): number {
  let best = table[0];
  for (const r of table) {
    const v = value(r);
    const b = value(best);
    if (larger ? v > b : v < b) best = r;
  }
  return best.k;
}

function chooseByCriterion(table: readonly CompareKRow[], gap: GapStatisticResult | undefined): CompareKByCriterion {
  const knee = findKnee(
    table.map((r) => r.k),
    table.map((r) => r.withinSS),
    { direction: 'decreasing', curve: 'convex' },
  ).knee;
  return {
    silhouette: bestBy(table, (r) => r.silhouette, true),
    calinskiHarabasz: bestBy(table, (r) => r.calinskiHarabasz, true),
    daviesBouldin: bestBy(table, (r) => r.daviesBouldin, false),
    ...(gap ? { gap: gap.recommended } : {}),
    ...(knee !== null ? { knee } : {}),
    ...stabilityPick(table),
    ...predictionPick(table),
  };
}

function predictionPick(table: readonly CompareKRow[]): { predictionStrength?: number } {
  let pick: number | undefined;
  for (const r of table) if (r.predictionStrength !== undefined && r.predictionStrength >= PREDICTION_STRENGTH_FROM) pick = r.k;
  return pick === undefined ? {} : { predictionStrength: pick };
}

function stabilityPick(table: readonly CompareKRow[]): { stability?: number } {
  if (table.some((r) => r.weakestStability === undefined)) return {};
  const pick = stabilitySuggestion(
    table.map((r) => r.k),
    table.map((r) => r.weakestStability!),
  );
  return pick === undefined ? {} : { stability: pick };
}
