// The write-up as one standalone offline HTML page: how the segments were made, the evidence,
// the cards, and the caution. Every piece of text from data is escaped here or in the cards.
import type { SegmentProfile } from '../segments/profile';
import { figureWords, formatFigure, WRITE_UP_CAUTION, type WriteUpContext } from '../segments/write-up';
import { escapeHtml } from './escape';
import type { View } from './view';

const PAGE_CSS = `body{margin:32px auto;max-width:1100px;padding:0 20px;font:15px/1.5 system-ui,-apple-system,"Segoe UI",sans-serif;color:#1d2530;background:#fbfbfc}
h1{font-size:26px;margin:0 0 6px}.ks-wu-method{color:#47515d;margin:0 0 18px}
table.ks-wu-figures{border-collapse:collapse;margin:8px 0 22px}table.ks-wu-figures td,table.ks-wu-figures th{padding:3px 12px 3px 0;text-align:left;border-bottom:1px solid #e3e6ea}
.ks-wu-caution{margin-top:28px;padding:12px 16px;border-left:4px solid #b5651d;background:#fff6ec;color:#4a3320}`;

export function writeUpPage(profiles: readonly SegmentProfile[], context: WriteUpContext, cards: View): string {
  const r = context.report;
  const rows = [
    ['Rows in the table', String(r.inputRows)],
    ['Rows segmented', String(r.keptRows)],
    ['Rows dropped (missing values)', String(r.dropped.length)],
    ['Segments', String(profiles.length)],
    ...Object.entries(context.evidence).map(([name, value]) => [figureWords(name), formatFigure(value)]),
  ];
  const figures = rows.map(([a, b]) => `<tr><th>${escapeHtml(a)}</th><td>${escapeHtml(b)}</td></tr>`).join('');
  return (
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width">` +
    `<title>${escapeHtml(context.title)}</title><style>${PAGE_CSS}</style></head><body>` +
    `<h1>${escapeHtml(context.title)}</h1><p class="ks-wu-method">${escapeHtml(context.method)}</p>` +
    `<table class="ks-wu-figures">${figures}</table>` +
    cards.fragment() +
    `<p class="ks-wu-caution">${escapeHtml(WRITE_UP_CAUTION)}</p></body></html>`
  );
}
