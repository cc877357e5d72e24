// Dendrogram: branches coloured by the cut, the cut drawn as a line, leaf labels from ids, heights
// on an axis. Few leaves: upright. Many leaves: lying down, with labels thinned to what fits.
import { compactLabels } from '../core/assignment';
import { checkChoice } from '../core/errors';
import { checkInteger, checkNumber, checkOptions } from '../core/options';
import { axisStyle, baseLayout, everyNth, kindOf, plotText, refuse, svgLegend } from './common';
import { INK, segmentColour, textOn } from './palette';
import { frame, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface DendrogramTree {
  readonly kind: 'tree';
  readonly size: number;
  readonly method?: string;
  readonly merges: readonly { left: number; right: number; height: number; size: number }[];
  readonly order: readonly number[];
  readonly labels?: readonly string[];
  cut(spec: { k: number } | { height: number }): Int32Array;
}

export interface DendrogramOptions {
  /** Colour branches by a cut into k segments. */
  k?: number;
  /** Colour branches by a cut at this height. */
  height?: number;
  /** Leaf labels (default: the tree's labels, else row numbers). */
  labels?: readonly string[];
  /** 'upright' (leaves along the bottom) or 'lying' (leaves down the side); default by size. */
  orientation?: 'upright' | 'lying';
  title?: string;
}

const NEUTRAL = '#9aa3ad';

export function dendrogramView(tree: DendrogramTree, options: DendrogramOptions = {}): View {
  const where = 'dendrogramView';
  const opts = checkOptions(options, ['k', 'height', 'labels', 'orientation', 'title'], where);
  if (!tree || (tree as { kind?: string }).kind !== 'tree' || !Array.isArray(tree.merges)) {
    refuse(
      where,
      `a dendrogram needs a tree from agglomerate(), but got ${kindOf(tree)}. ` +
        `Build one first, e.g. agglomerate(rows, { method: 'ward' }), then ask for its dendrogram; ` +
        `for a k-means or k-medoids result use projectionView or profileCardsView instead.`,
    );
  }
  const n = tree.size;
  if (opts.k !== undefined && opts.height !== undefined) refuse(where, 'give either k or height for the cut, not both.');
  if (opts.labels !== undefined && opts.labels.length !== n) refuse(where, `${opts.labels.length} labels for ${n} leaves.`);
  const orientation = opts.orientation === undefined ? (n <= 60 ? 'upright' : 'lying') : checkChoice(opts.orientation, ['upright', 'lying'], 'orientation');
  let assignment: Int32Array | undefined;
  let cutHeight: number | undefined;
  const heights = tree.merges.map((m) => m.height);
  if (opts.k !== undefined) {
    const k = checkInteger(opts.k, 'dendrogramView k', 1, n);
    assignment = tree.cut({ k });
    // The cut sits between the last merge kept and the first one undone.
    if (k > 1) cutHeight = (heights[n - 1 - k] ?? 0) / 2 + heights[n - k] / 2;
  } else if (opts.height !== undefined) {
    cutHeight = checkNumber(opts.height, 'dendrogramView height');
    assignment = tree.cut({ height: cutHeight });
  }
  const k = assignment ? compactLabels(assignment, n, where).k : 0;
  const labels = (opts.labels ?? tree.labels ?? Array.from({ length: n }, (_, i) => `row ${i + 1}`)).map(String);

  // Geometry in (u = leaf position, v = height); each node's segment, or -1 when mixed.
  const pos = new Float64Array(2 * n - 1);
  const top = new Float64Array(2 * n - 1);
  const seg = new Int32Array(2 * n - 1);
  tree.order.forEach((leaf, i) => (pos[leaf] = i));
  for (let i = 0; i < n; i++) seg[i] = assignment ? assignment[i] : -1;
  const links: { points: [number, number][]; segment: number; merge: number }[] = [];
  tree.merges.forEach((m, i) => {
    const node = n + i;
    pos[node] = (pos[m.left] + pos[m.right]) / 2;
    top[node] = m.height;
    seg[node] = assignment && seg[m.left] === seg[m.right] ? seg[m.left] : -1;
    links.push({
      points: [
        [pos[m.left], top[m.left]],
        [pos[m.left], m.height],
        [pos[m.right], m.height],
        [pos[m.right], top[m.right]],
      ],
      segment: seg[node],
      merge: i,
    });
  });
  const maxHeight = Math.max(...heights, 0) || 1;
  // Where each segment's trunk crosses the cut: a numbered badge goes there.
  const badges: { segment: number; u: number; v: number }[] = [];
  if (assignment && cutHeight !== undefined) {
    const root = new Int32Array(k).fill(-1);
    for (let node = 0; node < 2 * n - 1; node++) if (seg[node] >= 0) root[seg[node]] = node;
    root.forEach((node, s) => badges.push({ segment: s, u: pos[node], v: cutHeight! }));
  }
  const title = opts.title ?? `Dendrogram${tree.method ? ` (${tree.method} linkage)` : ''}${k ? `, cut into ${k} segments` : ''}`;
  const caption =
    'Rows join where their branches meet: the higher the join, the less alike the groups it joins' +
    (k ? '; branches below the dashed cut line take the colour and number of their segment.' : '.');

  // Label thinning: at most one label per ~11 px of leaf axis.
  const leafAxisPx = orientation === 'upright' ? 860 : Math.min(2400, Math.max(360, n * 12));
  const every = Math.max(1, Math.ceil((n * 11) / leafAxisPx));
  const shown = tree.order.map((leaf, i) => (i % every === 0 ? labels[leaf] : ''));
  const note = every > 1 ? [`${n} leaves: ${everyNth(every)} label is printed; hover (with scripts on) names every leaf.`] : [];

  const still = staticDendrogram(links, shown, orientation, maxHeight, cutHeight, k, title, leafAxisPx, badges);
  const plot = plotDendrogram(links, tree.order.map((l) => labels[l]), shown, orientation, maxHeight, cutHeight, k, leafAxisPx, badges);
  return makeView({ kind: 'dendrogram', title, caption, still, plot, notes: note });
}

type Link = { points: [number, number][]; segment: number; merge: number };
type Badge = { segment: number; u: number; v: number };

function staticDendrogram(
  links: Link[],
  shown: string[],
  orientation: 'upright' | 'lying',
  maxHeight: number,
  cutHeight: number | undefined,
  k: number,
  title: string,
  leafAxisPx: number,
  badges: Badge[],
): string {
  const n = shown.length;
  const longest = Math.min(24, Math.max(...shown.map((s) => s.length), 3));
  const labelRoom = 12 + longest * 6.2;
  const upright = orientation === 'upright';
  const width = upright ? 940 : 900;
  const height = upright ? 380 + labelRoom : leafAxisPx + 90;
  const legendRoom = k ? 30 : 0;
  const leafTitle = `${n} rows, in the order the tree joins them`;
  const f = frame({
    width,
    height: height - legendRoom,
    margin: upright ? { left: 64, right: 16, top: 14, bottom: labelRoom + 34 } : { left: labelRoom + 10, right: 24, top: 14, bottom: 48 },
    x: upright
      ? { domain: [-0.5, n - 0.5], title: leafTitle, ticks: [], tickLabels: [] }
      : { domain: [maxHeight * 1.04, 0], title: 'height (dissimilarity at which groups join)' },
    y: upright
      ? { domain: [0, maxHeight * 1.04], title: 'height (dissimilarity at which groups join)' }
      : { domain: [-0.5, n - 0.5], title: leafTitle, ticks: [], tickLabels: [], reversed: true },
  });
  const place = ([u, v]: [number, number]): [number, number] => (upright ? [f.x(u), f.y(v)] : [f.x(v), f.y(u)]);
  const body = [...f.under];
  for (const l of links) {
    body.push(svgEl.path(pathData(l.points.map(place)), { fill: 'none', stroke: l.segment >= 0 ? segmentColour(l.segment) : NEUTRAL, 'stroke-width': 1.6 }));
  }
  shown.forEach((label, i) => {
    if (!label) return;
    const text = label.length > 24 ? label.slice(0, 23) + '…' : label;
    if (upright) {
      const x = f.x(i);
      body.push(svgEl.text(text, { x, y: f.bottom + 8, 'font-size': 10.5, fill: INK.text, 'text-anchor': 'end', transform: `rotate(-60 ${x.toFixed(1)} ${(f.bottom + 8).toFixed(1)})` }));
    } else {
      body.push(svgEl.text(text, { x: f.left - 6, y: f.y(i) + 3.5, 'font-size': 10.5, fill: INK.text, 'text-anchor': 'end' }));
    }
  });
  if (cutHeight !== undefined) {
    const a = place([-0.5, cutHeight]);
    const b = place([n - 0.5, cutHeight]);
    body.push(svgEl.line({ x1: a[0], y1: a[1], x2: b[0], y2: b[1], stroke: INK.accent, 'stroke-width': 1.4, 'stroke-dasharray': '6 4' }));
  }
  for (const b of badges) {
    const [px, py] = place([b.u, b.v]);
    const colour = segmentColour(b.segment);
    body.push(svgEl.rect({ x: px - 10, y: py - 9, width: 20, height: 18, rx: 4, fill: colour, stroke: '#ffffff', 'stroke-width': 1.5 }));
    body.push(svgEl.text(String(b.segment + 1), { x: px, y: py + 4, 'text-anchor': 'middle', 'font-size': 11, 'font-weight': 700, fill: textOn(colour) }));
  }
  if (k) body.push(...svgLegend(k, 64, height - 12));
  return svgDocument(width, height, title, body);
}

function plotDendrogram(
  links: Link[],
  leafNames: string[],
  shown: string[],
  orientation: 'upright' | 'lying',
  maxHeight: number,
  cutHeight: number | undefined,
  k: number,
  leafAxisPx: number,
  badges: Badge[],
): { data: object[]; layout: object } {
  const upright = orientation === 'upright';
  const groups = new Map<number, { u: (number | null)[]; v: (number | null)[] }>();
  for (const l of links) {
    const g = groups.get(l.segment) ?? { u: [], v: [] };
    for (const [u, v] of l.points) {
      g.u.push(u);
      g.v.push(v);
    }
    g.u.push(null);
    g.v.push(null);
    groups.set(l.segment, g);
  }
  // A one-row segment has no branch of its own (its leaf hangs from a join across segments), but
  // its badge is coloured, so the legend must still list it: an empty trace keeps its entry.
  for (let s = 0; s < k; s++) if (!groups.has(s)) groups.set(s, { u: [null], v: [null] });
  const data: object[] = [];
  for (const [s, g] of [...groups].sort((a, b) => a[0] - b[0])) {
    data.push({
      type: 'scatter',
      mode: 'lines',
      x: upright ? g.u : g.v,
      y: upright ? g.v : g.u,
      line: { color: s >= 0 ? segmentColour(s) : NEUTRAL, width: 1.6 },
      name: s >= 0 ? `${s + 1}` : 'joins across segments',
      hoverinfo: 'skip',
      showlegend: s >= 0,
    });
  }
  // Invisible points on the leaves carry the hover text (every leaf named, even thinned ones).
  const idx = leafNames.map((_, i) => i);
  const leafOrder = leafNames.map(plotText);
  data.push({
    type: 'scatter',
    mode: 'markers',
    x: upright ? idx : idx.map(() => 0),
    y: upright ? idx.map(() => 0) : idx,
    marker: { size: 6, color: 'rgba(0,0,0,0)' },
    text: leafOrder,
    hovertemplate: '%{text}<extra></extra>',
    showlegend: false,
  });
  const leafAxis = axisStyle('', {
    tickmode: 'array',
    tickvals: idx.filter((i) => shown[i] !== ''),
    ticktext: shown.filter((s) => s !== '').map((s) => plotText(s.length > 24 ? s.slice(0, 23) + '…' : s)),
    showgrid: false,
    zeroline: false,
    range: [-0.5, leafNames.length - 0.5],
    tickfont: { size: 10.5, color: INK.text },
  });
  const heightAxis = axisStyle('height (dissimilarity at which groups join)', { range: upright ? [0, maxHeight * 1.04] : [maxHeight * 1.04, 0], zeroline: false });
  const shapes =
    cutHeight === undefined
      ? []
      : [
          upright
            ? { type: 'line', xref: 'paper', x0: 0, x1: 1, y0: cutHeight, y1: cutHeight, line: { color: INK.accent, width: 1.4, dash: 'dash' } }
            : { type: 'line', yref: 'paper', y0: 0, y1: 1, x0: cutHeight, x1: cutHeight, line: { color: INK.accent, width: 1.4, dash: 'dash' } },
        ];
  const layout = baseLayout(upright ? 480 : leafAxisPx + 110, {
    xaxis: upright ? { ...leafAxis, tickangle: -60 } : heightAxis,
    yaxis: upright ? heightAxis : { ...leafAxis, range: [leafNames.length - 0.5, -0.5] },
    shapes,
    annotations: badges.map((b) => ({
      x: upright ? b.u : b.v,
      y: upright ? b.v : b.u,
      text: `<b>${b.segment + 1}</b>`,
      showarrow: false,
      bgcolor: segmentColour(b.segment),
      bordercolor: '#ffffff',
      borderpad: 3,
      font: { color: textOn(segmentColour(b.segment)), size: 11 },
    })),
    showlegend: k > 0,
    legend: { orientation: 'h', y: 1, yanchor: 'bottom', x: 1, xanchor: 'right', title: { text: 'segment' } },
    margin: { l: 64, r: 24, t: 40, b: 56 },
    hovermode: 'closest',
  });
  return { data, layout };
}
