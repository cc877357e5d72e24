// The words of a k comparison: its one-line headline and the reasons, criterion by criterion,
// with what each criterion measures when they disagree.
import type { CompareKByCriterion, CompareKRow } from './compare-k';
import type { GapStatisticResult } from './gap-statistic';
import { KChoice, K_CHOICE_RULE } from './k-choice';
import { PREDICTION_STRENGTH_FROM } from './prediction-strength';
import { STABLE_FROM } from './stability';

/** What each criterion measures, in one clause (used when they disagree). */
const MEASURES: Record<keyof CompareKByCriterion, string> = {
  stability: 'stability (whether the segments come back when the rows are resampled)',
  predictionStrength: 'prediction strength (whether centres found on half the rows group the other half alike)',
  gap: 'the gap statistic (how much tighter the segments are than in structureless reference data)',
  knee: 'the within-SS bend (where one more segment stops buying much tightness)',
  silhouette: 'the silhouette (how much closer each row lies to its own segment than to the next)',
  calinskiHarabasz: 'Calinski–Harabasz (spread between segments against spread within)',
  daviesBouldin: 'Davies–Bouldin (how far each segment lies from its most similar neighbour, for their sizes)',
};

export function headlineFor(choice: KChoice, by: CompareKByCriterion, withStability: boolean): string {
  const k = choice.recommended;
  if (choice.noStructure) return 'No clustering structure: the gap statistic picks k = 1, so no segmentation is recommended (k = 1)';
  const why =
    by.gap === k
      ? `the gap statistic's pick${by.knee === k ? ', where the within-SS also bends' : ''}`
      : by.knee === k
        ? `where the within-SS bends${by.gap !== undefined ? ` (the gap statistic's k = ${by.gap} is not stable)` : ''}`
        : 'the best average silhouette among the stable k';
  if (!withStability) return `k = ${k} recommended: ${why} (stability not computed)`;
  if (choice.noneStable) return `k = ${k} recommended with caution: no k has every segment stable; ${why}`;
  return `k = ${k} recommended: every segment stable, ${why}`;
}

function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  return a >= 1000 ? v.toFixed(0) : a >= 10 ? v.toFixed(1) : v.toFixed(3);
}

function list(ks: readonly number[]): string {
  return ks.length <= 1 ? ks.join('') : `${ks.slice(0, -1).join(', ')} and ${ks[ks.length - 1]}`;
}

export function explain(
  table: readonly CompareKRow[],
  by: CompareKByCriterion,
  choice: KChoice,
  gap: GapStatisticResult | undefined,
  how: { silhouetteSampled?: number; evidenceRows: number; sampled: boolean; resamples?: number; splits?: number },
): string[] {
  const at = (k: number) => table.find((r) => r.k === k)!;
  const range = `k = ${table[0].k} to ${table[table.length - 1].k}`;
  const onRows = how.sampled ? `on a seeded sample of ${how.evidenceRows} rows` : `on all ${how.evidenceRows} rows`;
  const reasons: string[] = [];
  if (how.resamples !== undefined) {
    const stable = table.filter((r) => r.weakestStability! >= STABLE_FROM).map((r) => r.k);
    const firstUnstable = table.find((r) => r.weakestStability! < STABLE_FROM);
    const mostStable = table.reduce((a, b) => (b.weakestStability! > a.weakestStability! ? b : a));
    reasons.push(
      (stable.length
        ? `Stability: every segment comes back (weakest bootstrap Jaccard ≥ ${STABLE_FROM}) at k = ${list(stable)}`
        : `Stability: no k in ${range} has every segment stable; the best is k = ${mostStable.k} (weakest Jaccard ${fmt(mostStable.weakestStability!)})`) +
        (stable.length && firstUnstable
          ? `; at k = ${firstUnstable.k} the weakest segment reaches ${fmt(firstUnstable.weakestStability!)}`
          : '') +
        ` (${how.resamples} bootstrap resamples ${onRows}, Hennig 2007).`,
    );
  }
  if (how.splits !== undefined) {
    reasons.push(
      (by.predictionStrength !== undefined
        ? `Prediction strength is at least ${PREDICTION_STRENGTH_FROM} up to k = ${by.predictionStrength}`
        : `Prediction strength stays below ${PREDICTION_STRENGTH_FROM} at every k`) +
        ` (mean of ${how.splits} random halvings ${onRows}, Tibshirani & Walther 2005; the ${PREDICTION_STRENGTH_FROM} line is common practice after the paper).`,
    );
  }
  if (gap) {
    const refs = `${gap.references} reference sets ${onRows}`;
    if (by.gap === 1) {
      reasons.push(
        `The gap statistic picks k = 1: the rows are not clearly tighter in segments than uniform reference data, so any segmentation may be arbitrary (${refs}).`,
      );
    } else if (
      by.gap === table[table.length - 1].k &&
      gap.table.every((r, t) => t + 1 >= gap.table.length || r.gap < gap.table[t + 1].gap - gap.table[t + 1].se)
    ) {
      reasons.push(`The gap statistic is still rising at k = ${by.gap}, the largest k tried; more segments may be worth trying (${refs}).`);
    } else {
      reasons.push(`The gap statistic levels off at k = ${by.gap}: ${gap.rule}, with ${refs}.`);
    }
  }
  reasons.push(
    by.knee !== undefined
      ? `The within-segment sum of squares bends most sharply at k = ${by.knee} (Kneedle).`
      : `The within-segment sum of squares shows no clear bend over ${range}.`,
  );
  reasons.push(
    `The average silhouette is highest at k = ${by.silhouette} (${fmt(at(by.silhouette).silhouette)})` +
      (how.silhouetteSampled ? `, computed on a seeded sample of ${how.silhouetteSampled} rows` : '') +
      `; Calinski–Harabasz is highest at k = ${by.calinskiHarabasz} (${fmt(at(by.calinskiHarabasz).calinskiHarabasz)}); ` +
      `Davies–Bouldin is lowest at k = ${by.daviesBouldin} (${fmt(at(by.daviesBouldin).daviesBouldin)}).`,
  );
  const picks = (Object.keys(MEASURES) as (keyof CompareKByCriterion)[]).filter((c) => by[c] !== undefined);
  if (new Set(picks.map((c) => by[c])).size > 1) {
    const byK = new Map<number, string[]>();
    for (const c of picks) byK.set(by[c]!, [...(byK.get(by[c]!) ?? []), MEASURES[c]]);
    const parts = [...byK.entries()].sort((a, b) => a[0] - b[0]).map(([k, names]) => `k = ${k} by ${names.join(', ')}`);
    reasons.push(
      `The criteria disagree: ${parts.join('; ')}. ` +
        'Silhouette, Calinski–Harabasz and Davies–Bouldin reward the cleanest split and often favour few segments; ' +
        'the gap statistic and the bend ask where extra segments stop paying; stability and prediction strength ask only whether the segments can be found again.',
    );
  }
  if (choice.noStructure) {
    reasons.push(
      'No clustering structure: the gap statistic found the rows no tighter in segments than structureless reference data, so k = 1 is recommended. ' +
        'Segments at any k would be cuts through one cloud' +
        (by.stability !== undefined ? ', however reproducibly they fall (such cuts can be stable too)' : '') +
        '. ' +
        K_CHOICE_RULE,
    );
  } else {
    reasons.push(
      `Recommended: k = ${choice.recommended}` +
        (choice.noneStable ? ', with caution: no k has every segment stable, so the segments may not be reproducible' : '') +
        '. ' +
        K_CHOICE_RULE,
    );
    const width = at(choice.recommended)?.silhouette;
    if (width !== undefined && width < 0.25) {
      reasons.push(
        `At k = ${choice.recommended} the average silhouette is only ${fmt(width)}; below about 0.25 there is no substantial structure (common practice).`,
      );
    }
  }
  return reasons;
}
