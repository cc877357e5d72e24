// Showing a view. Inside a notebook kernel (tslab or Deno): inline, the plotting bundle sent
// with the first chart of the session only, or, in light mode, the still pictures alone (no
// bundle: a saved notebook stays small). Outside a kernel: a page in ./kinsort-views/ named by
// its content, so nothing earlier is overwritten and the same view shown twice is one file; the
// plotting bundle is written once beside the pages instead of into each of them.
import { createHash } from 'crypto';
import * as fs from 'fs';
import * as path from 'path';
import { currentKernel } from './kernel';
import { plottingScript, plottingVersion } from './plotting';

export { plottingScript } from './plotting';
export { insideNotebookKernel } from './kernel';

let plottingSent = false;
let light: boolean | undefined;

/** Folder for pages written by show() outside the kernel. */
export const VIEWS_FOLDER = 'kinsort-views';

export interface ShowRequest {
  /** The view as embedded in a notebook: still picture plus live chart. */
  fragment: string;
  needsPlotting: boolean;
  /** The view without the live chart (the still picture, cards or tables only): light mode. */
  still?: () => string;
  /** File name (no folder) for use outside the kernel; the content's hash is added to it. */
  fileName: string;
  /** The complete page, built only when a file is written. */
  page: () => string;
}

/**
 * Light mode for notebooks that are mailed or kept in git: views show their still pictures only
 * and the plotting bundle (about 5 MB) is never sent. Also on when the environment variable
 * KINSORT_LIGHT is 1 or true (e.g. for a headless `jupyter nbconvert --execute`). Returns the
 * setting now in force.
 */
export function lightNotebook(on = true): boolean {
  light = on;
  return on;
}

export function isLightNotebook(): boolean {
  if (light !== undefined) return light;
  const v = (typeof process === 'object' && process.env ? process.env.KINSORT_LIGHT : undefined) ?? '';
  return /^(1|true|yes)$/i.test(v.trim());
}

/** A readable file name from a title: "evidence-for-k.html" (show() adds the content's hash). */
export function savedFileName(title: string): string {
  const base = title
    .normalize('NFKD')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `${base || 'view'}.html`;
}

/** Mark the plotting bundle as not yet sent (e.g. after the cell holding it was cleared). */
export function resendPlotting(): void {
  plottingSent = false;
}

/** The HTML a kernel shows for this view: light, or with the bundle the first time. */
export function notebookHtml(request: ShowRequest): string {
  if (isLightNotebook()) return request.still ? request.still() : request.fragment;
  if (request.needsPlotting && !plottingSent) {
    plottingSent = true;
    return plottingScript() + request.fragment;
  }
  return request.fragment;
}

/** What a kernel gets from a value's display method: a MIME bundle, now or later. */
export type KernelBundle = Record<string, string> | Promise<Record<string, string>>;

/**
 * The MIME bundle for a kernel that asks the value itself how to draw it (Deno reads the method
 * at Symbol.for('Jupyter.display') on a cell's result). Deno 2.9 reports the cell finished
 * without waiting for the execute_result it sends from this bundle to leave, and a headless run
 * then loses the value now and then (measured: up to 6 cells in 15; see deno-kernel.ts). So in
 * Deno the view goes out as a display of its own, which is waited for, and the value's own bundle
 * is empty: nothing is drawn twice, and nothing is lost if that empty result comes late.
 */
export function jupyterBundle(request: ShowRequest, title: string): KernelBundle {
  const kernel = currentKernel();
  if (kernel?.settled) {
    const settled = kernel.settled.bind(kernel);
    return (async () => {
      await kernel.html(notebookHtml(request));
      await settled();
      return {};
    })();
  }
  return { 'text/html': notebookHtml(request), 'text/plain': title };
}

/**
 * After show(): in Deno's kernel, a promise that settles once the display has been sent (a cell
 * that awaits it keeps its output in a headless run); elsewhere nothing to wait for.
 */
export function displaysSent(): Promise<void> | undefined {
  return currentKernel()?.settled?.();
}

export function showFragment(request: ShowRequest): string | undefined {
  const kernel = currentKernel();
  if (kernel) {
    kernel.html(notebookHtml(request));
    return undefined;
  }
  return writeViewFile(request);
}

function writeViewFile(request: ShowRequest): string {
  const folder = path.resolve(VIEWS_FOLDER);
  fs.mkdirSync(folder, { recursive: true });
  let page = request.page();
  const bundle = plottingScript();
  if (page.includes(bundle)) {
    // One copy of the bundle for the folder; each page loads it from beside itself (offline).
    const shared = `kinsort-plotting-${plottingVersion()}.js`;
    const sharedPath = path.join(folder, shared);
    if (!fs.existsSync(sharedPath)) fs.writeFileSync(sharedPath, plottingFileText());
    page = page.replace(bundle, `<script src="${shared}"></script>`);
  }
  const hash = createHash('sha256').update(page).digest('hex').slice(0, 10);
  const file = path.join(folder, request.fileName.replace(/\.html$/i, '') + `-${hash}.html`);
  fs.writeFileSync(file, page);
  // The one line of output that says where the view went.
  console.log(`kinsort: view written to ${file} (open it in a browser; works offline).`);
  return file;
}

/** The bundle as a script file that keeps an AMD loader on the page from taking it over. */
function plottingFileText(): string {
  const inner = plottingScript().match(/^<script>(.*?)<\/script><script>([\s\S]*)<\/script><script>(.*)<\/script>$/);
  if (!inner) throw new Error('kinsort: the plotting bundle has an unexpected shape.');
  return `${inner[1]}\n${inner[2]}\n${inner[3]}\n`;
}

/** The key under which a notebook kernel (Deno's) looks for a value's own display method. */
const JUPYTER_DISPLAY = Symbol.for('Jupyter.display');

/**
 * Give `target` the display method Deno's kernel calls when `target` is a cell's value (not
 * enumerable: it shows in no listing, copy or JSON). Returns `target`.
 */
export function displayableInKernel<T extends object>(target: T, bundle: () => KernelBundle): T {
  Object.defineProperty(target, JUPYTER_DISPLAY, { value: bundle, enumerable: false, configurable: true });
  return target;
}

/** The display method `displayableInKernel` gave `source`, if any. */
export function kernelDisplayOf(source: object): (() => KernelBundle) | undefined {
  const f = (source as Record<symbol, unknown>)[JUPYTER_DISPLAY];
  return typeof f === 'function' ? (f as () => KernelBundle) : undefined;
}
