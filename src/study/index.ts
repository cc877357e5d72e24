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
