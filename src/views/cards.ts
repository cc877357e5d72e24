// Profile cards: one card per segment, built from profileSegments() output. Cards are plain HTML,
// so they read the same with scripts off. Each variable that sets a segment apart is one row: its
// full name, the segment's value beside the value for all rows in the column's own units, and the
// standardised difference as a small bar in two neutral inks (no segment colour).
import { checkOptions } from '../core/options';
import { formatShown, type SegmentProfile, type VariableDifference, type KeptSummary, type ProfileValue } from '../segments/profile';
import { escapeHtml } from './escape';
import { htmlSwatch, refuse, kindOf } from './common';
import { INK, segmentColour } from './palette';
import { svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface CardsOptions {
  title?: string;
  /** Replace the caution line under the cards; false leaves it out (a page that says it once elsewhere). */
  caution?: string | false;
}

/**
 * A profile as the cards read it: `rule`, when present (the fluent layer sets it), says how many of
 * the segment's members the definition's rule (nearest centre / medoid) puts back in it.
 */
export type CardProfile = SegmentProfile & {
  readonly rule?: { readonly name: string; readonly reproduced: number; readonly size: number };
  /** The rows in no segment (density segments): drawn in neutral ink, with no segment number. */
  readonly noise?: boolean;
};

/** Ink of the noise card and of noise rows in other views: neutral, never a segment colour. */
export const NOISE_INK = INK.muted;

const NOISE_SWATCH = `<span class="ks-swatch" style="background:#ffffff;color:${NOISE_INK};border:1.5px dashed ${NOISE_INK}">·</span>`;

const swatchOf = (p: CardProfile): string => (p.noise ? NOISE_SWATCH : htmlSwatch(p.segment - 1));
const inkOf = (p: CardProfile): string => (p.noise ? NOISE_INK : segmentColour(p.segment - 1));

/** The sections of a card, in order; each returns trusted HTML built from escaped pieces. */
export type CardSection = (p: CardProfile, context: { reach: number }) => string;

export const DEFAULT_CAUTION =
  'Segments describe how these rows differ; they do not explain why, nor predict what a person will do. ' +
  'Keep protected attributes out unless there is a lawful reason, and check outcomes by segment for unfair effects.';

const variableName = (d: VariableDifference): string => (d.level === undefined ? d.variable : `${d.variable} = ${d.level}`);

const fmt = (v: number): string => (Number.isFinite(v) ? String(Number(v.toPrecision(3))) : '—');

const signed = (v: number): string => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(2)}`;

/** A small diverging bar: the standardised difference, dark slate above the whole, light below. */
function differenceBar(d: VariableDifference, reach: number, x0 = 0, y0 = 0, width = 150): string[] {
  const mid = x0 + width / 2;
  const half = width / 2 - 34;
  const w = (Math.min(Math.abs(d.difference), reach) / reach) * half;
  const above = d.difference >= 0;
  return [
    svgEl.line({ x1: mid, x2: mid, y1: y0, y2: y0 + 20, stroke: INK.axis }),
    svgEl.rect({ x: above ? mid : mid - w, y: y0 + 4, width: Math.max(1, w), height: 12, rx: 2, fill: above ? INK.above : INK.below }),
    svgEl.text(signed(d.difference), {
      x: above ? mid + w + 3 : mid - w - 3,
      y: y0 + 14,
      'text-anchor': above ? 'start' : 'end',
      'font-size': 10.5,
      fill: INK.muted,
    }),
  ];
}

const valuesText = (d: VariableDifference): string =>
  `${formatShown(d.segmentMean, d.shownAs)} (all rows ${formatShown(d.overallMean, d.shownAs)})`;

function apartRows(p: CardProfile, reach: number): string {
  if (p.standout.length === 0) return '';
  const rows = p.standout
    .map((d) => {
      const tip = `${variableName(d)}: ${valuesText(d)} (${signed(d.difference)} sd)`;
      const bar = svgDocument(150, 20, 'difference in standard deviations', [svgEl.group(differenceBar(d, reach), {}, tip)]);
      return (
        `<div class="ks-apart-row"><div><div class="ks-apart-name">${escapeHtml(variableName(d))}</div>` +
        `<div class="ks-apart-values">${escapeHtml(valuesText(d))}</div></div><div class="ks-apart-bar">${bar}</div></div>`
      );
    })
    .join('');
  return `<h5>Sets it apart</h5>${rows}`;
}

function shownValue(v: ProfileValue, d: VariableDifference | undefined): string {
  if (v === null || v === undefined || v === '') return 'missing';
  if (typeof v === 'number' && d && d.level === undefined) return formatShown(v, d.shownAs);
  return String(v);
}

function typicalLine(p: CardProfile): string {
  const what =
    p.typical.how === 'nearest-centroid'
      ? 'the member nearest the segment centre'
      : p.typical.how === 'given'
        ? 'the medoid the method chose'
        : 'the medoid: least total distance to the other members';
  const who = escapeHtml(p.typical.id ?? `row ${p.typical.row + 1}`);
  const values = p.typical.values;
  let shown = '';
  if (values) {
    const names = [...new Set(p.standout.map((d) => d.variable))].slice(0, 4);
    shown = names
      .map(
        (name) =>
          `${escapeHtml(name)} ${escapeHtml(
            shownValue(
              values[name],
              p.standout.find((d) => d.variable === name),
            ),
          )}`,
      )
      .join(' · ');
  }
  return `<div class="ks-fact"><b>Typical member</b>: ${who} <span style="color:${INK.muted}">(${what})</span>${shown ? `<br><span class="ks-apart-values">${shown}</span>` : ''}</div>`;
}

function keptLine(k: KeptSummary): string {
  if (k.kind === 'numeric') {
    return `<div class="ks-fact"><b>${escapeHtml(k.name)}</b>: median ${fmt(k.median)} (middle half ${fmt(k.q1)}–${fmt(k.q3)})${k.missing ? `, ${k.missing} missing` : ''}</div>`;
  }
  const shown = k.shares.slice(0, 4).map((s) => `${escapeHtml(s.level)} ${(s.share * 100).toFixed(0)}\u00a0%`);
  const more = k.shares.length > 4 ? ` · ${k.shares.length - 4} more` : '';
  return `<div class="ks-fact"><b>${escapeHtml(k.name)}</b>: ${shown.join(' · ')}${more}${k.missing ? `, ${k.missing} missing` : ''}</div>`;
}

/** Shown only below 100 %: the definition's rule would score some members into another segment. */
function reproducedLine(p: CardProfile): string {
  const r = p.rule;
  if (!r || !(r.size > 0) || r.reproduced >= r.size) return '';
  return (
    `<p class="ks-size"><b>Definition</b>: its ${escapeHtml(r.name)} rule puts ${((100 * r.reproduced) / r.size).toFixed(1)}\u00a0% ` +
    `of these rows (${r.reproduced.toLocaleString('en-US')} of ${r.size.toLocaleString('en-US')}) back in this segment</p>`
  );
}

/** Sections of every card, in order (a later section, e.g. rules, goes in this list). */
export const CARD_SECTIONS: CardSection[] = [
  (p) =>
    `<header>${swatchOf(p)}<h4>${escapeHtml(p.title ?? `Segment ${p.segment}`)}</h4></header>` +
    `<p class="ks-size">${p.size.toLocaleString('en-US')} rows · ${(p.share * 100).toFixed(1)} % of all</p>` +
    reproducedLine(p) +
    (p.text ? `<p class="ks-text">${escapeHtml(p.text)}</p>` : ''),
  (p, c) => apartRows(p, c.reach),
  (p) => {
    const stability = p.stability
      ? `<div class="ks-fact"><b>Stability</b>: ${Number.isFinite(p.stability.jaccard) ? p.stability.jaccard.toFixed(2) : '—'} · ${escapeHtml(p.stability.reading)} (mean Jaccard over resamples)</div>`
      : '';
    return `<h5>Who is in it</h5>${typicalLine(p)}${stability}`;
  },
  (p) => (p.kept.length ? `<h5>Also describing</h5>${p.kept.map(keptLine).join('')}` : ''),
];

function card(p: CardProfile, reach: number): string {
  return (
    `<article class="ks-card" style="border-top-color:${inkOf(p)}${p.noise ? ';border-top-style:dashed' : ''}">` +
    CARD_SECTIONS.map((section) => section(p, { reach })).join('') +
    `</article>`
  );
}

/** The bar panels side by side, for reports that take images only. */
function cardsSvg(profiles: readonly CardProfile[], title: string, reach: number): string {
  const panelW = 420;
  const rowH = 34;
  const panelH = 30 + Math.max(...profiles.map((p) => p.standout.length)) * rowH + 10;
  const perRow = Math.min(2, profiles.length);
  const body: string[] = [];
  profiles.forEach((p, i) => {
    const x0 = (i % perRow) * panelW;
    const y0 = Math.floor(i / perRow) * panelH;
    body.push(svgEl.rect({ x: x0 + 2, y: y0 + 4, width: 20, height: 16, rx: 3, fill: inkOf(p) }));
    body.push(
      svgEl.text(p.noise ? '·' : String(p.segment), {
        x: x0 + 12,
        y: y0 + 16,
        'text-anchor': 'middle',
        'font-size': 11,
        'font-weight': 700,
        fill: '#ffffff',
      }),
    );
    body.push(
      svgEl.text(p.title ?? `Segment ${p.segment}`, { x: x0 + 28, y: y0 + 17, 'font-size': 12.5, 'font-weight': 650, fill: INK.text }),
    );
    p.standout.forEach((d, r) => {
      const y = y0 + 28 + r * rowH;
      body.push(svgEl.text(variableName(d), { x: x0 + 4, y: y + 12, 'font-size': 11.5, fill: INK.text }));
      body.push(svgEl.text(valuesText(d), { x: x0 + 4, y: y + 26, 'font-size': 10.5, fill: INK.muted }));
      body.push(...differenceBar(d, reach, x0 + panelW - 166, y + 6));
    });
  });
  return svgDocument(perRow * panelW, Math.ceil(profiles.length / perRow) * panelH, title, body);
}

export function profileCardsView(profiles: readonly CardProfile[], options: CardsOptions = {}): View {
  const where = 'profileCardsView';
  const opts = checkOptions(options, ['title', 'caution'], where);
  if (!Array.isArray(profiles) || profiles.length === 0 || typeof profiles[0]?.segment !== 'number') {
    refuse(where, `needs the profiles from profileSegments(), one per segment, but got ${kindOf(profiles)}.`);
  }
  const noiseCards = (profiles as readonly CardProfile[]).filter((p) => p.noise).length;
  const title = opts.title ?? `Profiles of ${profiles.length - noiseCards} segments${noiseCards ? ' and of the rows in none (noise)' : ''}`;
  const caption =
    "One card per segment: the variables that set it apart most, each with the segment's value beside the value for all rows, " +
    'and the difference in standard deviations as a bar (dark, to the right: higher than all rows; light, to the left: lower).';
  // One scale for every card, so equal bars mean equal differences across cards.
  const reach = Math.max(1, ...profiles.flatMap((p) => p.standout.map((d: VariableDifference) => Math.abs(d.difference))));
  const caution = opts.caution === false ? '' : `<p class="ks-caution">${escapeHtml(opts.caution ?? DEFAULT_CAUTION)}</p>`;
  const still = `<div class="ks-cards">${profiles.map((p) => card(p, reach)).join('')}</div>${caution}`;
  return makeView({ kind: 'profile-cards', title, caption, still, svg: cardsSvg(profiles, title, reach) });
}
