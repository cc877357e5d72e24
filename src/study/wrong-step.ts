// Calls asked of the wrong kind of object: a study that was not prepared yet, a tree that was not
// cut, a segmentation asked for its dendrogram. Without these a user meets "x.kmeans is not a
// function"; with them, one line saying what was wrong and which call to make instead.
//
// In TypeScript the member is typed as a non-callable marker whose NAME is the advice, so the
// compiler's own message reads "Type 'PrepareTheStudyFirst' has no call signatures"; in plain
// JavaScript (or past the compiler) the call throws a KinsortError with the full sentence.
import { KinsortError } from '../core/errors';

/** Marker: call `.prepare({ … })` on the study, then ask this of the prepared study. */
export interface PrepareTheStudyFirst {
  readonly __kinsortAdvice: 'call .prepare({ scale, missing }) on the study first';
}

/** Marker: cut the tree (`.cut({ k })` or `.cut({ height })`), then ask this of the segmentation. */
export interface CutTheTreeFirst {
  readonly __kinsortAdvice: 'call .cut({ k }) or .cut({ height }) on the hierarchy first';
}

/** Marker: this belongs to the hierarchy (`study.agglomerate({ method })`), not to a segmentation. */
export interface AskTheHierarchyInstead {
  readonly __kinsortAdvice: 'ask the hierarchy (study.agglomerate({ method })) for this';
}

/** @internal Install throwing members named `names` on `proto`; `advice(name, self)` is the whole message. */
export function installWrongStepGuards<T>(proto: T, names: readonly string[], advice: (name: string, self: T) => string): void {
  for (const name of names) {
    Object.defineProperty(proto as object, name, {
      configurable: true,
      enumerable: false,
      writable: false,
      value: function wrongStep(this: T): never {
        throw new KinsortError(advice(name, this), 'not-supported');
      },
    });
  }
}

/** What a prepared study offers, for the "prepare first" guard on a study. */
export const PREPARED_STUDY_CALLS = [
  'dissimilarity',
  'compareK',
  'kmeans',
  'kmedoids',
  'agglomerate',
  'project',
  'variableTree',
  // Mixtures (issue #20).
  'mixture',
  'compareMixtures',
] as const;

/** What a segmentation offers that a hierarchy does not, for the "cut first" guard on a hierarchy. */
export const SEGMENTATION_CALLS = [
  'name',
  'names',
  'cards',
  'projection',
  'silhouette',
  'stability',
  'profiles',
  'compare',
  'writeUp',
  'definition',
  'assign',
  'members',
  'segmentOf',
  'rules',
] as const;

/** What a hierarchy offers that a segmentation does not, for the guard on a segmentation. */
export const HIERARCHY_CALLS = ['dendrogram', 'heatmap', 'cut', 'copheneticCorrelation'] as const;
