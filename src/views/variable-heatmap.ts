// Correlations between variables as a grid of cells in the variable tree's leaf order, so
// groups of related variables show as strong blocks on the diagonal. Signed: blue for positive,
// orange for negative, white at zero (a pair that stays apart for colour-blind readers); the value
// is printed in every cell while the grid is small enough to read, and groups of a cut are framed
// and numbered.
import { checkOptions } from '../core/options';
import { refuse } from './common';
import { INK, segmentColour } from './palette';
import { svgDocument, svgEl } from './svg';
import { makeView, type View } from './view';

export interface CorrelationGrid {
  /** Variable names, leaf i is names[i]. */
  readonly names: readonly string[];
  /** p × p row-major signed correlations. */
  readonly correlation: ArrayLike<number>;
  /** Drawing order (the tree's leaf order). */
  readonly order: readonly number[];
}

export interface CorrelationHeatmapOptions {
  /** Group of each variable (0-based, as a tree cut gives): framed and numbered on the grid. */
  assignment?: ArrayLike<number>;
  /** Which correlation, for the caption ("Pearson", "Spearman"). */
  similarity?: string;
  title?: string;
  /** Plain-text notes under the grid (e.g. columns left out, and why). */
  notes?: readonly string[];
}

/** Above this many variables the grid no longer reads. */
export const CORRELATION_GRID_MAX = 150;

const POSITIVE: [number, number, number] = [0x1f, 0x5f, 0x99];
const NEGATIVE: [number, number, number] = [0xd9, 0x6a, 0x14];

function cellColour(r: number): string {
  const t = Math.min(1, Math.abs(r));
  const end = r >= 0 ? POSITIVE : NEGATIVE;
  const mix = end.map((c) => Math.round(255 + (c - 255) * t));
  return `rgb(${mix[0]},${mix[1]},${mix[2]})`;
}

export function correlationHeatmapView(grid: CorrelationGrid, options: CorrelationHeatmapOptions = {}): View {
  const where = 'correlationHeatmapView';
  const opts = checkOptions(options, ['assignment', 'similarity', 'title', 'notes'], where);
  const p = grid.names.length;
  if (grid.correlation.length !== p * p) refuse(where, `${grid.correlation.length} correlations for ${p} variables (${p * p} expected).`);
  if (p > CORRELATION_GRID_MAX)
    refuse(where, `${p} variables are more than the ${CORRELATION_GRID_MAX} a grid can show; draw the dendrogram instead.`);
  const order = grid.order;
  const cell = Math.max(12, Math.min(44, Math.floor(560 / p)));
  const printValues = cell >= 26;
  const longest = Math.min(24, Math.max(...grid.names.map((n) => n.length)));
  const room = 16 + longest * 6.2;
  const left = room;
  const top = 30;
  const side = cell * p;
  const keyX = left + side + 24;
  const width = keyX + 90;
  const height = top + side + room;
  const label = (name: string) => (name.length > 24 ? name.slice(0, 23) + '…' : name);
  const body: string[] = [];
  for (let a = 0; a < p; a++) {
    for (let b = 0; b < p; b++) {
      const r = grid.correlation[order[a] * p + order[b]];
      const fill = cellColour(r);
      const tip = `${grid.names[order[a]]} – ${grid.names[order[b]]}: r = ${r.toFixed(3)}`;
      const parts = [
        svgEl.rect({ x: left + b * cell, y: top + a * cell, width: cell, height: cell, fill, stroke: '#ffffff', 'stroke-width': 0.5 }),
      ];
      if (printValues) {
        parts.push(
          svgEl.text(r.toFixed(2).replace('-', '−'), {
            x: left + b * cell + cell / 2,
            y: top + a * cell + cell / 2 + 3.5,
            'text-anchor': 'middle',
            'font-size': 10,
            fill: Math.abs(r) > 0.55 ? '#ffffff' : INK.text,
          }),
        );
      }
      body.push(svgEl.group(parts, {}, tip));
    }
  }
  order.forEach((v, i) => {
    const name = label(grid.names[v]);
    body.push(svgEl.text(name, { x: left - 5, y: top + i * cell + cell / 2 + 3.5, 'text-anchor': 'end', 'font-size': 11, fill: INK.text }));
    const x = left + i * cell + cell / 2;
    const y = top + side + 6;
    body.push(
      svgEl.text(name, {
        x,
        y,
        'text-anchor': 'end',
        'font-size': 11,
        fill: INK.text,
        transform: `rotate(-60 ${x.toFixed(1)} ${y.toFixed(1)})`,
      }),
    );
  });
  // Groups of a cut: a coloured frame around each diagonal block, its number above it.
  let groups = 0;
  if (opts.assignment !== undefined) {
    const g = opts.assignment;
    if (g.length !== p) refuse(where, `${g.length} group numbers for ${p} variables.`);
    for (let start = 0; start < p;) {
      let end = start;
      while (end + 1 < p && g[order[end + 1]] === g[order[start]]) end++;
      const s = g[order[start]];
      const colour = segmentColour(s);
      groups = Math.max(groups, s + 1);
      body.push(
        svgEl.rect({
          x: left + start * cell,
          y: top + start * cell,
          width: (end - start + 1) * cell,
          height: (end - start + 1) * cell,
          fill: 'none',
          stroke: colour,
          'stroke-width': 3,
        }),
      );
      body.push(
        svgEl.text(String(s + 1), {
          x: left + start * cell + 2,
          y: top + start * cell - 4,
          'font-size': 12,
          'font-weight': 700,
          fill: colour,
        }),
      );
      start = end + 1;
    }
  }
  // Colour key: −1 … 1.
  const steps = 40;
  for (let t = 0; t < steps; t++) {
    const r = 1 - (2 * t) / (steps - 1);
    body.push(svgEl.rect({ x: keyX, y: top + (t * side) / steps, width: 16, height: side / steps + 0.5, fill: cellColour(r) }));
  }
  body.push(svgEl.text('+1', { x: keyX + 20, y: top + 9, 'font-size': 10.5, fill: INK.text }));
  body.push(svgEl.text('0', { x: keyX + 20, y: top + side / 2 + 4, 'font-size': 10.5, fill: INK.text }));
  body.push(svgEl.text('−1', { x: keyX + 20, y: top + side, 'font-size': 10.5, fill: INK.text }));
  const which = opts.similarity ?? 'Pearson';
  const title = opts.title ?? `${which} correlations between ${p} variables, in tree order`;
  const caption =
    `Each cell is the ${which} correlation of two variables: deep blue is strongly positive, deep orange strongly negative, ` +
    'white unrelated. In tree order, variables that say the same thing form strong squares along the diagonal' +
    (groups ? `; the ${groups} framed, numbered squares are the groups of the cut.` : '.');
  return makeView({ kind: 'correlation-heatmap', title, caption, still: svgDocument(width, height, title, body), notes: opts.notes });
}
