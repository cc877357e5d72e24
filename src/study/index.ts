// The fluent layer: study → prepare → segmentations and hierarchies that draw themselves.
export { study, Study, PreparedStudy } from './study';
export type { StudyRoles, StudyPrepareOptions } from './study';
export { Segmentation } from './segmentation';
export type { SegmentName, SegmentationParts } from './segmentation';
export { Hierarchy } from './hierarchy';
export { VariableHierarchy } from './variable-hierarchy';
export type { LeftOutColumn } from './variable-hierarchy';
export type { SegmentRulesOptions } from './segment-rules';
export type { Showable } from './showable';
export { ruleAgreement, settleKmeans, SETTLE_MAX_STEPS } from './reproduce';
export type { RuleAgreement, Settled } from './reproduce';
// The definition handle: load, assign, drift, SQL and views of a definition (it shows views, so it
// lives in the fluent layer, above views/).
export { loadDefinition, definitionHandle } from './definition-handle';
export type { DefinitionHandle, DriftResult, ScoredOutcome } from './definition-handle';
