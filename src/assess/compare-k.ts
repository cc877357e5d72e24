// One comparison over a range of k: k-means at each k, every criterion in one table, a
// recommended k and the reasons for it in plain sentences.
//
// Combination rule (also stated in `reasons`): each available criterion votes for one k —
// silhouette (highest), Calinski–Harabasz (highest), Davies–Bouldin (lowest), the gap statistic
// (Tibshirani et al.'s one-standard-error rule) and the knee of the within-SS curve (Kneedle).
// The k with most votes is recommended; a tie goes to the silhouette's choice when it is among
// the tied, otherwise to the smallest tied k (the simpler segmentation).
import { KinsortError } from '../core/errors';
import { Matrix, RowsInput, takeRows, toMatrix } from '../core/matrix';
import { checkInteger, checkOptions } from '../core/options';
import { ProgressCallback, report } from '../core/progress';
import { kmeans } from '../methods/partition/kmeans';
import { createRandom, Seed } from '../random';
import { calinskiHarabasz } from './calinski-harabasz';
import { daviesBouldin } from './davies-bouldin';
import { gapFromDataFit, GapStatisticResult, withinForK } from './gap-statistic';
import { findKnee } from './knee';
import { silhouette } from './silhouette';

export interface CompareKOptions {
  /** Smallest k (default 2; the measures other than the gap need two segments). */
  from?: number;
  /** Largest k (default 8, or fewer when there are fewer rows). */
  to?: number;
  seed?: Seed;
  /** k-means restarts at each k (default 10). */
  restarts?: number;
  /** Gap reference sets (default 20). */
  references?: number;
  /** Compute the gap statistic (default true; it costs `references` extra k sweeps). */
  gap?: boolean;
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
}

export interface CompareKByCriterion {
  readonly silhouette: number;
  readonly calinskiHarabasz: number;
  readonly daviesBouldin: number;
  /** The gap statistic's k (may be 1: no more structure than uniform reference data); absent when not computed. */
  readonly gap?: number;
  /** Knee of the within-SS curve; absent when the curve has no clear bend. */
  readonly knee?: number;
}

export interface CompareKResult {
  readonly kind: 'k-comparison';
  readonly table: CompareKRow[];
  readonly recommended: number;
  readonly reasons: string[];
  readonly byCriterion: CompareKByCriterion;
  /** The full gap table (from k = 1), when computed. */
  readonly gapTable?: GapStatisticResult['table'];
  /** The k-means assignment at each k of the table, in table order. */
  readonly assignments: Int32Array[];
}

const COMPARE_K_OPTIONS = ['from', 'to', 'seed', 'restarts', 'references', 'gap', 'silhouetteRows', 'onProgress'] as const;

export const COMPARE_K_RULE =
  'Each criterion votes for one k; the k with most votes is recommended, a tie going to the silhouette\'s choice when it is among the tied, otherwise to the smallest tied k.';

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
  const references = checkInteger(opts.references ?? 20, `${where}: references`, 1);
  const silhouetteRows = checkInteger(opts.silhouetteRows ?? 10_000, `${where}: silhouetteRows`, 2);

  const ks: number[] = [];
  for (let k = from; k <= to; k++) ks.push(k);
  const gapKs: number[] = [];
  for (let k = 1; k <= to; k++) gapKs.push(k);
  const total = ks.length + (useGap ? references + (from - 2) : 0);
  let done = 0;
  const step = (detail: string) => report(opts.onProgress, { task: 'k comparison', done: ++done, total, detail });

  const sample = silhouetteSample(m, silhouetteRows, seed);
  const table: CompareKRow[] = [];
  const assignments: Int32Array[] = [];
  const withinByK = new Map<number, number>();
  for (const k of ks) {
    const fit = kmeans(m, { k, seed, restarts });
    withinByK.set(k, fit.withinSS);
    const forSilhouette = sample ? Int32Array.from(sample.indices, (i) => fit.assignment[i]) : fit.assignment;
    table.push({
      k,
      withinSS: fit.withinSS,
      silhouette: silhouette(sample ? sample.rows : m, forSilhouette).average,
      calinskiHarabasz: calinskiHarabasz(m, fit.assignment),
      daviesBouldin: daviesBouldin(m, fit.assignment),
    });
    assignments.push(fit.assignment);
    step(`k = ${k}`);
  }

  let gapResult: GapStatisticResult | undefined;
  if (useGap) {
    // k below `from` is fitted only for the gap (k = 1 needs no k-means).
    const logW = gapKs.map((k) => {
      if (!withinByK.has(k)) {
        withinByK.set(k, withinForK(m, k, seed, restarts));
        if (k > 1) step(`k = ${k} (gap only)`);
      }
      return Math.log(withinByK.get(k)!);
    });
    gapResult = gapFromDataFit(m, gapKs, logW, { references, seed, restarts, onProgress: () => step('gap reference set') }, where);
    for (let t = 0; t < table.length; t++) {
      const row = gapResult.table[table[t].k - 1];
      table[t] = { ...table[t], gap: row.gap, gapSE: row.se };
    }
  }

  const byCriterion = chooseByCriterion(table, gapResult);
  const { recommended, votes } = combine(byCriterion);
  const reasons = explain(table, byCriterion, recommended, votes, gapResult, sample?.indices.length);
  return {
    kind: 'k-comparison',
    table,
    recommended,
    reasons,
    byCriterion,
    ...(gapResult ? { gapTable: gapResult.table } : {}),
    assignments,
  };
}

/** A seeded sample of `limit` rows (in row order) for the silhouette; undefined when all rows fit. */
export function silhouetteSample(m: Matrix, limit: number, seed: Seed): { indices: Int32Array; rows: Matrix } | undefined {
  if (m.rows <= limit) return undefined;
  const random = createRandom(seed).fork('silhouette sample');
  const order = random.shuffle(Int32Array.from({ length: m.rows }, (_, i) => i));
  const indices = order.subarray(0, limit).sort();
  return { indices, rows: takeRows(m, indices) };
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
  };
}

/** Majority vote; ties to the silhouette's choice, then to the smallest k. */
export function combine(byCriterion: CompareKByCriterion): { recommended: number; votes: Map<number, number> } {
  const votes = new Map<number, number>();
  for (const k of Object.values(byCriterion)) {
    if (typeof k === 'number') votes.set(k, (votes.get(k) ?? 0) + 1);
  }
  const most = Math.max(...votes.values());
  const tied = [...votes.entries()].filter(([, v]) => v === most).map(([k]) => k).sort((a, b) => a - b);
  const recommended = tied.includes(byCriterion.silhouette) ? byCriterion.silhouette : tied[0];
  return { recommended, votes };
}

function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  return a >= 1000 ? v.toFixed(0) : a >= 10 ? v.toFixed(1) : v.toFixed(3);
}

function explain(
  table: readonly CompareKRow[],
  by: CompareKByCriterion,
  recommended: number,
  votes: Map<number, number>,
  gap: GapStatisticResult | undefined,
  sampled: number | undefined,
): string[] {
  const at = (k: number) => table.find((r) => r.k === k)!;
  const range = `k = ${table[0].k} to ${table[table.length - 1].k}`;
  const reasons: string[] = [];
  reasons.push(
    `The average silhouette is highest at k = ${by.silhouette} (${fmt(at(by.silhouette).silhouette)})` +
      (sampled ? `, computed on a seeded sample of ${sampled} rows.` : '.'),
  );
  reasons.push(`Calinski–Harabasz is highest at k = ${by.calinskiHarabasz} (${fmt(at(by.calinskiHarabasz).calinskiHarabasz)}).`);
  reasons.push(`Davies–Bouldin is lowest at k = ${by.daviesBouldin} (${fmt(at(by.daviesBouldin).daviesBouldin)}).`);
  if (gap) {
    if (by.gap === 1) {
      reasons.push(
        `The gap statistic picks k = 1: the rows are not clearly tighter in segments than uniform reference data, so any segmentation may be arbitrary.`,
      );
    } else if (by.gap === table[table.length - 1].k && gap.table.every((r, t) => t + 1 >= gap.table.length || r.gap < gap.table[t + 1].gap - gap.table[t + 1].se)) {
      reasons.push(`The gap statistic is still rising at k = ${by.gap}, the largest k tried; more segments may be worth trying.`);
    } else {
      reasons.push(`The gap statistic levels off at k = ${by.gap}: ${gap.rule}, with ${gap.references} reference sets.`);
    }
  }
  reasons.push(
    by.knee !== undefined
      ? `The within-segment sum of squares bends most sharply at k = ${by.knee} (Kneedle).`
      : `The within-segment sum of squares shows no clear bend over ${range}.`,
  );
  const count = votes.get(recommended) ?? 0;
  const voters = Object.values(by).filter((k) => typeof k === 'number').length;
  reasons.push(
    `Recommended: k = ${recommended}, the choice of ${count} of ${voters} criteria. ` + COMPARE_K_RULE,
  );
  const width = at(recommended)?.silhouette;
  if (width !== undefined && width < 0.25) {
    reasons.push(
      `At k = ${recommended} the average silhouette is only ${fmt(width)}; below about 0.25 there is no substantial structure (common practice).`,
    );
  }
  return reasons;
}
