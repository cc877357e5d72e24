export { classificationTree, leafOf, goesLeft } from './cart';
export type { ClassificationTreeOptions } from './cart';
export type { RuleColumn, RuleColumnKind, RuleSplit, ThresholdSplit, LevelSplit, RuleTree, RuleTreeNode } from './types';
