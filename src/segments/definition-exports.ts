// Public surface of segment definitions, assigning new rows and SQL scoring.
export { buildDefinition } from './definition-build';
export type { BuildDefinitionInput, DefinitionSegmentInput } from './definition-build';
export { writeDefinitionJson } from './definition-json';
export { DEFINITION_FORMAT_VERSION, DEFINITION_KIND, FAR_PERCENTILE } from './definition-types';
export type { SegmentDefinition, DefinitionSegment, AssignmentRule, DefinitionMetric, DefinitionMethodName } from './definition-types';
export type { AssignmentOutcome, AssignedRow, AssignmentReport, RefusedRow, AssignOptions } from './assign-rows';
export type { SqlOptions } from './sql';
export { SQL_MAX_SEGMENTS, SQL_MAX_FIGURES } from './sql';
export { fingerprintRows } from './fingerprint';
export { STABILITY_READINGS, DRIFT_BINS, SHARE_FLOOR } from './training-distributions';
export type { TrainingDistributions, FeatureDistribution } from './training-distributions';
export type { DriftReport, DriftOptions, ScoredRow, SegmentDrift, ColumnDrift, FeatureDrift } from './drift';
