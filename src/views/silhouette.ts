// Silhouettes: one bar per row, grouped by segment and sorted within it, with the overall
// average marked. Bars left of zero are rows closer to another segment than to their own.
import { compactLabels } from '../core/assignment';
import { checkOptions } from '../core/options';
import { axisStyle, baseLayout, kindOf, namesFrom, plotText, refuse, shortName } from './common';
import { INK, segmentColour, textOn } from './palette';
import { frame, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface SilhouetteLike {
  readonly values: ArrayLike<number>;
  readonly average: number;
  readonly bySegment?: readonly number[];
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
  const { labels, k, sizes } = compactLabels(assignment, n, where, 'the silhouette values');
  const names = namesFrom(k, opts.names);
  // Rows ordered: segment 1 first, within a segment highest silhouette first.
  const order = Array.from({ length: n }, (_, i) => i).sort(
    (a, b) => labels[a] - labels[b] || silhouette.values[b] - silhouette.values[a] || a - b,
  );
  const gap = Math.max(1, Math.round(n / 60));
  const slot = new Float64Array(n);
  let y = 0;
  order.forEach((row, i) => {
    if (i > 0 && labels[row] !== labels[order[i - 1]]) y += gap;
    slot[i] = y++;
  });
  const span = y;
  const avg = silhouette.average;
  const segAvg = Array.from({ length: k }, (_, s) => {
    if (silhouette.bySegment?.[s] !== undefined) return silhouette.bySegment[s];
    let t = 0;
    for (let i = 0; i < n; i++) if (labels[i] === s) t += silhouette.values[i];
    return t / sizes[s];
  });
  const title = opts.title ?? `Silhouettes: average ${avg.toFixed(2)}`;
  const caption =
    'Each bar is one row: near 1 it sits well inside its segment, near 0 it lies between two, below 0 it is closer to another segment. ' +
    'The dashed line is the average over all rows.';
  const lo = Math.min(-0.1, ...Array.from(silhouette.values));
  const width = 820;
  const height = Math.min(900, Math.max(320, span * 2 + 80));
  const f = frame({
    width,
    height,
    margin: { left: 150, right: 24, top: 26, bottom: 48 },
    x: { domain: [Math.max(-1, Math.floor(lo * 10) / 10), 1], title: 'silhouette width' },
    y: { domain: [-0.5, span - 0.5], title: '', ticks: [], tickLabels: [], reversed: true },
  });
  const body = [...f.under];
  for (let s = 0; s < k; s++) {
    const rows = order.map((r, i) => [r, i] as const).filter(([r]) => labels[r] === s);
    const first = slot[rows[0][1]];
    const last = slot[rows[rows.length - 1][1]];
    const pts: [number, number][] = [[f.x(0), f.y(first - 0.5)]];
    for (const [r, i] of rows) {
      pts.push([f.x(silhouette.values[r]), f.y(slot[i] - 0.5)]);
      pts.push([f.x(silhouette.values[r]), f.y(slot[i] + 0.5)]);
    }
    pts.push([f.x(0), f.y(last + 0.5)]);
    body.push(svgEl.path(pathData(pts, true), { fill: segmentColour(s), 'fill-opacity': 0.9 }));
    const mid = f.y((first + last) / 2);
    const colour = segmentColour(s);
    body.push(svgEl.rect({ x: 10, y: mid - 10, width: 22, height: 18, rx: 3, fill: colour }));
    body.push(svgEl.text(String(s + 1), { x: 21, y: mid + 3.5, 'text-anchor': 'middle', 'font-size': 11, 'font-weight': 700, fill: textOn(colour) }));
    body.push(svgEl.text(`${names[s] ? shortName(names[s]!, 14) + ' · ' : ''}${sizes[s]} rows`, { x: 38, y: mid - 1, 'font-size': 11, fill: INK.text }));
    body.push(svgEl.text(`avg ${segAvg[s].toFixed(2)}`, { x: 38, y: mid + 12, 'font-size': 10.5, fill: INK.muted }));
  }
  body.push(svgEl.line({ x1: f.x(avg), x2: f.x(avg), y1: f.top, y2: f.bottom, stroke: INK.accent, 'stroke-width': 1.5, 'stroke-dasharray': '6 4' }));
  body.push(svgEl.text(`average ${avg.toFixed(2)}`, { x: f.x(avg), y: f.top - 6, 'text-anchor': 'middle', 'font-size': 11, fill: INK.accent }));
  const still = svgDocument(width, height, title, body);

  const data: object[] = [];
  const segmentNotes: object[] = [];
  for (let s = 0; s < k; s++) {
    const rows = order.map((r, i) => [r, i] as const).filter(([r]) => labels[r] === s);
    const mid = (slot[rows[0][1]] + slot[rows[rows.length - 1][1]]) / 2;
    segmentNotes.push({
      xref: 'paper',
      x: 0,
      xanchor: 'right',
      y: mid,
      showarrow: false,
      align: 'right',
      text: `<b>${s + 1}</b>${names[s] ? ' · ' + plotText(shortName(names[s]!, 18)) : ''}<br>${sizes[s]} rows · avg ${segAvg[s].toFixed(2)}`,
      font: { size: 11, color: INK.text },
      bgcolor: '#ffffff',
      bordercolor: segmentColour(s),
      borderwidth: 2,
      borderpad: 3,
    });
    data.push({
      type: 'bar',
      orientation: 'h',
      name: names[s] ? `${s + 1} · ${names[s]}` : `${s + 1}`,
      y: rows.map(([, i]) => slot[i]),
      x: rows.map(([r]) => silhouette.values[r]),
      text: rows.map(([r]) => plotText(opts.ids?.[r] ?? `row ${r + 1}`)),
      marker: { color: segmentColour(s), line: { width: 0 } },
      hovertemplate: `%{text}<br>segment ${s + 1}: %{x:.3f}<extra></extra>`,
      textposition: 'none',
    });
  }
  const layout = baseLayout(height, {
    bargap: 0,
    barmode: 'overlay',
    xaxis: axisStyle('silhouette width', { range: [Math.max(-1, Math.floor(lo * 10) / 10), 1] }),
    yaxis: axisStyle('', { range: [span - 0.5, -0.5], showticklabels: false, showgrid: false, zeroline: false }),
    shapes: [{ type: 'line', x0: avg, x1: avg, yref: 'paper', y0: 0, y1: 1, line: { color: INK.accent, dash: 'dash', width: 1.5 } }],
    annotations: [{ x: avg, yref: 'paper', y: 1, text: `average ${avg.toFixed(2)}`, showarrow: false, xanchor: 'center', yanchor: 'bottom', font: { color: INK.accent, size: 11 } }, ...segmentNotes],
    margin: { l: 150, r: 24, t: 28, b: 56 },
    showlegend: false,
  });
  return makeView({ kind: 'silhouette', title, caption, still, plot: { data, layout } });
}
