// Evidence for a mixture: one row of tiles per covariance shape, one tile per k, each tile showing
// how far its BIC lies above the lowest BIC of all (ΔBIC; 0 is the choice). Darker tiles are
// closer to the choice; the chosen tile carries an accent ring, and a small mark under a tile
// gives each shape's own best k. The exact BIC values follow in a table.
import { checkOptions } from '../core/options';
import { escapeHtml } from './escape';
import { kindOf, refuse } from './common';
import { INK } from './palette';
import { svgDocument, svgEl } from './svg';
import { makeView, type View } from './view';

/** What the view reads from compareMixtures. */
export interface MixtureComparisonLike {
  readonly kind: 'mixture-comparison';
  readonly rows: number;
  readonly candidates: readonly { k: number; covariance: string; bic: number; parameterCount: number; converged: boolean }[];
  readonly chosen: { k: number; covariance: string; bic: number };
  readonly bestKByShape: Readonly<Record<string, number | undefined>>;
}

/** ΔBIC beyond which a candidate is strongly worse (common practice, after Kass & Raftery 1995). */
const STRONG_DIFFERENCE = 10;
const TILE_INK = '#2f4858';

const deltaText = (d: number) => (d === 0 ? '0' : d < 10 ? d.toFixed(1) : Math.round(d).toLocaleString('en-US'));

export function mixtureEvidenceView(comparison: MixtureComparisonLike, options: { title?: string } = {}): View {
  const where = 'mixtureEvidenceView';
  const opts = checkOptions(options, ['title'], where);
  if (
    !comparison ||
    comparison.kind !== 'mixture-comparison' ||
    !Array.isArray(comparison.candidates) ||
    comparison.candidates.length === 0
  ) {
    refuse(where, `needs the result of compareMixtures(rows, { from, to }), but got ${kindOf(comparison)}.`);
  }
  const shapes = [...new Set(comparison.candidates.map((c) => c.covariance))];
  const ks = [...new Set(comparison.candidates.map((c) => c.k))].sort((a, b) => a - b);
  const best = comparison.chosen;
  const at = (shape: string, k: number) => comparison.candidates.find((c) => c.covariance === shape && c.k === k);
  const deltas = comparison.candidates.map((c) => c.bic - best.bic);
  const largest = Math.max(...deltas, STRONG_DIFFERENCE);
  const title = opts.title ?? `Mixture evidence: k = ${best.k} with ${best.covariance} covariance has the lowest BIC`;
  const caption =
    `Each tile is one mixture; its number is how far its BIC lies above the lowest (ΔBIC, lower is better, 0 is the choice). ` +
    `Darker tiles are closer to the choice. A difference above ${STRONG_DIFFERENCE} counts as strong evidence against a mixture ` +
    `(common practice). The accent ring marks the choice; a bar under a tile marks each shape's own best k.`;

  const width = 760;
  const labelW = 112;
  const top = 34;
  const tileH = 46;
  const gap = 6;
  const tileW = Math.min(86, (width - labelW - 16) / ks.length - gap);
  const height = top + shapes.length * (tileH + gap + 8) + 16;
  const body: string[] = [];
  body.push(svgEl.text('covariance', { x: 8, y: 20, 'font-size': 11, fill: INK.muted }));
  ks.forEach((k, i) => {
    const x = labelW + i * (tileW + gap) + tileW / 2;
    body.push(svgEl.text(`k = ${k}`, { x, y: 20, 'text-anchor': 'middle', 'font-size': 11.5, fill: INK.text }));
  });
  shapes.forEach((shape, r) => {
    const y = top + r * (tileH + gap + 8);
    body.push(svgEl.text(shape, { x: 8, y: y + tileH / 2 + 4, 'font-size': 12.5, 'font-weight': 600, fill: INK.text }));
    ks.forEach((k, i) => {
      const c = at(shape, k);
      const x = labelW + i * (tileW + gap);
      if (!c) {
        body.push(svgEl.rect({ x, y, width: tileW, height: tileH, fill: INK.panel }));
        return;
      }
      const delta = c.bic - best.bic;
      // Shade by the logarithm of ΔBIC, so small differences stay visible next to large ones.
      const strength = 1 - Math.log1p(delta) / Math.log1p(largest);
      const opacity = 0.1 + 0.85 * strength;
      body.push(svgEl.rect({ x, y, width: tileW, height: tileH, rx: 3, fill: TILE_INK, 'fill-opacity': Number(opacity.toFixed(3)) }));
      const dark = opacity > 0.5;
      body.push(
        svgEl.text(deltaText(delta), {
          x: x + tileW / 2,
          y: y + tileH / 2 + 5,
          'text-anchor': 'middle',
          'font-size': 13,
          'font-weight': delta === 0 ? 700 : 500,
          fill: dark ? '#ffffff' : INK.text,
        }),
      );
      if (shape === best.covariance && k === best.k) {
        body.push(
          svgEl.rect({
            x: x - 3,
            y: y - 3,
            width: tileW + 6,
            height: tileH + 6,
            rx: 5,
            fill: 'none',
            stroke: INK.accent,
            'stroke-width': 2.5,
          }),
        );
      }
      if (comparison.bestKByShape[shape] === k) {
        body.push(svgEl.rect({ x: x + 6, y: y + tileH + 3, width: tileW - 12, height: 3, fill: INK.above }));
      }
      if (!c.converged) body.push(svgEl.text('*', { x: x + tileW - 8, y: y + 12, 'font-size': 12, fill: dark ? '#ffffff' : INK.text }));
    });
  });
  const still = svgDocument(width, height, title, body);
  const notes = [`BIC = −2 ln L + p · ln n with n = ${comparison.rows} rows and p free parameters; lower is better.`];
  if (comparison.candidates.some((c) => !c.converged)) notes.push('* EM stopped at its iteration limit before settling.');
  return makeView({ kind: 'mixture-evidence', title, caption, still, notes, after: bicTable(comparison, shapes, ks, at) });
}

function bicTable(
  comparison: MixtureComparisonLike,
  shapes: readonly string[],
  ks: readonly number[],
  at: (shape: string, k: number) => MixtureComparisonLike['candidates'][number] | undefined,
): string {
  const head = `<tr><th>covariance</th>${ks.map((k) => `<th>k = ${k}</th>`).join('')}</tr>`;
  const body = shapes
    .map((shape) => {
      const cells = ks.map((k) => {
        const c = at(shape, k);
        if (!c) return '<td>—</td>';
        const chosen = shape === comparison.chosen.covariance && k === comparison.chosen.k;
        const text = Math.round(c.bic).toLocaleString('en-US');
        return `<td${chosen ? ' style="font-weight:700;background:#fbecef"' : ''} title="${c.parameterCount} parameters">${text}${chosen ? ' ◂ lowest BIC' : ''}</td>`;
      });
      return `<tr><td>${escapeHtml(shape)}</td>${cells.join('')}</tr>`;
    })
    .join('');
  return `<div style="overflow-x:auto"><table class="ks-table"><thead>${head}</thead><tbody>${body}</tbody></table></div>`;
}
