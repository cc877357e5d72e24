// `kinsort/internal`: the plumbing behind the public entry, for tests, benchmarks, scripts and
// anyone building on kinsort's parts. UNSTABLE: names here may change or go in any release
// without notice. The public entry (src/index.ts, docs/public-api.md) is the promise; this is not.
// Grouped by layer, lowest first.

// ─── Core: matrix checks ─────────────────────────────────────────────────────────────────────────
export { isMatrix } from './core/matrix';

// ─── Table intake: the text rule's vocabulary and column lookup ─────────────────────────────────
export { tableColumn, isTable, DECLARED_TYPES, ROW_NAME_COLUMN, TEXT_RULE, DECIMAL_MARKS } from './table';

// ─── Preparation: vocabulary and the width budget ────────────────────────────────────────────────
export { SCALE_METHODS, MISSING_POLICIES, setPreparedLimits } from './prepare';
export type { PreparedLimits } from './prepare';

// ─── Dissimilarities: the condensed layout, the pair budget, threads, metric kernels ─────────────
export {
  condensedIndex,
  sizeFromCondensedLength,
  pairOf,
  isDissimilarity,
  makeDissimilarity,
  setPairBudget,
  guardPairwise,
  gowerDissimilarity,
  distanceFunction,
  crossDistances,
  METRICS,
  ROW_METRICS,
  TRUE_METRICS,
  setDissimilarityThreads,
  lastDissimilarityShare,
} from './measure';
export type { RowMetric, PairKernel, CrossDistanceOptions } from './measure';

// ─── Methods: vocabulary, work estimates and the pieces behind the public methods ───────────────
export { LINKAGE_METHODS, agglomerationWork } from './methods/hierarchy';
export type { AgglomerationWork } from './methods/hierarchy';
export { symmetricEigen } from './methods/project';
export type { SymmetricEigen } from './methods/project';
export { VARIABLE_LINKAGES, correlationMatrix, averageRanks } from './methods/variables';
export type { CorrelationKind } from './methods/variables';
export { leafOf, goesLeft } from './methods/rules';

// ─── Assessment: the rules' wording, thresholds and the k choice behind compareK ────────────────
export {
  SILHOUETTE_ROW_METRICS,
  contingencyTable,
  MUTUAL_INFORMATION_AVERAGES,
  GAP_RULE,
  KNEE_DIRECTIONS,
  KNEE_CURVES,
  COMPARE_K_RULE,
  PREDICTION_STRENGTH_FROM,
  chooseK,
  K_CHOICE_RULE,
  STABILITY_METHODS,
  UNSTABLE_BELOW,
  STABLE_FROM,
} from './assess';
export type { ContingencyTable, KChoice, KChoiceInput } from './assess';

// ─── Segments: building and writing definitions, rules, write-ups, fingerprints, limits ─────────
export {
  buildDefinition,
  writeDefinitionJson,
  DEFINITION_KIND,
  FAR_PERCENTILE,
  SQL_MAX_SEGMENTS,
  SQL_MAX_FIGURES,
  fingerprintRows,
  STABILITY_READINGS,
  DRIFT_BINS,
  SHARE_FLOOR,
  EXACT_MEDOID_LIMIT,
  writeUpMarkdown,
  WRITE_UP_CAUTION,
  fitRules,
  rulesSql,
  rulesCase,
} from './segments';
export type { BuildDefinitionInput, DefinitionSegmentInput, WriteUpContext } from './segments';

// ─── Engines: dialect objects and the number grammar ─────────────────────────────────────────────
export { DIALECT_NAMES, NUMBER_GRAMMAR, dialectNamed } from './engines';

// ─── Notebook display adapter: kernels, bundles, saved files ─────────────────────────────────────
export {
  currentKernel,
  showFragment,
  resendPlotting,
  savedFileName,
  VIEWS_FOLDER,
  isLightNotebook,
  jupyterBundle,
  notebookHtml,
  displayableInKernel,
  kernelDisplayOf,
  displaysSent,
  plottingScript,
  progressHtml,
} from './notebook';
export type { NotebookKernel, KernelEntry, ShowRequest, KernelBundle } from './notebook';

// ─── Views: palette, size limits, plot specs ─────────────────────────────────────────────────────
export { SEGMENT_COLOURS, segmentColour, HEATMAP_MAX_ROWS, CORRELATION_GRID_MAX } from './views';
export type { PlotSpec, DrawnRuleNode } from './views';

// ─── Fluent layer: the classes as values, functional twins of fluent calls ──────────────────────
export { Study, PreparedStudy, Segmentation, Hierarchy, VariableHierarchy } from './study';
export type { SegmentationParts } from './study';
export { ruleAgreement, settleKmeans, SETTLE_MAX_STEPS, definitionHandle } from './study';
export type { Settled } from './study';

// ─── Density definitions: the stored dense rows and their builder (the fluent density() writes them) ──
export { buildDensityDefinition } from './segments/definition-dense-build';
export type { BuildDensityDefinitionInput } from './segments/definition-dense-build';
export { DENSE_ROW_LIMIT, nearestDenseRows } from './segments/dense-rows';
export type { DenseRows, DenseResult } from './segments/dense-rows';
