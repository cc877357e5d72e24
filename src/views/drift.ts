// Newly scored rows against the training rows: segment shares side by side, far rows, the shift of
// each feature (population stability index) and the columns that needed unseen levels or filled
// values. Plain HTML and SVG only, so it reads the same with scripts off.
import type { DriftReport } from '../segments/drift';
import { escapeHtml } from './escape';
import { htmlSwatch, kindOf, refuse, shortName } from './common';
import { INK, segmentColour } from './palette';
import { svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

const pct = (v: number | null, digits = 1): string => (v === null || !Number.isFinite(v) ? '—' : `${(v * 100).toFixed(digits)} %`);

/** Per segment: the training share as an outlined bar, the new share as a filled bar below it. */
function shareBars(report: DriftReport): string {
  const width = 700;
  const rowH = 40;
  const labelW = 220;
  const numW = 150;
  const max = Math.max(0.05, ...report.segments.flatMap((s) => [s.trainingShare, s.newShare]));
  const scale = (v: number) => (v / max) * (width - labelW - numW);
  const body: string[] = [];
  report.segments.forEach((s, i) => {
    const y = 8 + i * rowH;
    const colour = segmentColour(s.segment - 1);
    const name = s.title ? `${s.segment} · ${shortName(s.title, 28)}` : `Segment ${s.segment}`;
    const change = (s.newShare - s.trainingShare) * 100;
    body.push(
      svgEl.group(
        [
          svgEl.text(name, { x: labelW - 8, y: y + 17, 'text-anchor': 'end', 'font-size': 12, fill: INK.text }),
          svgEl.rect({
            x: labelW,
            y,
            width: Math.max(1, scale(s.trainingShare)),
            height: 11,
            fill: '#ffffff',
            stroke: colour,
            'stroke-width': 1.5,
          }),
          svgEl.rect({ x: labelW, y: y + 14, width: Math.max(1, scale(s.newShare)), height: 11, fill: colour }),
          svgEl.text(`${pct(s.trainingShare)} → ${pct(s.newShare)}`, { x: width - numW + 8, y: y + 12, 'font-size': 11.5, fill: INK.text }),
          svgEl.text(`${change >= 0 ? '+' : '−'}${Math.abs(change).toFixed(1)} points`, {
            x: width - numW + 8,
            y: y + 26,
            'font-size': 10.5,
            fill: INK.muted,
          }),
        ],
        {},
        `${name}: ${pct(s.trainingShare)} of training rows, ${pct(s.newShare)} of new rows (${s.newRows})`,
      ),
    );
  });
  const h = 8 + report.segments.length * rowH + 18;
  body.push(svgEl.rect({ x: labelW, y: h - 14, width: 14, height: 9, fill: '#ffffff', stroke: INK.axis, 'stroke-width': 1.5 }));
  body.push(svgEl.text('training rows', { x: labelW + 19, y: h - 6, 'font-size': 10.5, fill: INK.muted }));
  body.push(svgEl.rect({ x: labelW + 110, y: h - 14, width: 14, height: 9, fill: INK.axis }));
  body.push(svgEl.text('new rows', { x: labelW + 129, y: h - 6, 'font-size': 10.5, fill: INK.muted }));
  return svgDocument(width, h, 'Segment shares: training rows and new rows', body);
}

/** One bar per feature, largest shift first, with the common-practice reading thresholds drawn in. */
function stabilityBars(report: DriftReport): string {
  const rows = [...report.features].sort((a, b) => b.stabilityIndex - a.stabilityIndex);
  const width = 700;
  const rowH = 20;
  const labelW = 190;
  const numW = 120;
  const top = 22;
  const thresholds = report.readings.filter((r) => Number.isFinite(r.below)).map((r) => r.below);
  const max = Math.max(0.3, ...rows.map((r) => r.stabilityIndex));
  const x = (v: number) => labelW + (Math.min(v, max) / max) * (width - labelW - numW);
  const body: string[] = [];
  const h = top + rows.length * rowH + 8;
  thresholds.forEach((t) => {
    body.push(svgEl.line({ x1: x(t), x2: x(t), y1: top - 4, y2: h - 4, stroke: INK.axis, 'stroke-dasharray': '2 3' }));
    body.push(svgEl.text(String(t), { x: x(t), y: top - 8, 'text-anchor': 'middle', 'font-size': 10, fill: INK.muted }));
  });
  rows.forEach((r, i) => {
    const y = top + i * rowH;
    const ink = r.reading === 'little change' ? INK.axis : r.reading === 'some change' ? '#c98a2e' : INK.accent;
    body.push(
      svgEl.group(
        [
          svgEl.text(shortName(r.feature, 30), { x: labelW - 8, y: y + 12, 'text-anchor': 'end', 'font-size': 11.5, fill: INK.text }),
          svgEl.rect({ x: labelW, y: y + 3, width: Math.max(1, x(r.stabilityIndex) - labelW), height: rowH - 7, rx: 2, fill: ink }),
          svgEl.text(`${r.stabilityIndex.toFixed(3)} · ${r.reading}`, { x: width - numW + 8, y: y + 12, 'font-size': 11, fill: INK.text }),
        ],
        {},
        `${r.feature}: stability index ${r.stabilityIndex.toFixed(4)} (${r.reading})`,
      ),
    );
  });
  return svgDocument(width, h, 'Shift of each feature (population stability index)', body);
}

function columnsTable(report: DriftReport): string {
  if (report.columns.length === 0) return '<p class="ks-fact">No column needed an unseen level or a filled value.</p>';
  const rows = report.columns
    .map((c) => {
      const unseen = c.unseenLevels.length
        ? c.unseenLevels
            .slice(0, 6)
            .map((u) => `${escapeHtml(u.level)} (${u.rows})`)
            .join(', ') + (c.unseenLevels.length > 6 ? `, ${c.unseenLevels.length - 6} more` : '')
        : '—';
      const filled = c.filled ? `${c.filled.rows} with ${escapeHtml(c.filled.value)}` : '—';
      return `<tr><td>${escapeHtml(c.column)}</td><td style="text-align:left">${unseen}</td><td>${filled}</td></tr>`;
    })
    .join('');
  return `<table class="ks-table"><thead><tr><th>column</th><th style="text-align:left">levels never seen in training (rows)</th><th>missing values filled</th></tr></thead><tbody>${rows}</tbody></table>`;
}

export function driftView(report: DriftReport, options: { title?: string } = {}): View {
  if (!report || report.kind !== 'drift') refuse('driftView', `needs the figures from outcome.drift(), but got ${kindOf(report)}.`);
  const title = options.title ?? `New rows against the training rows`;
  const caption =
    `${report.scoredRows.toLocaleString('en-US')} of ${report.inputRows.toLocaleString('en-US')} new rows have a segment` +
    `${report.scoredBy === 'scored' ? ' (segments handed back from scoring elsewhere)' : ''}; ` +
    `the definition was fitted on ${report.trainingRows.toLocaleString('en-US')} rows.`;
  const far =
    `<p class="ks-fact"><b>Far from every segment</b>: ${pct(report.far.newShare)} of new rows (${report.far.newRows})` +
    (report.far.trainingShare === null ? '' : `, against ${pct(report.far.trainingShare)} of training rows`) +
    " — farther from every centre than nearly all (99 %) of that segment's training rows were.</p>";
  const refused =
    report.refusedRows > 0
      ? `<p class="ks-fact"><b>No segment</b>: ${report.refusedRows} row(s) could not be prepared (reasons in the assignment report).</p>`
      : '';
  const legend = report.segments.map((s) => htmlSwatch(s.segment - 1)).join(' ');
  const still =
    `<h5 class="ks-sub">Segment shares ${legend}</h5>${shareBars(report)}${far}${refused}` +
    (report.features.length
      ? `<h5 class="ks-sub">Shift of each feature: population stability index (dotted lines: readings, common practice)</h5>${stabilityBars(report)}`
      : '') +
    `<h5 class="ks-sub">Columns with unseen levels or filled values</h5>${columnsTable(report)}`;
  return makeView({ kind: 'drift', title, caption, still, svg: shareBars(report), notes: report.notes });
}
