// A view is data plus a renderer: the static stand-in (SVG or plain HTML, readable with scripts
// off) and, when there is one, a plotly figure that replaces the stand-in once the bundle is
// on the page. The script placed in each fragment is constant code; data travels only as
// escaped JSON.
import { saveText } from '../core/save-file';
import { escapeHtml, scriptJson, slug } from './escape';
import { VIEW_CSS } from './style';
import { showFragment, plottingScript, savedFileName, jupyterBundle, displayableInKernel, displaysSent } from '../notebook/display';
import type { ShowRequest } from '../notebook/display';

export interface PlotSpec {
  readonly data: readonly object[];
  readonly layout: object;
}

export interface View {
  readonly kind: string;
  readonly title: string;
  readonly caption: string;
  /** An HTML fragment for embedding (needs the plotting bundle on the page for the live chart). */
  fragment(): string;
  /** A complete offline page: plotting bundle inlined, no network. */
  html(): string;
  /** The static SVG stand-in. */
  svg(): string;
  /** Write html() to `file`; returns the absolute path. */
  save(file: string): string;
  /**
   * Inline in the notebook kernel; elsewhere a file in ./kinsort-views/ and one line saying where.
   * In Deno's kernel it returns a promise that settles once the display was sent (`await` it when
   * the cell has nothing else to wait for); elsewhere undefined.
   */
  show(): Promise<void> | undefined;
}

export interface ViewParts {
  kind: string;
  title: string;
  caption: string;
  /** The static stand-in: an SVG, or cards / tables as HTML. */
  still: string;
  /** The SVG for svg(); defaults to `still`. */
  svg?: string;
  plot?: PlotSpec;
  /** Plain-text notes listed under the chart (already plain text; escaped here). */
  notes?: readonly string[];
  /** Extra trusted HTML under the chart (built from escaped pieces by the view). */
  after?: string;
}

let counter = 0;

const PLOT_CONFIG = { responsive: true, displaylogo: false, modeBarButtonsToRemove: ['select2d', 'lasso2d'] };

// Finds its own figure, waits for window.Plotly (sent once per notebook session), draws, then
// hides the stand-in. With scripts off none of this runs and the stand-in stays.
const DRAW_SCRIPT = `(function(){var s=document.currentScript;var root=(s&&s.parentNode&&s.parentNode.querySelector)?s.parentNode:document.getElementById(__ID__);if(!root)return;var spec=JSON.parse(root.querySelector('script.ks-spec').textContent);var tries=0;function draw(){var live=root.querySelector('.ks-live');var still=root.querySelector('.ks-static');live.hidden=false;window.Plotly.newPlot(live,spec.data,spec.layout,spec.config).then(function(){still.style.display='none';root.setAttribute('data-drawn','plotly');});}(function wait(){if(window.Plotly&&window.Plotly.newPlot){draw();}else if(tries++<900){setTimeout(wait,100);}})();})();`;

export function makeView(parts: ViewParts): View {
  const id = `ks-${slug(parts.title)}-${++counter}`;
  const notes = parts.notes?.length ? `<ul class="ks-notes">${parts.notes.map((n) => `<li>${escapeHtml(n)}</li>`).join('')}</ul>` : '';
  const figure = (withLive: boolean): string => {
    const live =
      parts.plot && withLive
        ? `<div class="ks-live" hidden></div>` +
          `<script type="application/json" class="ks-spec">${scriptJson({ ...parts.plot, config: PLOT_CONFIG })}</script>` +
          `<script>${DRAW_SCRIPT.replace('__ID__', JSON.stringify(id))}</script>`
        : '';
    return (
      `<figure class="kinsort-view" id="${id}" data-view="${escapeHtml(parts.kind)}">` +
      `<style>${VIEW_CSS}</style>` +
      `<figcaption class="ks-head"><h3>${escapeHtml(parts.title)}</h3><p>${escapeHtml(parts.caption)}</p></figcaption>` +
      `<div class="ks-static">${parts.still}</div>${live}${notes}${parts.after ?? ''}</figure>`
    );
  };
  const fragment = (): string => figure(true);
  const html = (): string =>
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width">` +
    `<title>${escapeHtml(parts.title)}</title>${parts.plot ? plottingScript() : ''}</head>` +
    `<body style="margin:24px;background:#fbfbfc">${fragment()}</body></html>`;
  const request = (): ShowRequest => ({
    fragment: fragment(),
    still: () => figure(false),
    needsPlotting: parts.plot !== undefined,
    fileName: savedFileName(parts.title),
    page: html,
  });
  const view: View = {
    kind: parts.kind,
    title: parts.title,
    caption: parts.caption,
    fragment,
    html,
    svg: () => parts.svg ?? parts.still,
    save(file: string): string {
      return saveText(file, html(), `the view "${parts.title}"`);
    },
    show(): Promise<void> | undefined {
      showFragment(request());
      return displaysSent();
    },
  };
  // Deno's notebook kernel draws a cell's value through this method.
  return displayableInKernel(view, () => jupyterBundle(request(), parts.title));
}
