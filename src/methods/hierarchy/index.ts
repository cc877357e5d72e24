export { agglomerate, LINKAGE_METHODS } from './agglomerate';
export type { AgglomerateOptions } from './agglomerate';
export type { Tree, TreeMerge, CutSpec, LinkageMethod, MonotonicReport, HeightInversion } from './tree';
