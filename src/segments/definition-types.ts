// The segment definition: a plain, versioned JSON document holding everything needed to apply a
// fitted segmentation to new rows (here, in another notebook, or in SQL where the data lives).
import type { JsonValue } from './definition-json';
import type { TrainingDistributions } from './training-distributions';
import type { DenseRows } from './dense-rows';

/** Marks the file as ours, whatever its name. */
export const DEFINITION_KIND = 'kinsort segment definition';
/**
 * Bumped whenever a reader of an older version could misread the file. Format 2 stores the schema
 * (text rule, missing markers, decimal mark, level matching: preparation version 2) and how many
 * training rows the rule reproduces; format 3 spells every key `center` (format 2's preparation
 * said `centre`) and is otherwise the same, so format-2 files are read and translated. Format 1
 * files are refused with a message (they cannot be migrated without guessing how their cells were read).
 */
export const DEFINITION_FORMAT_VERSION = 3;

/** Where the training rows' segments in the file come from. */
export type TrainingLabels = 'fit' | 'rule';
export const TRAINING_LABELS: readonly TrainingLabels[] = ['fit', 'rule'];

export type DefinitionMethodName = 'kmeans' | 'kmedoids' | 'hierarchy' | 'mixture' | 'density';
export const DEFINITION_METHODS: readonly DefinitionMethodName[] = ['kmeans', 'kmedoids', 'hierarchy', 'mixture', 'density'];

/**
 * How a new row gets its segment. 'nearest-center': the segment whose centre (segment mean in the
 * prepared space) is nearest — the rule for k-means and for a hierarchy cut. 'nearest-medoid': the
 * segment whose medoid (a training row) is nearest under the stored metric — the rule for k-medoids.
 * 'highest-posterior': the mixture component with the highest posterior probability, from the
 * stored weights, means and inverse Cholesky factors (segments/mixture-rule.ts; metric 'mahalanobis').
 */
export type AssignmentRule = 'nearest-center' | 'nearest-medoid' | 'highest-posterior' | 'nearest-dense-row';
export const ASSIGNMENT_RULES: readonly AssignmentRule[] = ['nearest-center', 'nearest-medoid', 'highest-posterior', 'nearest-dense-row'];
// 'nearest-dense-row' (density segments, docs/dense-row-rule.md): the segment of the nearest stored
// training row in a segment, or noise (segment 0) beyond that row's core distance. See dense-rows.ts.

/** Metrics a definition can assign with (and write as portable SQL). */
export type DefinitionMetric = 'euclidean' | 'sqeuclidean' | 'manhattan';
export const DEFINITION_METRICS: readonly DefinitionMetric[] = ['euclidean', 'sqeuclidean', 'manhattan'];
/** The highest-posterior rule's distances (for `distance` and `farBeyond`) are Mahalanobis distances to the component. */
export const MIXTURE_METRIC = 'mahalanobis';
/** What the "metric" key may hold: a distance metric, or 'mahalanobis' with the highest-posterior rule. */
export type StoredMetric = DefinitionMetric | typeof MIXTURE_METRIC;

/** The percentile of training distances beyond which a row counts as far from a segment. */
export const FAR_PERCENTILE = 99;

export interface DefinitionSegment {
  /** People-facing number, 1..k, in segment order. */
  readonly number: number;
  readonly title?: string;
  readonly text?: string;
  /** Training rows in this segment. */
  readonly size: number;
  /** Centre (segment mean) or medoid vector, in the prepared space. */
  readonly center: number[];
  /** nearest-medoid only: the id of the training row that is the medoid. */
  readonly medoidId?: string;
  /**
   * The FAR_PERCENTILE-th percentile (linear interpolation between order statistics) of the
   * distances of this segment's training rows to its centre. A row farther than this from every
   * segment is flagged `far`.
   */
  readonly farBeyond: number;
  /** highest-posterior only: the component's mixing weight (> 0; the weights sum to 1). */
  readonly weight?: number;
  /**
   * highest-posterior only: W = L⁻¹, the inverse of the lower Cholesky factor L of the component's
   * covariance (Σ = L Lᵀ), as d rows of which row j holds its j + 1 figures on and left of the
   * diagonal (the diagonal is > 0). Σ⁻¹ = Wᵀ W.
   */
  readonly whitening?: number[][];
}

export interface SegmentDefinition {
  readonly kind: typeof DEFINITION_KIND;
  readonly formatVersion: number;
  /** "kinsort <version>" of the writer. */
  readonly writtenBy: string;
  /** The caller's note (no clock is read: put a date here if you want one; files stay reproducible). */
  readonly note?: string;
  readonly method: { readonly name: DefinitionMethodName; readonly options: { [key: string]: JsonValue } };
  readonly rule: AssignmentRule;
  readonly metric: StoredMetric;
  /** The intake's serialisable Preparation, keys sorted. */
  readonly preparation: { [key: string]: JsonValue };
  /** Names of the prepared features, in centre order (from the preparation). */
  readonly features: string[];
  readonly segments: DefinitionSegment[];
  readonly training: {
    readonly rows: number;
    /** Order-independent hash of ids + prepared values (see fingerprint.ts). */
    readonly fingerprint: string;
    /**
     * How many training rows the stored rule (nearest centre / medoid) gives the segment the fit
     * gave them. Equal to `rows` for k-means (its centres and assignment are a fixed point) and for
     * a segmentation relabelled by its own rule; smaller for a hierarchy cut or k-medoids whose
     * members are not all nearest their own centre.
     */
    readonly reproducedRows: number;
    /** 'fit': segments (and sizes) as the method gave them; 'rule': relabelled by the stored rule, on request. */
    readonly labels: TrainingLabels;
    /** Density definitions: training rows in no segment (noise); the segment sizes plus this make `rows`. */
    readonly noiseRows?: number;
  };
  /** nearest-dense-row only: every training row in a segment, its core distance and segment. */
  readonly denseRows?: DenseRows;
  /** Optional: the training rows' feature distributions and far share, for drift (absent in older files). */
  readonly trainingDistributions?: TrainingDistributions;
  /** Optional evidence for the choice of k (keys sorted), as the caller gives it. */
  readonly evidence?: { [key: string]: JsonValue };
}
