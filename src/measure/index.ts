export * from './condensed';
export { dissimilarity } from './dissimilarity';
export type { DissimilarityOptions } from './dissimilarity';
export { gowerDissimilarity } from './gower';
export { distanceFunction, METRICS, ROW_METRICS, TRUE_METRICS } from './metrics';
export type { MetricName, RowMetric, PairKernel } from './metrics';
export { crossDistances } from './cross';
export type { CrossDistanceOptions } from './cross';
export { setDissimilarityThreads, lastDissimilarityShare } from './parallel';
