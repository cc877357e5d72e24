// Validity measures, choosing k, and stability.
export { silhouette, SILHOUETTE_ROW_METRICS } from './silhouette';
export type { SilhouetteOptions, SilhouetteResult, SilhouetteRowMetric } from './silhouette';
export { calinskiHarabasz } from './calinski-harabasz';
export { daviesBouldin } from './davies-bouldin';
export { contingencyTable } from './contingency';
export type { ContingencyTable } from './contingency';
export { adjustedRandIndex } from './adjusted-rand';
export { normalizedMutualInfo, MUTUAL_INFORMATION_AVERAGES } from './mutual-information';
export type { NormalizedMutualInfoOptions, MutualInformationAverage } from './mutual-information';
export { gapStatistic, GAP_RULE } from './gap-statistic';
export type { GapStatisticOptions, GapStatisticResult, GapRow } from './gap-statistic';
export { findKnee, KNEE_DIRECTIONS, KNEE_CURVES } from './knee';
export type { FindKneeOptions, KneeResult } from './knee';
export { compareK, COMPARE_K_RULE } from './compare-k';
export type { CompareKOptions, CompareKResult, CompareKRow, CompareKByCriterion } from './compare-k';
export { bootstrapStability, STABILITY_METHODS, UNSTABLE_BELOW, STABLE_FROM } from './stability';
export type { BootstrapStabilityOptions, BootstrapStabilityResult, StabilityResult, StabilityReading, StabilityMethod } from './stability';
