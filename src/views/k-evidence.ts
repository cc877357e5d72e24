// Evidence for k: one small panel per criterion against k, the recommended k marked in every
// panel, and the reasons listed beneath in words.
import { checkOptions } from '../core/options';
import { escapeHtml } from './escape';
import { axisStyle, baseLayout, kindOf, refuse } from './common';
import { INK } from './palette';
import { extent, frame, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface KComparisonLike {
  readonly table: readonly {
    k: number;
    withinSS?: number;
    silhouette?: number;
    calinskiHarabasz?: number;
    daviesBouldin?: number;
    gap?: number;
    gapSE?: number;
  }[];
  readonly recommended?: number;
  readonly reasons?: readonly string[];
  readonly byCriterion?: { readonly [C in 'silhouette' | 'calinskiHarabasz' | 'daviesBouldin' | 'gap' | 'knee']?: number };
}

type Criterion = 'withinSS' | 'silhouette' | 'calinskiHarabasz' | 'daviesBouldin' | 'gap';

const PANELS: { key: Criterion; label: string; better: string; colour: string }[] = [
  { key: 'withinSS', label: 'within-segment sum of squares', better: 'look for the bend', colour: '#1a6699' },
  { key: 'silhouette', label: 'average silhouette', better: 'higher is better', colour: '#1a8066' },
  { key: 'calinskiHarabasz', label: 'Calinski–Harabasz', better: 'higher is better', colour: '#8080e6' },
  { key: 'daviesBouldin', label: 'Davies–Bouldin', better: 'lower is better', colour: '#99331a' },
  { key: 'gap', label: 'gap statistic (± 1 SE)', better: 'first k within 1 SE of the next', colour: '#e6801a' },
];

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

export function kEvidenceView(comparison: KComparisonLike, options: { title?: string } = {}): View {
  const where = 'kEvidenceView';
  const opts = checkOptions(options, ['title'], where);
  if (!comparison || !Array.isArray(comparison.table) || comparison.table.length === 0) {
    refuse(where, `needs the result of a k comparison (a table with one row per k), but got ${kindOf(comparison)}.`);
  }
  const rows = [...comparison.table].sort((a, b) => a.k - b.k);
  const ks = rows.map((r) => r.k);
  const panels = PANELS.filter((p) => rows.some((r) => finite(r[p.key])));
  const rec = comparison.recommended;
  const title = opts.title ?? (rec ? `Evidence for the number of segments: k = ${rec} recommended` : 'Evidence for the number of segments');
  const caption =
    'Each panel scores the segmentations for every k by one criterion; the red band marks the recommended k. ' +
    'Criteria often disagree: read them together, with what the segments mean.';

  // Static stand-in: panels in a grid, three across.
  const across = Math.min(3, panels.length);
  const down = Math.ceil(panels.length / across);
  const pw = 300;
  const ph = 236;
  const body: string[] = [];
  panels.forEach((panel, i) => {
    const ox = (i % across) * pw;
    const oy = Math.floor(i / across) * ph;
    const values = rows.map((r) => r[panel.key]);
    const lows = panel.key === 'gap' ? rows.map((r) => (finite(r.gap) ? r.gap - (r.gapSE ?? 0) : NaN)) : [];
    const highs = panel.key === 'gap' ? rows.map((r) => (finite(r.gap) ? r.gap + (r.gapSE ?? 0) : NaN)) : [];
    const f = frame({
      width: pw,
      height: ph,
      margin: { left: 58, right: 12, top: 38, bottom: 40 },
      x: { domain: [ks[0] - 0.4, ks[ks.length - 1] + 0.4], title: 'k (number of segments)', ticks: ks },
      y: { domain: extent([...(values.filter(finite) as number[]), ...lows, ...highs], 0.1), title: '' },
    });
    const g: string[] = [svgEl.text(`${panel.label}`, { x: 58, y: 14, 'font-size': 12, 'font-weight': 650, fill: INK.text })];
    const pick = comparison.byCriterion?.[panel.key === 'withinSS' ? 'knee' : panel.key];
    g.push(svgEl.text(panel.better, { x: 58, y: 28, 'font-size': 10.5, fill: INK.muted }));
    if (finite(pick)) g.push(svgEl.text(`suggests k = ${pick}`, { x: pw - 12, y: 28, 'font-size': 10.5, fill: INK.accent, 'text-anchor': 'end' }));
    g.push(...f.under);
    if (rec !== undefined) {
      g.push(svgEl.rect({ x: f.x(rec - 0.3), y: f.top, width: f.x(rec + 0.3) - f.x(rec - 0.3), height: f.bottom - f.top, fill: INK.accent, 'fill-opacity': 0.12 }));
    }
    if (panel.key === 'gap') {
      rows.forEach((r, j) => {
        if (finite(lows[j]) && finite(highs[j])) g.push(svgEl.line({ x1: f.x(r.k), x2: f.x(r.k), y1: f.y(lows[j]), y2: f.y(highs[j]), stroke: panel.colour, 'stroke-width': 1.2 }));
      });
    }
    const pts = rows.flatMap((r) => (finite(r[panel.key]) ? [[f.x(r.k), f.y(r[panel.key] as number)] as [number, number]] : []));
    g.push(svgEl.path(pathData(pts), { fill: 'none', stroke: panel.colour, 'stroke-width': 2 }));
    pts.forEach(([px, py]) => g.push(svgEl.circle({ cx: px, cy: py, r: 3.4, fill: panel.colour })));
    body.push(svgEl.group(g, { transform: `translate(${ox} ${oy})` }));
  });
  const still = svgDocument(across * pw, down * ph, title, body);

  // Live chart: the same panels as plotly subplots.
  const data: object[] = [];
  const layout = <Record<string, unknown>>baseLayout(Math.max(320, down * 290), {
    showlegend: false,
    margin: { l: 56, r: 16, t: 44, b: 48 },
    hovermode: 'closest',
  });
  const shapes: object[] = [];
  const annotations: object[] = [];
  const gapX = 0.08;
  const gapY = 0.28;
  panels.forEach((panel, i) => {
    const col = i % across;
    const row = Math.floor(i / across);
    const w = (1 - gapX * (across - 1)) / across;
    const h = (1 - gapY * (down - 1)) / down;
    const x0 = col * (w + gapX);
    const y1 = 1 - row * (h + gapY);
    const suffix = i === 0 ? '' : String(i + 1);
    layout[`xaxis${suffix}`] = axisStyle('k', { domain: [x0, x0 + w], anchor: `y${suffix}`, tickmode: 'array', tickvals: ks });
    layout[`yaxis${suffix}`] = axisStyle('', { domain: [y1 - h, y1], anchor: `x${suffix}` });
    data.push({
      type: 'scatter',
      mode: 'lines+markers',
      x: ks,
      y: rows.map((r) => (finite(r[panel.key]) ? r[panel.key] : null)),
      xaxis: `x${suffix}`,
      yaxis: `y${suffix}`,
      line: { color: panel.colour, width: 2 },
      marker: { size: 7, color: panel.colour },
      error_y: panel.key === 'gap' ? { type: 'data', array: rows.map((r) => r.gapSE ?? 0), visible: true, color: panel.colour } : undefined,
      hovertemplate: `k = %{x}<br>${escapeHtml(panel.label)}: %{y:.4g}<extra></extra>`,
    });
    const pick = comparison.byCriterion?.[panel.key === 'withinSS' ? 'knee' : panel.key];
    annotations.push({ text: `<b>${escapeHtml(panel.label)}</b><br><span style="color:${INK.muted}">${escapeHtml(panel.better)}</span>${finite(pick) ? ` · <span style="color:${INK.accent}">suggests k = ${pick}</span>` : ''}`, align: 'left', xref: 'paper', yref: 'paper', x: x0, y: y1 + 0.02, xanchor: 'left', yanchor: 'bottom', showarrow: false, font: { size: 11.5 } });
    if (rec !== undefined) {
      shapes.push({ type: 'rect', xref: `x${suffix}`, yref: `y${suffix} domain`, x0: rec - 0.3, x1: rec + 0.3, y0: 0, y1: 1, fillcolor: INK.accent, opacity: 0.12, line: { width: 0 } });
    }
  });
  layout.shapes = shapes;
  layout.annotations = annotations;
  const reasons = (comparison.reasons ?? []).map(String);
  const table =
    `<table class="ks-table"><thead><tr><th>k</th>${panels.map((p) => `<th>${escapeHtml(p.label)}</th>`).join('')}</tr></thead><tbody>` +
    rows
      .map(
        (r) =>
          `<tr${r.k === rec ? ' style="font-weight:700;background:#fbecef"' : ''}><td style="white-space:nowrap">${r.k}${r.k === rec ? ' · recommended' : ''}</td>` +
          panels.map((p) => `<td>${finite(r[p.key]) ? Number((r[p.key] as number).toPrecision(4)) : '—'}</td>`).join('') +
          '</tr>',
      )
      .join('') +
    '</tbody></table>';
  return makeView({ kind: 'k-evidence', title, caption, still, plot: { data, layout }, notes: reasons, after: table });
}
