// Ordered dissimilarity heatmap: rows and columns in dendrogram order, so segments show as dark
// blocks on the diagonal. Refused above a size a page can draw.
import { checkOptions } from '../core/options';
import { compactLabels } from '../core/assignment';
import { segmentColour, textOn } from './palette';
import { axisStyle, baseLayout, kindOf, plotText, refuse } from './common';
import { INK } from './palette';
import { encodePng } from './png';
import { frame, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface DissimilarityLike {
  readonly size: number;
  readonly condensed: ArrayLike<number>;
  readonly labels?: readonly string[];
  get(i: number, j: number): number;
}

export interface HeatmapOptions {
  /** Row order: a permutation of 0..n-1, or a tree (its leaf order is used). */
  order?: readonly number[] | { readonly order: readonly number[] };
  labels?: readonly string[];
  /** Segment of every row: drawn as numbered colour strips along both edges. */
  assignment?: ArrayLike<number>;
  title?: string;
}

/** Above this many rows the view is refused: n² cells no longer fit a page. */
export const HEATMAP_MAX_ROWS = 1500;
/** Above this many rows the live chart is left out (its data would weigh megabytes); the image stays. */
const LIVE_MAX_ROWS = 600;

// Our sequential ramp, forest slate through ochre to paper: dark (alike) to pale (different);
// lightness rises steadily (CIE L* about 22, 37, 53, 67, 82, 96), so it reads in grey too.
const RAMP = ['#1f3a32', '#3f5f4a', '#7a8257', '#b5a35f', '#ddcc98', '#f8f4e8'];

/** Rows closer than this (px) cannot carry a label each; row labels need at least ROW_PX. */
const ROW_PX = 12;

function rampColour(t: number): [number, number, number] {
  const x = Math.min(1, Math.max(0, t)) * (RAMP.length - 1);
  const i = Math.min(RAMP.length - 2, Math.floor(x));
  const f = x - i;
  const a = parseInt(RAMP[i].slice(1), 16);
  const b = parseInt(RAMP[i + 1].slice(1), 16);
  const mix = (shift: number): number => Math.round(((a >> shift) & 255) * (1 - f) + ((b >> shift) & 255) * f);
  return [mix(16), mix(8), mix(0)];
}

export function heatmapView(dissimilarity: DissimilarityLike, options: HeatmapOptions = {}): View {
  const where = 'heatmapView';
  const opts = checkOptions(options, ['order', 'labels', 'assignment', 'title'], where);
  const d = dissimilarity;
  if (!d || typeof d.size !== 'number' || typeof d.get !== 'function') {
    refuse(where, `needs a dissimilarity from dissimilarity(rows, { metric }), but got ${kindOf(d)}.`);
  }
  const n = d.size;
  if (n > HEATMAP_MAX_ROWS) {
    refuse(
      where,
      `${n.toLocaleString('en-US')} rows is more than the ${HEATMAP_MAX_ROWS.toLocaleString('en-US')} a heatmap can draw legibly ` +
        `(${(n * n).toLocaleString('en-US')} cells). Draw it for a sample of the rows, or look at the segments with projectionView instead.`,
    );
  }
  const order =
    opts.order === undefined
      ? Array.from({ length: n }, (_, i) => i)
      : Array.isArray(opts.order)
        ? opts.order
        : (opts.order as { order: readonly number[] }).order;
  if (order.length !== n || new Set(order).size !== n || order.some((i) => !Number.isInteger(i) || i < 0 || i >= n)) {
    refuse(where, `the order must list each of the ${n} rows once (0-based row numbers, or a tree's order).`);
  }
  const labels = (opts.labels ?? d.labels ?? Array.from({ length: n }, (_, i) => `row ${i + 1}`)).map(String);
  if (labels.length !== n) refuse(where, `${labels.length} labels for ${n} rows.`);
  // Runs of one segment along the drawing order, for the edge strips.
  const runs: { segment: number; from: number; to: number }[] = [];
  if (opts.assignment !== undefined) {
    const seg = compactLabels(opts.assignment, n, where, 'the dissimilarity').labels;
    order.forEach((row, i) => {
      const last = runs[runs.length - 1];
      if (last && last.segment === seg[row]) last.to = i;
      else runs.push({ segment: seg[row], from: i, to: i });
    });
  }
  let max = 0;
  for (let t = 0; t < d.condensed.length; t++) if (d.condensed[t] > max) max = d.condensed[t];
  max = max || 1;
  const title = opts.title ?? `Dissimilarities between ${n} rows, in ${opts.order ? 'dendrogram' : 'input'} order`;
  const caption =
    'Each cell is the dissimilarity of two rows: dark is alike, pale is different. With rows in dendrogram order, ' +
    'segments show as dark squares along the diagonal' +
    (opts.assignment !== undefined ? '; the numbered strips along the edges give each row its segment.' : '.');

  const rgb = new Uint8Array(n * n * 3);
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      const [r, g, bl] = rampColour(d.get(order[a], order[b]) / max);
      const p = (a * n + b) * 3;
      rgb[p] = r;
      rgb[p + 1] = g;
      rgb[p + 2] = bl;
    }
  }
  const png = encodePng(n, n, rgb).toString('base64');
  // Row labels one per row, 12 px apart (cells may be taller than wide); column labels, rotated,
  // thinned to what fits. The colour key lies under the matrix, 0 (alike) on the left, as in the
  // live chart.
  const showLabels = n <= 80;
  const width = 760;
  const longest = Math.min(22, Math.max(3, ...labels.map((l) => l.length)));
  const room = showLabels ? 10 + longest * 5.4 : 12;
  const stripRoom = runs.length ? 24 : 0;
  const matrixW = width - room - stripRoom - 12;
  const matrixH = showLabels ? Math.max(matrixW * 0.75, n * ROW_PX) : matrixW;
  const colEvery = showLabels ? Math.max(1, Math.ceil((ROW_PX * n) / matrixW)) : 0;
  const colRoom = showLabels ? 10 + longest * 5.4 : 0;
  const f = frame({
    width,
    height: matrixH + (runs.length ? 22 : 10) + colRoom + 10,
    margin: { left: room, right: stripRoom + 12, top: runs.length ? 22 : 10, bottom: colRoom + 10 },
    x: { domain: [-0.5, n - 0.5], title: '', ticks: [], tickLabels: [] },
    y: { domain: [-0.5, n - 0.5], title: '', ticks: [], tickLabels: [], reversed: true },
  });
  const body = [
    `<image x="${f.left}" y="${f.top}" width="${f.right - f.left}" height="${f.bottom - f.top}" preserveAspectRatio="none" ` +
      `style="image-rendering:pixelated" href="data:image/png;base64,${png}"/>`,
  ];
  if (showLabels) {
    order.forEach((row, i) => {
      const text = labels[row].length > 22 ? labels[row].slice(0, 21) + '…' : labels[row];
      body.push(svgEl.text(text, { x: f.left - 4, y: f.y(i) + 3.2, 'text-anchor': 'end', 'font-size': 9.5, fill: INK.text }));
      if (i % colEvery !== 0) return;
      const x = f.x(i) + 3.2;
      body.push(
        svgEl.text(text, {
          x,
          y: f.bottom + 5,
          'text-anchor': 'end',
          'font-size': 9.5,
          fill: INK.text,
          transform: `rotate(-90 ${x.toFixed(1)} ${(f.bottom + 5).toFixed(1)})`,
        }),
      );
    });
  }
  for (const r of runs) {
    const y0 = f.y(r.from - 0.5);
    const y1 = f.y(r.to + 0.5);
    const x0 = f.x(r.from - 0.5);
    const x1 = f.x(r.to + 0.5);
    const colour = segmentColour(r.segment);
    body.push(svgEl.rect({ x: f.right + 4, y: y0, width: 16, height: y1 - y0, fill: colour }));
    body.push(svgEl.rect({ x: x0, y: f.top - 16, width: x1 - x0, height: 12, fill: colour }));
    if (y1 - y0 >= 14)
      body.push(
        svgEl.text(String(r.segment + 1), {
          x: f.right + 12,
          y: (y0 + y1) / 2 + 4,
          'text-anchor': 'middle',
          'font-size': 10,
          'font-weight': 700,
          fill: textOn(colour),
        }),
      );
  }
  // The cut: a white line across the matrix wherever one segment's rows end and the next begin.
  for (const r of runs.slice(1)) {
    const px = f.x(r.from - 0.5);
    const py = f.y(r.from - 0.5);
    body.push(svgEl.line({ x1: px, x2: px, y1: f.top, y2: f.bottom, stroke: '#ffffff', 'stroke-width': 1.6 }));
    body.push(svgEl.line({ x1: f.left, x2: f.right, y1: py, y2: py, stroke: '#ffffff', 'stroke-width': 1.6 }));
  }
  // Colour key, under everything: 0 (alike) on the left, the largest dissimilarity on the right.
  const keyY = f.bottom + colRoom + 14;
  const keyW = Math.min(320, matrixW);
  for (let t = 0; t < 40; t++) {
    const [r, g, b] = rampColour(t / 39);
    body.push(svgEl.rect({ x: f.left + (t * keyW) / 40, y: keyY, width: keyW / 40 + 0.5, height: 10, fill: `rgb(${r},${g},${b})` }));
  }
  body.push(svgEl.text('0 alike', { x: f.left, y: keyY + 24, 'font-size': 10.5, fill: INK.text }));
  body.push(
    svgEl.text(`${Number(max.toPrecision(3))} different`, {
      x: f.left + keyW,
      y: keyY + 24,
      'text-anchor': 'end',
      'font-size': 10.5,
      fill: INK.text,
    }),
  );
  body.push(svgEl.text('dissimilarity', { x: f.left + keyW + 12, y: keyY + 9, 'font-size': 11, fill: INK.muted }));
  const height = keyY + 34;
  const still = svgDocument(width, height, title, body);

  if (n > LIVE_MAX_ROWS) {
    return makeView({
      kind: 'heatmap',
      title,
      caption,
      still,
      notes: [`${n} rows: shown as a still image (an interactive chart would weigh several megabytes).`],
    });
  }
  const z: number[][] = [];
  for (let a = 0; a < n; a++) {
    const line: number[] = new Array(n);
    for (let b = 0; b < n; b++) line[b] = Number(d.get(order[a], order[b]).toPrecision(4));
    z.push(line);
  }
  const names = order.map((r) => plotText(labels[r]));
  const data = [
    {
      type: 'heatmap',
      z,
      x: order.map((_, i) => i),
      y: order.map((_, i) => i),
      text: order.map((ra) => order.map((rb) => `${plotText(labels[ra])} – ${plotText(labels[rb])}`)),
      hovertemplate: '%{text}<br>dissimilarity %{z}<extra></extra>',
      colorscale: RAMP.map((c, i) => [i / (RAMP.length - 1), c]),
      zmin: 0,
      zmax: max,
      // Lying under the matrix, 0 (alike) on the left: the same way as the still's key.
      colorbar: {
        orientation: 'h',
        x: 0,
        xanchor: 'left',
        y: -140 / (Math.max(640, (n <= 80 ? n * ROW_PX : 0) + 300) - 186),
        yanchor: 'top',
        len: 0.5,
        thickness: 12,
        title: { text: 'dissimilarity (0: alike)', side: 'top' },
      },
    },
  ];
  const axis = (every: number, extra: object) =>
    axisStyle('', {
      tickmode: 'array',
      tickvals: showLabels ? order.map((_, i) => i).filter((i) => i % every === 0) : [],
      ticktext: showLabels ? names.filter((_, i) => i % every === 0) : [],
      showgrid: false,
      zeroline: false,
      tickfont: { size: 9.5 },
      ...extra,
    });
  // Strips in data units just outside the matrix, so they stay beside it when the cells are kept square.
  const gap = n * 0.01;
  const band = n * 0.03;
  const reach = runs.length ? gap + band : 0;
  const strips = runs.flatMap((r) => [
    {
      type: 'rect',
      x0: n - 0.5 + gap,
      x1: n - 0.5 + gap + band,
      y0: r.from - 0.5,
      y1: r.to + 0.5,
      fillcolor: segmentColour(r.segment),
      line: { width: 0 },
    },
    {
      type: 'rect',
      x0: r.from - 0.5,
      x1: r.to + 0.5,
      y0: -0.5 - gap / 2,
      y1: -0.5 - gap / 2 - band / 2,
      fillcolor: segmentColour(r.segment),
      line: { width: 0 },
    },
  ]);
  const stripNumbers = runs
    .filter((r) => r.to - r.from + 1 >= n / 40)
    .map((r) => ({
      x: n - 0.5 + gap + band / 2,
      y: (r.from + r.to) / 2,
      text: `<b>${r.segment + 1}</b>`,
      showarrow: false,
      font: { size: 10, color: textOn(segmentColour(r.segment)) },
    }));
  const cutLines = runs.slice(1).flatMap((r) => [
    { type: 'line', x0: r.from - 0.5, x1: r.from - 0.5, y0: -0.5, y1: n - 0.5, line: { color: '#ffffff', width: 1.6 } },
    { type: 'line', y0: r.from - 0.5, y1: r.from - 0.5, x0: -0.5, x1: n - 0.5, line: { color: '#ffffff', width: 1.6 } },
  ]);
  // Rows at least ROW_PX apart (cells may be taller than wide); columns thinned to fit 760 px.
  const liveHeight = Math.max(640, (showLabels ? n * ROW_PX : 0) + 300);
  const layout = baseLayout(liveHeight, {
    shapes: [...strips, ...cutLines],
    annotations: stripNumbers,
    xaxis: axis(colEvery || 1, { range: [-0.5, n - 0.5 + reach], tickangle: -90 }),
    yaxis: axis(1, { range: [n - 0.5, -0.5 - reach / 2] }),
    margin: { l: 64, r: 24, t: 16, b: 170 },
    plot_bgcolor: '#ffffff',
  });
  return makeView({ kind: 'heatmap', title, caption, still, plot: { data, layout } });
}
