// Views: builders take results and return a View ({ title, html(), fragment(), svg(), save(), show() }).
export type { View, PlotSpec } from './view';
export { dendrogramView } from './dendrogram';
export type { DendrogramOptions, DendrogramTree } from './dendrogram';
export { projectionView, screeView } from './projection';
export type { ProjectionViewOptions, ProjectionLike } from './projection';
export { kEvidenceView } from './k-evidence';
export type { KComparisonLike } from './k-evidence';
export { silhouetteView } from './silhouette';
export type { SilhouetteLike } from './silhouette';
export { heatmapView, HEATMAP_MAX_ROWS } from './heatmap';
export type { HeatmapOptions, DissimilarityLike } from './heatmap';
export { profileCardsView } from './cards';
export type { CardsOptions } from './cards';
export { SEGMENT_COLOURS, segmentColour } from './palette';
export { viewsPage, saveViewsPage } from './page';
export { driftView } from './drift';
