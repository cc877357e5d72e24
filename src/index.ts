// Public entry: the functional core and the fluent layer. Each area keeps its own barrel.
export { createRandom } from './random';
export type { Random, Seed } from './random';
export { KinsortError } from './core/errors';
export type { ErrorCode } from './core/errors';
export { createMatrix, toMatrix, toNested, isMatrix } from './core/matrix';
export type { Matrix, RowsInput } from './core/matrix';
export type { ProgressEvent, ProgressCallback } from './core/progress';
export * from './table';
export * from './prepare';
export * from './measure';
export * from './methods/partition';
export * from './methods/hierarchy';
export * from './methods/project';
export * from './methods/variables';
export * from './methods/rules';
export * from './assess';
export * from './segments';
export * from './engines';
export * from './views';
export * from './notebook';
export * from './study';
// Density segments (HDBSCAN with noise and GLOSH outlier scores)
export { densitySegments, NOISE } from './methods/density';
export type { DensitySegmentsOptions, DensitySegmentsResult, DensityBranch } from './methods/density';
export { buildDensityDefinition } from './segments/definition-dense-build';
export type { BuildDensityDefinitionInput } from './segments/definition-dense-build';
export { DENSE_ROW_LIMIT, nearestDenseRows } from './segments/dense-rows';
export type { DenseRows, DenseResult } from './segments/dense-rows';
