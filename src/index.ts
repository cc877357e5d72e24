// The public entry of kinsort: an explicit list, grouped by what a notebook user does, each name
// documented in one line in docs/public-api.md. Plumbing (kernels, budgets, helpers the views and
// the fluent layer share) is not here: it lives behind `kinsort/internal` (src/internal.ts), with
// no promise of stability. A name added here is a promise; add it to docs/public-api.md too.

// ─── Seeds, rows, progress and errors ────────────────────────────────────────────────────────────
export { createRandom } from './random';
export type { Random, Seed } from './random';
export { createMatrix, toMatrix, toNested } from './core/matrix';
export type { Matrix, RowsInput } from './core/matrix';
export type { ProgressEvent, ProgressCallback } from './core/progress';
export { KinsortError } from './core/errors';
export type { ErrorCode } from './core/errors';

// ─── Table intake ────────────────────────────────────────────────────────────────────────────────
export { readTable, readCsvFile } from './table';
export type { ReadTableOptions, Table, TableColumn, Cell, InferredType, DeclaredType, DecimalMark } from './table';
export { DEFAULT_MISSING_MARKERS } from './table';

// ─── Preparation ─────────────────────────────────────────────────────────────────────────────────
export { prepareTable, applyPreparation } from './prepare';
export type {
  PrepareOptions,
  ApplyPreparationOptions,
  Preparation,
  PreparedColumn,
  PreparationReport,
  PreparedData,
  DroppedRow,
  ImputedColumn,
  UnseenLevel,
  ScaleMethod,
  MissingPolicy,
} from './prepare';

// ─── Functional core: dissimilarities ────────────────────────────────────────────────────────────
export { dissimilarity, fromCondensed } from './measure';
export type { Dissimilarity, DissimilarityOptions, MetricName } from './measure';

// ─── Functional core: segmenting methods ─────────────────────────────────────────────────────────
export { kmeans, kmedoids, kmeansMiniBatch } from './methods/partition';
export type {
  KmeansOptions,
  KmeansResult,
  KmeansStart,
  KmedoidsOptions,
  KmedoidsResult,
  KmeansMiniBatchOptions,
} from './methods/partition';
export { agglomerate } from './methods/hierarchy';
export type { AgglomerateOptions, Tree, TreeMerge, CutSpec, LinkageMethod, MonotonicReport, HeightInversion } from './methods/hierarchy';
export { project, projectNew } from './methods/project';
export type { Projection, ProjectOptions } from './methods/project';
export { variableTree } from './methods/variables';
export type {
  VariableTree,
  VariableTreeOptions,
  CorrelationStrength,
  VariableLinkage,
  VariableGroup,
  VariableMember,
} from './methods/variables';
export { classificationTree } from './methods/rules';
export type {
  ClassificationTreeOptions,
  RuleColumn,
  RuleColumnKind,
  RuleSplit,
  ThresholdSplit,
  LevelSplit,
  RuleTree,
  RuleTreeNode,
} from './methods/rules';

// ─── Functional core: judging segments and choosing k ────────────────────────────────────────────
export {
  silhouette,
  calinskiHarabasz,
  daviesBouldin,
  adjustedRandIndex,
  normalizedMutualInfo,
  gapStatistic,
  findKnee,
  compareK,
  bootstrapStability,
} from './assess';
export type {
  SilhouetteOptions,
  SilhouetteResult,
  SilhouetteRowMetric,
  NormalizedMutualInfoOptions,
  MutualInformationAverage,
  GapStatisticOptions,
  GapStatisticResult,
  GapRow,
  FindKneeOptions,
  KneeResult,
  CompareKOptions,
  CompareKResult,
  CompareKRow,
  CompareKByCriterion,
  BootstrapStabilityOptions,
  BootstrapStabilityResult,
  StabilityResult,
  StabilityReading,
  StabilityMethod,
} from './assess';

// ─── Describing segments: profiles and rules ─────────────────────────────────────────────────────
export { profileSegments } from './segments';
export type {
  ProfileInput,
  SegmentProfile,
  VariableDifference,
  KeptSummary,
  TypicalMember,
  SegmentRule,
  SegmentRules,
  RulesAgreement,
  RulesTraining,
  RulesOptions,
  RuleCondition,
  RuleColumnSpec,
  RulesSqlOptions,
} from './segments';

// ─── The fluent entry: study → prepare → segmentations and hierarchies ──────────────────────────
// The classes are exported as types: a study is made by study(), the rest by its methods.
export { study } from './study';
export type {
  Study,
  PreparedStudy,
  Segmentation,
  Hierarchy,
  VariableHierarchy,
  StudyRoles,
  StudyPrepareOptions,
  SegmentName,
  LeftOutColumn,
  SegmentRulesOptions,
  Showable,
  RuleAgreement,
} from './study';

// ─── Definitions: the hand-off file, assigning new rows, drift, SQL ─────────────────────────────
export { loadDefinition } from './study';
export type { DefinitionHandle, DriftResult, ScoredOutcome } from './study';
export { DEFINITION_FORMAT_VERSION } from './segments';
export type {
  SegmentDefinition,
  DefinitionSegment,
  AssignmentRule,
  DefinitionMetric,
  DefinitionMethodName,
  AssignmentOutcome,
  AssignedRow,
  AssignmentReport,
  RefusedRow,
  AssignOptions,
  SqlOptions,
  TrainingDistributions,
  FeatureDistribution,
  DriftReport,
  DriftOptions,
  ScoredRow,
  SegmentDrift,
  ColumnDrift,
  FeatureDrift,
} from './segments';

// ─── Engines: where the data lives ───────────────────────────────────────────────────────────────
export { duckdbEngine, postgresEngine } from './engines';
export type { DialectName, SqlDialect, SqlEngine } from './engines';

// ─── Views: results drawn, inline in a notebook or as offline pages ─────────────────────────────
export {
  dendrogramView,
  projectionView,
  screeView,
  kEvidenceView,
  silhouetteView,
  heatmapView,
  profileCardsView,
  driftView,
  correlationHeatmapView,
  variableGroupsView,
  rulesView,
  rulesTreeView,
  segmentRulesHtml,
  viewsPage,
  saveViewsPage,
} from './views';
export type {
  View,
  DendrogramOptions,
  DendrogramTree,
  ProjectionViewOptions,
  ProjectionLike,
  KComparisonLike,
  SilhouetteLike,
  HeatmapOptions,
  DissimilarityLike,
  CardsOptions,
  CorrelationGrid,
  CorrelationHeatmapOptions,
  VariableGroupLike,
  RulesLike,
} from './views';

// ─── Notebook display: what a notebook cell calls ────────────────────────────────────────────────
export { progressDisplay, lightNotebook, insideNotebookKernel } from './notebook';
export type { ProgressDisplayOptions } from './notebook';

// ─── Profiles in the database ────────────────────────────────────────────────────────────────────
// profileInDatabase: segment profiles computed by SQL aggregates where the rows live.
export { profileInDatabase } from './segments/database/profile-in-database';
export type { DatabaseProfile, DatabaseProfileOptions } from './segments/database/profile-in-database';
export type { ColumnSummary, GroupSummary, LevelSummary, NumericSummary } from './segments/database/profile-as-cards';

// ─── Database passes: a sample drawn where the data lives, k-means refined over the whole table ──
export { sampleFromDatabase } from './engines/sample';
export type { SampleFromDatabaseOptions, DatabaseSample } from './engines/sample';
export type { TableName } from './engines/source';
export { refineInDatabase } from './segments/database/refine';
export type { RefineInDatabaseOptions, DatabaseRefinement, RefineIteration } from './segments/database/refine';
export type { RefineSegmentationOptions, TableFigures } from './study/refine-segmentation';

// ─── Gaussian mixtures ───────────────────────────────────────────────────────────────────────────
// The EM core, the BIC comparison and its view, the fluent options.
export { gaussianMixture, COVARIANCE_SHAPES, parameterCount } from './methods/mixture';
export type { GaussianMixtureOptions, GaussianMixtureResult, CovarianceShape, MixtureStart } from './methods/mixture';
export { compareMixtures } from './assess/compare-mixtures';
export type { CompareMixturesOptions, CompareMixturesResult, MixtureCandidate } from './assess/compare-mixtures';
export { mixtureEvidenceView } from './views/mixture-evidence';
export type { MixtureComparisonLike } from './views/mixture-evidence';
export type { StudyMixtureOptions } from './study/mixture-fit';
export type { MembershipTable } from './study/mixture-parts';

// ─── Density segments ────────────────────────────────────────────────────────────────────────────
// HDBSCAN with noise and GLOSH outlier scores.
export { densitySegments, NOISE } from './methods/density';
export type { DensitySegmentsOptions, DensitySegmentsResult, DensityBranch } from './methods/density';
