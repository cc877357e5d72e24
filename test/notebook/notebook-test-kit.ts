// Pieces every notebook and browser test shares: how headless Chromium is started here, and the
// shape of a notebook cell's output as nbconvert saves it.

/** Headless Chromium on this machine: no sandbox (root), no GPU, and no background connections. */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--no-first-run',
];

/** One output of an executed notebook cell (nbformat 4). */
export type NotebookOutput = {
  output_type: string;
  name?: string;
  data?: Record<string, string | string[]>;
  text?: string | string[];
  ename?: string;
  evalue?: string;
};

/** A multi-line notebook string (a list of lines, or one string) as one string. */
export const text = (v: string | string[] | undefined): string => (Array.isArray(v) ? v.join('') : (v ?? ''));
