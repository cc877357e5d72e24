export { agglomerate, LINKAGE_METHODS } from './agglomerate';
export { agglomerationWork } from './work-estimate';
export type { AgglomerationWork } from './work-estimate';
export type { AgglomerateOptions } from './agglomerate';
export type { Tree, TreeMerge, CutSpec, LinkageMethod, MonotonicReport, HeightInversion } from './tree';
