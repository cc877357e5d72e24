// The rule that turns the criteria of a k comparison into one recommended k.
//
// Stability goes first because a segment that does not come back when the rows are resampled
// cannot be described or handed on (Hennig 2007; the 0.75 line is common practice). The gap
// statistic (Tibshirani, Walther & Hastie 2001) is the one criterion that can answer "no
// segments": a reproducible cut through a structureless cloud is still not a group, so its k = 1
// overrides everything. Among the stable k, the gap statistic and the bend of the within-SS curve
// both ask "where does one more segment stop buying tightness"; the gap goes first because it
// measures that against a reference with a standard error, while the bend (Kneedle) is a reading
// of the curve's shape. The silhouette (Rousseeuw 1987) decides when neither picks a stable k.
import { STABLE_FROM } from './stability';

export const K_CHOICE_RULE =
  `Among the k at which every segment is stable (weakest bootstrap Jaccard ≥ ${STABLE_FROM}, Hennig 2007, common practice), ` +
  "the gap statistic's k is recommended, else the bend of the within-segment sum of squares, else the k with the highest average silhouette. " +
  'When the gap statistic picks k = 1 the rows are no tighter in segments than structureless reference data, and k = 1 (no clustering structure) is recommended.';

export interface KChoiceInput {
  readonly ks: readonly number[];
  readonly silhouette: readonly number[];
  /** Weakest segment's stability per k; absent when stability was not computed. */
  readonly weakestStability?: readonly number[];
  /** The gap statistic's k (may be 1), when computed. */
  readonly gap?: number;
  /** The within-SS bend, when the curve has one. */
  readonly knee?: number;
}

export interface KChoice {
  readonly recommended: number;
  /** Whether the rows showed no clustering structure (the gap statistic picked 1). */
  readonly noStructure: boolean;
  /** The k at which every segment is stable (all k when stability was not computed or none is). */
  readonly candidates: number[];
  /** Whether stability was computed but no k had every segment stable. */
  readonly noneStable: boolean;
}

export function chooseK(input: KChoiceInput): KChoice {
  const { ks } = input;
  const stable = input.weakestStability ? ks.filter((_, t) => input.weakestStability![t] >= STABLE_FROM) : [...ks];
  const noneStable = input.weakestStability !== undefined && stable.length === 0;
  if (input.gap === 1) return { recommended: 1, noStructure: true, candidates: stable, noneStable };
  const candidates = stable.length ? stable : [...ks];
  if (input.gap !== undefined && candidates.includes(input.gap))
    return { recommended: input.gap, noStructure: false, candidates, noneStable };
  if (input.knee !== undefined && candidates.includes(input.knee))
    return { recommended: input.knee, noStructure: false, candidates, noneStable };
  const silhouetteAt = (k: number) => input.silhouette[ks.indexOf(k)];
  let best = candidates[0];
  for (const k of candidates) if (silhouetteAt(k) > silhouetteAt(best)) best = k;
  return { recommended: best, noStructure: false, candidates, noneStable };
}

/** The largest k at which every segment is stable: the stability panel's own suggestion. */
export function stabilitySuggestion(ks: readonly number[], weakest: readonly number[]): number | undefined {
  let pick: number | undefined;
  ks.forEach((k, t) => {
    if (weakest[t] >= STABLE_FROM) pick = k;
  });
  return pick;
}
