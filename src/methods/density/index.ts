// Density segments: HDBSCAN with noise and GLOSH outlier scores.
export { densitySegments, NOISE } from './density-segments';
export type { DensitySegmentsOptions, DensitySegmentsResult, DensityBranch } from './density-segments';
