// The display adapter: inline in the notebook kernel, pages on disk elsewhere, progress in place.
export { insideNotebookKernel } from './kernel';
export { showFragment, resendPlotting, savedFileName, VIEWS_FOLDER } from './display';
export type { ShowRequest } from './display';
export { plottingScript } from './plotting';
export { progressDisplay, progressHtml } from './progress';
export type { ProgressDisplayOptions } from './progress';
