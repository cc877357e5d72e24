// Profile cards: one card per segment, built from profileSegments() output. Cards are plain HTML,
// so they read the same with scripts off; the "sets it apart" bars are a small inline SVG.
import { checkOptions } from '../core/options';
import type { SegmentProfile, VariableDifference, KeptSummary } from '../segments/profile';
import { escapeHtml } from './escape';
import { htmlSwatch, refuse, kindOf } from './common';
import { INK, segmentColour } from './palette';
import { svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface CardsOptions {
  title?: string;
  /** Replace the caution line under the cards. */
  caution?: string;
}

const DEFAULT_CAUTION =
  'Segments describe how these rows differ; they do not explain why, nor predict what a person will do. ' +
  'Keep protected attributes out unless there is a lawful reason, and check outcomes by segment for unfair effects.';

const variableName = (d: VariableDifference): string => (d.level === undefined ? d.variable : `${d.variable} = ${d.level}`);

const fmt = (v: number): string => (Number.isFinite(v) ? String(Number(v.toPrecision(3))) : '—');

/** Diverging bars: signed standardised difference, one row per variable. */
function differenceBars(p: SegmentProfile, width = 280): string {
  const rows = p.standout;
  if (rows.length === 0) return '';
  const rowH = 22;
  const height = rows.length * rowH + 20;
  const labelW = 124;
  // About 6.2 px per character at 11 px: longer names are shortened with an ellipsis (full name on hover).
  const maxChars = Math.floor((labelW - 10) / 6.2);
  const mid = labelW + (width - labelW) / 2;
  const half = (width - labelW) / 2 - 38;
  const reach = Math.max(1, ...rows.map((d) => Math.abs(d.difference)));
  const body: string[] = [svgEl.line({ x1: mid, x2: mid, y1: 2, y2: height - 16, stroke: INK.axis })];
  rows.forEach((d, i) => {
    const y = 4 + i * rowH;
    const w = (Math.abs(d.difference) / reach) * half;
    const above = d.difference >= 0;
    const name = variableName(d);
    body.push(
      svgEl.group(
        [
          svgEl.text(name.length > maxChars ? name.slice(0, maxChars - 1) + '…' : name, { x: labelW - 6, y: y + 13, 'text-anchor': 'end', 'font-size': 11, fill: INK.text }),
          svgEl.rect({ x: above ? mid : mid - w, y: y + 3, width: Math.max(1, w), height: rowH - 8, rx: 2, fill: above ? INK.above : INK.below }),
          svgEl.text(`${above ? '+' : '−'}${Math.abs(d.difference).toFixed(2)}`, {
            x: above ? mid + w + 3 : mid - w - 3,
            y: y + 13,
            'text-anchor': above ? 'start' : 'end',
            'font-size': 10.5,
            fill: INK.muted,
          }),
        ],
        {},
        `${name}: segment ${fmt(d.segmentMean)} vs all ${fmt(d.overallMean)} (${d.difference >= 0 ? '+' : ''}${d.difference.toFixed(2)} sd)`,
      ),
    );
  });
  body.push(svgEl.text('below all rows', { x: mid - 4, y: height - 3, 'text-anchor': 'end', 'font-size': 9.5, fill: INK.below }));
  body.push(svgEl.text('above all rows', { x: mid + 4, y: height - 3, 'font-size': 9.5, fill: INK.above }));
  return svgDocument(width, height, `Segment ${p.segment}: variables that set it apart`, body);
}

function keptLine(k: KeptSummary): string {
  if (k.kind === 'numeric') {
    return `<div class="ks-fact"><b>${escapeHtml(k.name)}</b>: median ${fmt(k.median)} (middle half ${fmt(k.q1)}–${fmt(k.q3)})${k.missing ? `, ${k.missing} missing` : ''}</div>`;
  }
  const shown = k.shares.slice(0, 4).map((s) => `${escapeHtml(s.level)} ${(s.share * 100).toFixed(0)}%`);
  const more = k.shares.length > 4 ? ` · ${k.shares.length - 4} more` : '';
  return `<div class="ks-fact"><b>${escapeHtml(k.name)}</b>: ${shown.join(' · ')}${more}${k.missing ? `, ${k.missing} missing` : ''}</div>`;
}

function card(p: SegmentProfile): string {
  const s = p.segment - 1;
  const name = p.title ?? `Segment ${p.segment}`;
  const stability = p.stability
    ? `<div class="ks-fact"><b>Stability</b>: ${Number.isFinite(p.stability.jaccard) ? p.stability.jaccard.toFixed(2) : '—'} · ${escapeHtml(p.stability.reading)} (mean Jaccard over resamples)</div>`
    : '';
  const typical = `<div class="ks-fact"><b>Typical member</b>: ${escapeHtml(p.typical.id ?? `row ${p.typical.row + 1}`)} <span style="color:${INK.muted}">(${
    p.typical.how === 'nearest-centroid' ? 'nearest the centre' : 'medoid'
  })</span></div>`;
  const apart = p.standout.length
    ? `<h5>Sets it apart (standardised difference from all rows)</h5>${differenceBars(p)}`
    : '';
  const kept = p.kept.length ? `<h5>Also describing</h5>${p.kept.map(keptLine).join('')}` : '';
  const rule =
    p.rule && p.rule.reproduced < p.rule.size
      ? `<div class="ks-fact"><b>Scoring rule</b>: the ${escapeHtml(p.rule.name)} rule keeps ${p.rule.reproduced.toLocaleString('en-US')} of its ${p.rule.size.toLocaleString('en-US')} members here</div>`
      : '';
  return (
    `<article class="ks-card" style="border-top-color:${segmentColour(s)}">` +
    `<header>${htmlSwatch(s)}<h4>${escapeHtml(name)}</h4></header>` +
    `<p class="ks-size">${p.size.toLocaleString('en-US')} rows · ${(p.share * 100).toFixed(1)}% of all</p>` +
    (p.text ? `<p class="ks-text">${escapeHtml(p.text)}</p>` : '') +
    apart +
    `<h5>Who is in it</h5>${typical}${stability}${rule}` +
    kept +
    `</article>`
  );
}

export function profileCardsView(profiles: readonly SegmentProfile[], options: CardsOptions = {}): View {
  const where = 'profileCardsView';
  const opts = checkOptions(options, ['title', 'caution'], where);
  if (!Array.isArray(profiles) || profiles.length === 0 || typeof profiles[0]?.segment !== 'number') {
    refuse(where, `needs the profiles from profileSegments(), one per segment, but got ${kindOf(profiles)}.`);
  }
  const title = opts.title ?? `Profiles of ${profiles.length} segments`;
  const caption =
    'One card per segment. Bars show how far the segment sits from all rows on each variable, in standard deviations ' +
    '(right: higher than all rows, left: lower); only the largest differences are listed.';
  const still =
    `<div class="ks-cards">${profiles.map(card).join('')}</div>` +
    `<p class="ks-caution">${escapeHtml(opts.caution ?? DEFAULT_CAUTION)}</p>`;
  // svg(): the bar panels side by side, for reports that take images only.
  const panels = profiles.map((p) => differenceBars(p));
  const svg = svgDocument(
    300 * Math.min(3, profiles.length),
    Math.ceil(profiles.length / 3) * 190,
    title,
    panels.map((panel, i) => svgEl.group([svgEl.text(`${profiles[i].segment} · ${profiles[i].title ?? `segment ${profiles[i].segment}`}`, { x: 4, y: 12, 'font-size': 12, 'font-weight': 650, fill: segmentColour(i) }), panel.replace('<svg ', '<svg y="18" ')], { transform: `translate(${(i % 3) * 300} ${Math.floor(i / 3) * 190})` })),
  );
  return makeView({ kind: 'profile-cards', title, caption, still, svg });
}
