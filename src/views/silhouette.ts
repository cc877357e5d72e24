// Silhouettes (Rousseeuw 1987) as one strip per segment: a histogram of the rows' widths in the
// segment's colour (rows below 0 in a pale tint), its middle half and median marked, and beside it
// the figures a reader asks for: the segment's mean width, the share of rows below 0 and the
// segment they lean to. The overall average is a labelled slate line across every strip. Counts
// are binned first, so the picture is the same size for 100 or 100,000 rows; a plain SVG, it reads
// the same with scripts off.
import { compactLabels } from '../core/assignment';
import { checkOptions } from '../core/options';
import { kindOf, namesFrom, refuse, shortName } from './common';
import { INK, segmentColour, textOn } from './palette';
import { summariseSilhouette, SILHOUETTE_BIN, type SilhouetteSummary } from './silhouette-summary';
import { linearScale, niceTicks, formatTick, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface SilhouetteLike {
  readonly values: ArrayLike<number>;
  readonly average: number;
  readonly bySegment?: readonly number[];
  /** Per row, the nearest other segment (0-based); names where rows below 0 lean. */
  readonly neighbour?: ArrayLike<number>;
}

/** Up to two lines of at most `max` characters, broken at spaces; a longer rest is shortened at a word with "…". */
function twoLines(text: string, max: number): string[] {
  const words = text.trim().split(/\s+/);
  let first = '';
  let used = 0;
  while (used < words.length && (first ? first + ' ' + words[used] : words[used]).length <= max)
    first = first ? `${first} ${words[used++]}` : words[used++];
  if (used === 0) return [shortName(text.trim(), max)];
  const rest = words.slice(used).join(' ');
  return rest ? [first, shortName(rest, max)] : [first];
}

const pct = (part: number, whole: number): string => {
  const p = (100 * part) / whole;
  return p === 0 ? '0 %' : p < 0.1 ? '<0.1 %' : `${p < 10 ? p.toFixed(1) : p.toFixed(0)} %`;
};

function draw(summary: SilhouetteSummary, names: (string | undefined)[], title: string): string {
  const width = 760;
  const stripH = 58;
  const top = 40;
  const left = 196;
  const right = 560;
  const k = summary.segments.length;
  const bottom = top + k * stripH;
  const height = bottom + 46;
  // The axis fits the data: from the lowest width (or 0) to the highest, on whole tenths.
  const lo = Math.min(0, Math.floor(summary.min * 10) / 10);
  const hi = Math.max(0.1, Math.ceil((summary.binStart + summary.bins * SILHOUETTE_BIN) * 10 - 1e-9) / 10);
  const x = linearScale([lo, hi], [left, right]);
  const body: string[] = [svgEl.rect({ x: left, y: top, width: right - left, height: bottom - top, fill: INK.panel })];
  for (const t of niceTicks(lo, hi, 6)) {
    body.push(
      svgEl.line({ x1: x(t), x2: x(t), y1: top, y2: bottom, stroke: t === 0 ? INK.axis : INK.grid, 'stroke-width': t === 0 ? 1.2 : 1 }),
    );
    body.push(svgEl.text(formatTick(t), { x: x(t), y: bottom + 15, 'text-anchor': 'middle', 'font-size': 11, fill: INK.muted }));
  }
  body.push(
    svgEl.text('silhouette width: 1 well inside its segment · 0 between two · below 0 nearer another segment', {
      x: (left + right) / 2,
      y: bottom + 34,
      'text-anchor': 'middle',
      'font-size': 11.5,
      fill: INK.text,
    }),
  );
  body.push(svgEl.text('mean width · rows below 0', { x: right + 14, y: top - 10, 'font-size': 10.5, fill: INK.muted }));
  summary.segments.forEach((seg, s) => {
    const y0 = top + s * stripH;
    const base = y0 + stripH - 16;
    const colour = segmentColour(s);
    if (s > 0) body.push(svgEl.line({ x1: 0, x2: width, y1: y0, y2: y0, stroke: INK.grid }));
    // Label: numbered swatch, name on up to two lines, row count.
    body.push(svgEl.rect({ x: 4, y: y0 + 9, width: 22, height: 18, rx: 4, fill: colour }));
    body.push(
      svgEl.text(String(s + 1), {
        x: 15,
        y: y0 + 22,
        'text-anchor': 'middle',
        'font-size': 11.5,
        'font-weight': 700,
        fill: textOn(colour),
      }),
    );
    const lines = names[s] ? twoLines(names[s]!, 24) : [`Segment ${s + 1}`];
    lines.forEach((line, i) =>
      body.push(svgEl.text(line, { x: 32, y: y0 + 22 + i * 14, 'font-size': 12, fill: INK.text, 'font-weight': i === 0 ? 600 : 400 })),
    );
    body.push(
      svgEl.text(`${seg.size.toLocaleString('en-US')} rows`, { x: 32, y: y0 + 22 + lines.length * 14, 'font-size': 11, fill: INK.muted }),
    );
    // Histogram: columns rising from the strip's base line; each strip scaled to its own tallest bin.
    const peak = Math.max(1, ...seg.counts);
    const room = stripH - 26;
    seg.counts.forEach((c, b) => {
      if (c === 0) return;
      const v0 = summary.binStart + b * SILHOUETTE_BIN;
      const h = Math.max(1.5, (c / peak) * room);
      const negative = v0 + SILHOUETTE_BIN <= 1e-12;
      body.push(
        svgEl.rect({
          x: x(v0) + 0.5,
          y: base - h,
          width: Math.max(1, x(v0 + SILHOUETTE_BIN) - x(v0) - 1),
          height: h,
          fill: colour,
          'fill-opacity': negative ? 0.35 : 0.9,
        }),
      );
    });
    // Middle half as a bracket under the columns, the median as a tick.
    body.push(
      svgEl.path(
        pathData([
          [x(seg.q1), base + 7],
          [x(seg.q1), base + 10],
          [x(seg.q3), base + 10],
          [x(seg.q3), base + 7],
        ]),
        { fill: 'none', stroke: INK.text, 'stroke-width': 1.3 },
      ),
    );
    body.push(svgEl.line({ x1: x(seg.median), x2: x(seg.median), y1: base + 4, y2: base + 13, stroke: INK.text, 'stroke-width': 2 }));
    // Figures beside the strip.
    body.push(svgEl.text(seg.mean.toFixed(2), { x: right + 14, y: y0 + 24, 'font-size': 15, 'font-weight': 650, fill: INK.text }));
    const belowText = seg.below === 0 ? 'none below 0' : `${pct(seg.below, seg.size)} below 0`;
    body.push(svgEl.text(belowText, { x: right + 56, y: y0 + 23, 'font-size': 11.5, fill: INK.text }));
    if (seg.leansTo !== null) {
      const to = seg.leansTo;
      const c2 = segmentColour(to);
      const lean = seg.leaning === seg.below ? 'all nearer' : 'most nearer';
      body.push(svgEl.text(lean, { x: right + 56, y: y0 + 39, 'font-size': 11, fill: INK.muted }));
      const lx = right + 56 + lean.length * 6 + 6;
      body.push(svgEl.rect({ x: lx, y: y0 + 28, width: 18, height: 15, rx: 3, fill: c2 }));
      body.push(
        svgEl.text(String(to + 1), {
          x: lx + 9,
          y: y0 + 39.5,
          'text-anchor': 'middle',
          'font-size': 10.5,
          'font-weight': 700,
          fill: textOn(c2),
        }),
      );
    }
  });
  // The overall average: a slate line over every strip, labelled at the top.
  const ax = x(summary.average);
  body.push(svgEl.line({ x1: ax, x2: ax, y1: top - 4, y2: bottom, stroke: INK.above, 'stroke-width': 1.6 }));
  const label = `all rows ${summary.average.toFixed(2)}`;
  const lw = label.length * 6.3 + 12;
  const lx = Math.min(Math.max(ax - lw / 2, left), right - lw);
  body.push(svgEl.rect({ x: lx, y: top - 24, width: lw, height: 18, rx: 9, fill: INK.above }));
  body.push(svgEl.text(label, { x: lx + lw / 2, y: top - 11, 'text-anchor': 'middle', 'font-size': 11, fill: '#ffffff' }));
  return svgDocument(width, height, title, body);
}

export function silhouetteView(
  silhouette: SilhouetteLike,
  assignment: ArrayLike<number>,
  options: { names?: Readonly<Record<number, string>>; title?: string; ids?: readonly string[] } = {},
): View {
  const where = 'silhouetteView';
  const opts = checkOptions(options, ['names', 'title', 'ids'], where);
  if (!silhouette || !silhouette.values || typeof silhouette.values.length !== 'number') {
    refuse(where, `needs a silhouette result ({ values, average }) from silhouette(), but got ${kindOf(silhouette)}.`);
  }
  const n = silhouette.values.length;
  const { labels, k } = compactLabels(assignment, n, where, 'the silhouette values');
  const names = namesFrom(k, opts.names);
  const summary = summariseSilhouette(silhouette.values, labels, k, silhouette.average, silhouette.neighbour);
  const title = opts.title ?? `How well each segment holds together (silhouettes, average ${silhouette.average.toFixed(2)})`;
  const caption =
    'One strip per segment: how many of its rows have each silhouette width (pale columns: below 0, rows nearer on average to another segment), ' +
    'the bracket marks the middle half and the tick the median; the slate line is the average over all rows.';
  const below = summary.segments.reduce((a, s) => a + s.below, 0);
  const notes = [`${below.toLocaleString('en-US')} of ${n.toLocaleString('en-US')} rows (${pct(below, n)}) have a width below 0.`];
  return makeView({ kind: 'silhouette', title, caption, still: draw(summary, names, title), notes });
}
