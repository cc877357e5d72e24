// The display adapter: inline in a notebook kernel (tslab or Deno), pages on disk elsewhere,
// progress in place, and a light mode that leaves the plotting bundle out.
export { insideNotebookKernel, currentKernel } from './kernel';
export type { NotebookKernel, KernelEntry } from './kernel';
export {
  showFragment,
  resendPlotting,
  savedFileName,
  VIEWS_FOLDER,
  lightNotebook,
  isLightNotebook,
  jupyterBundle,
  notebookHtml,
  displayableInKernel,
  kernelDisplayOf,
  displaysSent,
} from './display';
export type { ShowRequest, KernelBundle } from './display';
export { plottingScript } from './plotting';
export { progressDisplay, progressHtml } from './progress';
export type { ProgressDisplayOptions } from './progress';
