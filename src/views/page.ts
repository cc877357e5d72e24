// Several views on one offline page (a report): the plotting bundle is inlined once for all.
import { saveText } from '../core/save-file';
import { KinsortError } from '../core/errors';
import { escapeHtml } from './escape';
import { plottingScript } from '../notebook/plotting';
import type { View } from './view';

export function viewsPage(title: string, views: readonly View[], intro?: string): string {
  if (!Array.isArray(views) || views.some((v) => typeof (v as Partial<View> | null)?.fragment !== 'function')) {
    const bad = Array.isArray(views) ? views.findIndex((v) => typeof (v as Partial<View> | null)?.fragment !== 'function') + 1 : 0;
    throw new KinsortError(
      Array.isArray(views)
        ? `viewsPage: item ${bad} of the views is not a view (build it with one of the view functions, or call .view() on a result).`
        : 'viewsPage: give a list of views, e.g. [seg.cards(), seg.projection()].',
      'bad-argument',
    );
  }
  return (
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width">` +
    `<title>${escapeHtml(title)}</title>${plottingScript()}</head>` +
    `<body style="margin:24px auto;max-width:1020px;padding:0 16px;background:#fbfbfc;font-family:system-ui,sans-serif;color:#22262b">` +
    `<h1 style="font-size:24px;margin:0 0 6px">${escapeHtml(title)}</h1>` +
    (intro ? `<p style="margin:0 0 16px;color:#5d6670">${escapeHtml(intro)}</p>` : '') +
    views.map((v) => v.fragment()).join('') +
    `</body></html>`
  );
}

/** Write viewsPage() to `file`; returns the absolute path. */
export function saveViewsPage(file: string, title: string, views: readonly View[], intro?: string): string {
  return saveText(file, viewsPage(title, views, intro), 'the page of views');
}
