// Showing a fragment: inline in the notebook kernel (the plotting bundle travels with the first
// chart of the session only), or, outside it, a page written to ./kinsort-views/ and one line
// saying where.
import * as fs from 'fs';
import * as path from 'path';
import { insideNotebookKernel, kernelModule } from './kernel';
import { plottingScript } from './plotting';

export { plottingScript } from './plotting';

let plottingSent = false;
let fileCounter = 0;

/** Folder for pages written by show() outside the kernel. */
export const VIEWS_FOLDER = 'kinsort-views';

export interface ShowRequest {
  fragment: string;
  needsPlotting: boolean;
  /** File name (no folder) for use outside the kernel. */
  fileName: string;
  /** The complete page, built only when a file is written. */
  page: () => string;
}

/** A readable, unique file name from a title: "03-evidence-for-k.html". */
export function savedFileName(title: string): string {
  fileCounter += 1;
  const base = title
    .normalize('NFKD')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `${String(fileCounter).padStart(2, '0')}-${base || 'view'}.html`;
}

/** Mark the plotting bundle as not yet sent (e.g. after the cell holding it was cleared). */
export function resendPlotting(): void {
  plottingSent = false;
}

export function showFragment(request: ShowRequest): string | undefined {
  const tslab = kernelModule();
  if (tslab) {
    let html = request.fragment;
    if (request.needsPlotting && !plottingSent) {
      html = plottingScript() + html;
      plottingSent = true;
    }
    tslab.display.html(html);
    return undefined;
  }
  const folder = path.resolve(VIEWS_FOLDER);
  fs.mkdirSync(folder, { recursive: true });
  const file = path.join(folder, request.fileName);
  fs.writeFileSync(file, request.page());
  // The one line of output that says where the view went.
  console.log(`kinsort: view written to ${file} (open it in a browser; works offline).`);
  return file;
}

export { insideNotebookKernel };
