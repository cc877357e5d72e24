// Segments: profiles, write-ups, definition files, assigning new rows, SQL for scoring.
export * from './definition-exports';
export { profileSegments, EXACT_MEDOID_LIMIT } from './profile';
export type { ProfileInput, SegmentProfile, VariableDifference, KeptSummary, TypicalMember } from './profile';
export { writeUpMarkdown, WRITE_UP_CAUTION } from './write-up';
export type { WriteUpContext } from './write-up';
export { fitRules } from './rules';
export type { SegmentRule, SegmentRules, RulesAgreement, RulesTraining, RulesOptions } from './rules';
export type { RuleCondition } from './rules-text';
export type { RuleColumnSpec } from './rules-columns';
export { rulesSql, rulesCase } from './rules-sql';
export type { RulesSqlOptions } from './rules-sql';
