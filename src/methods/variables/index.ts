export { variableTree } from './variable-tree';
export { VARIABLE_LINKAGES } from './variable-tree';
export type { VariableTree, VariableTreeOptions, CorrelationStrength, VariableLinkage } from './variable-tree';
export type { VariableGroup, VariableMember } from './variable-groups';
export { correlationMatrix, averageRanks } from './correlation';
export type { CorrelationKind } from './correlation';
