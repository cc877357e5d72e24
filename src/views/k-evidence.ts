// Evidence for k: one small panel per criterion against k, in the order the recommendation rule
// reads them. Every panel draws its values in the same neutral ink; a ring marks the k that
// panel picks by itself, and one shaded column, the same in every panel, marks the recommended
// k. The stability panel shows each segment's Jaccard as a dot, so the spread is visible, with
// the weakest segment joined by the line and the stable line at 0.75 drawn across.
import { checkOptions } from '../core/options';
import { escapeHtml } from './escape';
import { axisStyle, baseLayout, kindOf, refuse } from './common';
import { KComparisonLike, KEvidenceRow, PANELS, PanelSpec, panelRows, panelSlot } from './k-evidence-panels';
import { INK } from './palette';
import { extent, frame, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export type { KComparisonLike } from './k-evidence-panels';

/** The one colour every criterion is drawn in (a slate of our own); the accent is kept for the recommendation. */
const DATA_INK = '#3b5168';
const SEGMENT_DOT = '#8fa3b8';
const STABLE_LINE = 0.75; // common practice, as in assess/stability.ts

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const valueOf = (r: KEvidenceRow, p: PanelSpec) => r[p.key];

export function kEvidenceView(comparison: KComparisonLike, options: { title?: string } = {}): View {
  const where = 'kEvidenceView';
  const opts = checkOptions(options, ['title'], where);
  if (!comparison || !Array.isArray(comparison.table) || comparison.table.length === 0) {
    refuse(where, `needs the result of a k comparison (a table with one row per k), but got ${kindOf(comparison)}.`);
  }
  const rows = [...comparison.table].sort((a, b) => a.k - b.k);
  const ks = rows.map((r) => r.k);
  const panels = PANELS.filter((p) => rows.some((r) => finite(valueOf(r, p))));
  const rec = comparison.recommended;
  const recShown = rec !== undefined && ks.includes(rec) ? rec : undefined;
  const title =
    opts.title ??
    comparison.headline ??
    (rec !== undefined ? `Evidence for the number of segments: k = ${rec} recommended` : 'Evidence for the number of segments');
  const caption =
    (recShown !== undefined
      ? `The shaded column in every panel is the recommended k = ${recShown}; `
      : comparison.noStructure
        ? 'No k is shaded: the rows show no clustering structure; '
        : '') +
    'a ring marks the k each criterion picks by itself. Panels follow the rule: stability, the gap statistic and the within-SS bend first.';
  const pickOf = (p: PanelSpec) => comparison.byCriterion?.[p.pickedBy];
  const grid = panelRows(panels.length);

  // Static stand-in.
  const width = 900;
  const ph = 214;
  const body: string[] = [];
  panels.forEach((panel, i) => {
    const slot = panelSlot(grid, i);
    const pw = width / slot.across;
    body.push(
      svgEl.group(stillPanel(panel, rows, pw, ph, pickOf(panel), recShown), { transform: `translate(${slot.col * pw} ${slot.row * ph})` }),
    );
  });
  const still = svgDocument(width, grid.length * ph, title, body);

  // Live chart: the same panels as plotly subplots.
  const { data, layout } = livePanels(panels, rows, ks, grid, pickOf, recShown);
  const reasons = (comparison.reasons ?? []).map(String);
  return makeView({
    kind: 'k-evidence',
    title,
    caption,
    still,
    plot: { data, layout },
    notes: reasons,
    after: evidenceTable(rows, panels, rec),
  });
}

function panelDomain(panel: PanelSpec, rows: readonly KEvidenceRow[]): [number, number] {
  const values: number[] = [];
  for (const r of rows) {
    const v = valueOf(r, panel);
    if (!finite(v)) continue;
    values.push(v);
    if (panel.key === 'gap' && finite(r.gapSE)) values.push(v - r.gapSE, v + r.gapSE);
    if (panel.key === 'weakestStability') values.push(...(r.stabilityBySegment ?? []).filter(finite));
  }
  if (panel.key === 'weakestStability') return [Math.min(0.4, ...values) - 0.03, 1.03];
  return extent(values, 0.12);
}

function stillPanel(
  panel: PanelSpec,
  rows: readonly KEvidenceRow[],
  pw: number,
  ph: number,
  pick: number | undefined,
  rec: number | undefined,
): string[] {
  const ks = rows.map((r) => r.k);
  const f = frame({
    width: pw,
    height: ph,
    margin: { left: 50, right: 14, top: 42, bottom: 34 },
    x: { domain: [ks[0] - 0.5, ks[ks.length - 1] + 0.5], title: '', ticks: ks },
    y: { domain: panelDomain(panel, rows), title: '' },
  });
  const g: string[] = [];
  g.push(svgEl.text(panel.title, { x: f.left, y: 15, 'font-size': 12.5, 'font-weight': 650, fill: INK.text }));
  g.push(svgEl.text(panel.reads, { x: f.left, y: 30, 'font-size': 10.5, fill: INK.muted }));
  g.push(
    svgEl.text(finite(pick) ? `◯ k = ${pick}` : 'no clear pick', {
      x: f.right,
      y: 15,
      'font-size': 11,
      fill: INK.text,
      'text-anchor': 'end',
    }),
  );
  g.push(...f.under);
  g.push(svgEl.text('k', { x: f.right + 3, y: f.bottom + 15, 'font-size': 11, 'font-style': 'italic', fill: INK.muted }));
  if (rec !== undefined) {
    g.push(
      svgEl.rect({
        x: f.x(rec - 0.42),
        y: f.top,
        width: f.x(rec + 0.42) - f.x(rec - 0.42),
        height: f.bottom - f.top,
        fill: INK.accent,
        'fill-opacity': 0.1,
      }),
    );
    g.push(svgEl.line({ x1: f.x(rec - 0.42), x2: f.x(rec + 0.42), y1: f.top, y2: f.top, stroke: INK.accent, 'stroke-width': 3 }));
  }
  if (panel.key === 'weakestStability') {
    const yLine = f.y(STABLE_LINE);
    g.push(svgEl.line({ x1: f.left, x2: f.right, y1: yLine, y2: yLine, stroke: INK.muted, 'stroke-dasharray': '2 3' }));
    g.push(svgEl.text(`stable ≥ ${STABLE_LINE}`, { x: f.left + 4, y: yLine - 4, 'font-size': 10, fill: INK.muted }));
    for (const r of rows) {
      const each = (r.stabilityBySegment ?? []).filter(finite);
      if (each.length < 2) continue;
      g.push(
        svgEl.line({
          x1: f.x(r.k),
          x2: f.x(r.k),
          y1: f.y(Math.min(...each)),
          y2: f.y(Math.max(...each)),
          stroke: SEGMENT_DOT,
          'stroke-width': 1,
        }),
      );
      each.forEach((v, s) =>
        g.push(
          svgEl.group(
            [svgEl.circle({ cx: f.x(r.k) + 5, cy: f.y(v), r: 2.2, fill: SEGMENT_DOT })],
            {},
            `k = ${r.k}, segment ${s + 1}: Jaccard ${v.toFixed(2)}`,
          ),
        ),
      );
    }
  }
  if (panel.key === 'gap') {
    for (const r of rows) {
      if (finite(r.gap) && finite(r.gapSE))
        g.push(
          svgEl.line({
            x1: f.x(r.k),
            x2: f.x(r.k),
            y1: f.y(r.gap - r.gapSE),
            y2: f.y(r.gap + r.gapSE),
            stroke: DATA_INK,
            'stroke-width': 1.2,
          }),
        );
    }
  }
  const pts = rows.flatMap((r) => {
    const v = valueOf(r, panel);
    return finite(v) ? [[f.x(r.k), f.y(v), r.k] as const] : [];
  });
  g.push(svgEl.path(pathData(pts.map(([x, y]) => [x, y] as [number, number])), { fill: 'none', stroke: DATA_INK, 'stroke-width': 1.8 }));
  for (const [x, y, k] of pts) {
    g.push(svgEl.circle({ cx: x, cy: y, r: 3.2, fill: DATA_INK }));
    if (k === pick) g.push(svgEl.circle({ cx: x, cy: y, r: 7.5, fill: 'none', stroke: INK.text, 'stroke-width': 1.6 }));
  }
  return g;
}

function livePanels(
  panels: readonly PanelSpec[],
  rows: readonly KEvidenceRow[],
  ks: readonly number[],
  grid: readonly number[],
  pickOf: (p: PanelSpec) => number | undefined,
  rec: number | undefined,
): { data: object[]; layout: object } {
  const data: object[] = [];
  const layout = <Record<string, unknown>>baseLayout(grid.length * 250 + 20, {
    showlegend: false,
    margin: { l: 50, r: 20, t: 50, b: 36 },
    hovermode: 'closest',
  });
  const shapes: object[] = [];
  const annotations: object[] = [];
  const gapX = 0.07;
  const gapY = 0.2;
  const h = (1 - gapY * (grid.length - 1)) / grid.length;
  panels.forEach((panel, i) => {
    const { row, col, across } = panelSlot(grid, i);
    const w = (1 - gapX * (across - 1)) / across;
    const x0 = col * (w + gapX);
    const y1 = 1 - row * (h + gapY);
    const suffix = i === 0 ? '' : String(i + 1);
    layout[`xaxis${suffix}`] = axisStyle('', {
      domain: [x0, x0 + w],
      anchor: `y${suffix}`,
      tickmode: 'array',
      tickvals: ks,
      range: [ks[0] - 0.5, ks[ks.length - 1] + 0.5],
      ticksuffix: ' ',
    });
    layout[`yaxis${suffix}`] = axisStyle('', { domain: [y1 - h, y1], anchor: `x${suffix}`, range: panelDomain(panel, rows) });
    const axes = { xaxis: `x${suffix}`, yaxis: `y${suffix}` };
    const pick = pickOf(panel);
    if (panel.key === 'weakestStability') {
      const xs: number[] = [];
      const ys: number[] = [];
      const text: string[] = [];
      for (const r of rows) {
        (r.stabilityBySegment ?? []).forEach((v, s) => {
          if (!finite(v)) return;
          xs.push(r.k + 0.12);
          ys.push(v);
          text.push(`segment ${s + 1}`);
        });
      }
      data.push({
        type: 'scatter',
        mode: 'markers',
        x: xs,
        y: ys,
        text,
        ...axes,
        marker: { size: 5, color: SEGMENT_DOT },
        hovertemplate: 'k = %{x:.0f}, %{text}<br>Jaccard %{y:.2f}<extra></extra>',
      });
      shapes.push({
        type: 'line',
        xref: `x${suffix} domain`,
        yref: `y${suffix}`,
        x0: 0,
        x1: 1,
        y0: STABLE_LINE,
        y1: STABLE_LINE,
        line: { color: INK.muted, width: 1, dash: 'dot' },
      });
    }
    data.push({
      type: 'scatter',
      mode: 'lines+markers',
      x: ks,
      y: rows.map((r) => (finite(valueOf(r, panel)) ? valueOf(r, panel) : null)),
      ...axes,
      line: { color: DATA_INK, width: 2 },
      marker: { size: 7, color: DATA_INK },
      error_y:
        panel.key === 'gap' ? { type: 'data', array: rows.map((r) => r.gapSE ?? 0), visible: true, color: DATA_INK, width: 0 } : undefined,
      hovertemplate: `k = %{x}<br>${escapeHtml(panel.title)}: %{y:.4g}<extra></extra>`,
    });
    const at = rows.find((r) => r.k === pick);
    if (finite(pick) && at && finite(valueOf(at, panel))) {
      data.push({
        type: 'scatter',
        mode: 'markers',
        x: [pick],
        y: [valueOf(at, panel)],
        ...axes,
        marker: { size: 17, symbol: 'circle-open', color: INK.text, line: { width: 1.8 } },
        hoverinfo: 'skip',
      });
    }
    const pickText = finite(pick) ? `◯ k = ${pick}` : 'no clear pick';
    annotations.push({
      text: `<b>${escapeHtml(panel.title)}</b>  ${escapeHtml(pickText)}<br><span style="color:${INK.muted};font-size:10.5px">${escapeHtml(panel.reads)}</span>`,
      align: 'left',
      xref: 'paper',
      yref: 'paper',
      x: x0,
      y: y1 + 0.012,
      xanchor: 'left',
      yanchor: 'bottom',
      showarrow: false,
      font: { size: 12 },
    });
    if (panel.key === 'weakestStability') {
      annotations.push({
        text: `stable ≥ ${STABLE_LINE}`,
        xref: `x${suffix} domain`,
        yref: `y${suffix}`,
        x: 0.01,
        y: STABLE_LINE,
        xanchor: 'left',
        yanchor: 'bottom',
        showarrow: false,
        font: { size: 10, color: INK.muted },
      });
    }
    annotations.push({
      text: '<i>k</i>',
      xref: `x${suffix} domain`,
      yref: `y${suffix} domain`,
      x: 1.02,
      y: -0.02,
      xanchor: 'left',
      yanchor: 'top',
      showarrow: false,
      font: { size: 11, color: INK.muted },
    });
    if (rec !== undefined) {
      shapes.push({
        type: 'rect',
        xref: `x${suffix}`,
        yref: `y${suffix} domain`,
        x0: rec - 0.42,
        x1: rec + 0.42,
        y0: 0,
        y1: 1,
        fillcolor: INK.accent,
        opacity: 0.1,
        line: { width: 0 },
        layer: 'below',
      });
      shapes.push({
        type: 'line',
        xref: `x${suffix}`,
        yref: `y${suffix} domain`,
        x0: rec - 0.42,
        x1: rec + 0.42,
        y0: 1,
        y1: 1,
        line: { color: INK.accent, width: 3 },
      });
    }
  });
  layout.shapes = shapes;
  layout.annotations = annotations;
  return { data, layout };
}

function evidenceTable(rows: readonly KEvidenceRow[], panels: readonly PanelSpec[], rec: number | undefined): string {
  const cell = (v: unknown) => `<td>${finite(v) ? Number(v.toPrecision(4)) : '—'}</td>`;
  const withMean = panels.some((p) => p.key === 'weakestStability');
  const withStrength = rows.some((r) => finite(r.predictionStrength));
  const head =
    `<tr><th>k</th>` +
    panels.map((p) => `<th>${escapeHtml(p.column)}</th>`).join('') +
    (withMean ? '<th>mean Jaccard</th>' : '') +
    (withStrength ? '<th>prediction strength</th>' : '') +
    '</tr>';
  const body = rows
    .map(
      (r) =>
        `<tr${r.k === rec ? ' class="ks-chosen" style="font-weight:700;background:#fbecef"' : ''}><td style="white-space:nowrap">${r.k}${r.k === rec ? ' ◂' : ''}</td>` +
        panels.map((p) => cell(valueOf(r, p))).join('') +
        (withMean ? cell(r.stability) : '') +
        (withStrength ? cell(r.predictionStrength) : '') +
        '</tr>',
    )
    .join('');
  // Scrolls sideways rather than being cut when the notebook is narrower than the table.
  const note = rec === undefined ? '' : `<p style="font-size:12px;margin:4px 0 0">◂ and shading: the recommended k.</p>`;
  return `<div style="overflow-x:auto"><table class="ks-table"><thead>${head}</thead><tbody>${body}</tbody></table></div>${note}`;
}
