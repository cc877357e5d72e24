// Projected scatter: rows on the first two principal components, coloured and numbered by
// segment, centres marked, optional loading arrows; and the scree of explained variance.
import { compactLabels } from '../core/assignment';
import { checkOptions } from '../core/options';
import { Matrix } from '../core/matrix';
import { axisStyle, baseLayout, everyNth, kindOf, namesFrom, plotText, refuse, svgLegend, svgLegendLines } from './common';
import { INK, segmentColour, textOn } from './palette';
import { NOISE_INK } from './cards';
import { extent, frame, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface ProjectionLike {
  readonly kind: 'projection';
  readonly scores: Matrix;
  readonly loadings: Matrix;
  readonly explainedVarianceRatio: readonly number[];
  readonly mean?: ArrayLike<number>;
  readonly featureNames?: readonly string[];
}

export interface ProjectionViewOptions {
  /** Row ids shown on hover. */
  ids?: readonly string[];
  /** Segment centres in the original feature space (projected here); default: mean of scores. */
  centers?: readonly (readonly number[])[];
  /** Extra values per row shown on hover, by column name. */
  hover?: Readonly<Record<string, ArrayLike<number | string>>>;
  /** Draw an arrow per feature (its loadings on the two components). */
  loadings?: boolean;
  /** Segment names by number 1..k, for the legend. */
  names?: Readonly<Record<number, string>>;
  title?: string;
  /** Rows whose segment is uncertain (1 = uncertain; e.g. a mixture's top membership below `below`), drawn as open rings. */
  uncertain?: { readonly flags: ArrayLike<number>; readonly below: number };
  /**
   * Rows whose segment is -1 are noise (density segments): drawn as neutral rings, counted in a
   * note, never coloured as a segment. Without this option -1 is an ordinary label.
   */
  noise?: boolean;
}

const MAX_STATIC_POINTS = 4000;

/** Arrows shorter than this share of the longest are drawn without a label. */
const LABELLED_ARROW_SHARE = 0.35;

function requireProjection(p: unknown, where: string): ProjectionLike {
  const q = p as ProjectionLike;
  if (!q || q.kind !== 'projection' || !q.scores || !q.loadings) {
    refuse(where, `needs a projection from project(rows, { components }), but got ${kindOf(p)}.`);
  }
  return q;
}

const pct = (r: number | undefined): string => (r === undefined || !Number.isFinite(r) ? '' : ` (${(r * 100).toFixed(1)}% of variance)`);

export function projectionView(projection: ProjectionLike, assignment: ArrayLike<number>, options: ProjectionViewOptions = {}): View {
  const where = 'projectionView';
  const opts = checkOptions(options, ['ids', 'centers', 'hover', 'loadings', 'names', 'title', 'uncertain', 'noise'], where);
  const p = requireProjection(projection, where);
  const { scores, loadings } = p;
  if (scores.cols < 2) refuse(where, `the projection has ${scores.cols} component; ask project() for { components: 2 } or more.`);
  const n = scores.rows;
  // Noise rows borrow a real label for the compaction only; `isNoise` keeps them out of every segment.
  const isNoise = new Uint8Array(n);
  let noiseRows = 0;
  let stand = 0;
  if (opts.noise && assignment.length === n) {
    for (let i = 0; i < n; i++) if (assignment[i] !== -1) stand = assignment[i];
    for (let i = 0; i < n; i++) {
      if (assignment[i] !== -1) continue;
      isNoise[i] = 1;
      noiseRows++;
    }
  }
  const { labels, k } = compactLabels(
    noiseRows ? Array.from(assignment, (a) => (a === -1 ? stand : a)) : assignment,
    n,
    where,
    'the projected rows',
  );
  if (opts.ids && opts.ids.length !== n) refuse(where, `${opts.ids.length} ids for ${n} rows.`);
  const ids = opts.ids ?? scores.rowLabels;
  const names = namesFrom(k, opts.names);
  const c = scores.cols;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = scores.data[i * c];
    y[i] = scores.data[i * c + 1];
  }
  // Centres: given ones projected with the loadings, else the segment means of the scores.
  const cx = new Float64Array(k);
  const cy = new Float64Array(k);
  if (opts.centers) {
    if (opts.centers.length !== k) refuse(where, `${opts.centers.length} centres for ${k} segments.`);
    const d = loadings.rows;
    opts.centers.forEach((centre, s) => {
      if (centre.length !== d) refuse(where, `centre ${s + 1} has ${centre.length} values; the projection has ${d} features.`);
      for (let j = 0; j < d; j++) {
        const v = centre[j] - (p.mean ? p.mean[j] : 0);
        cx[s] += v * loadings.data[j * loadings.cols];
        cy[s] += v * loadings.data[j * loadings.cols + 1];
      }
    });
  } else {
    const count = new Float64Array(k);
    for (let i = 0; i < n; i++) {
      if (isNoise[i]) continue;
      cx[labels[i]] += x[i];
      cy[labels[i]] += y[i];
      count[labels[i]]++;
    }
    for (let s = 0; s < k; s++) {
      cx[s] /= count[s];
      cy[s] /= count[s];
    }
  }
  const featureNames = p.featureNames ?? loadings.rowLabels ?? Array.from({ length: loadings.rows }, (_, j) => `feature ${j + 1}`);
  // Arrows scaled so the longest reaches 85% of the cloud's reach.
  // Short arrows (variables with little weight on these two components) are drawn unlabelled and
  // named in a note: their labels would pile up on the origin.
  let arrows: { name: string; ax: number; ay: number; labelled: boolean }[] = [];
  let unlabelled: string[] = [];
  if (opts.loadings) {
    let reach = 0;
    for (let i = 0; i < n; i++) reach = Math.max(reach, Math.hypot(x[i], y[i]));
    let longest = 0;
    const raw = featureNames.map((name, j) => {
      const ax = loadings.data[j * loadings.cols];
      const ay = loadings.data[j * loadings.cols + 1];
      longest = Math.max(longest, Math.hypot(ax, ay));
      return { name, ax, ay };
    });
    const scale = longest > 0 ? (0.85 * reach) / longest : 1;
    arrows = raw.map((a) => ({
      name: a.name,
      ax: a.ax * scale,
      ay: a.ay * scale,
      labelled: Math.hypot(a.ax, a.ay) >= LABELLED_ARROW_SHARE * longest,
    }));
    unlabelled = arrows.filter((a) => !a.labelled).map((a) => a.name);
  }
  const xTitle = `principal component 1${pct(p.explainedVarianceRatio[0])}`;
  const yTitle = `principal component 2${pct(p.explainedVarianceRatio[1])}`;
  const title = opts.title ?? `Segments on the first two principal components`;
  const caption =
    'Each dot is a row placed by its two strongest directions of variation; colour and number give its segment, ' +
    'the large numbered discs mark segment centres. Segments that overlap here may still be apart in the components not shown.' +
    (opts.loadings ? ' Arrows point the way each variable grows.' : '') +
    (opts.uncertain
      ? ` Open rings are rows whose segment is uncertain: their highest membership probability is below ${opts.uncertain.below}.`
      : '');
  const unsure = (i: number) => opts.uncertain !== undefined && opts.uncertain.flags[i] === 1;

  // Static stand-in, equal units on both axes (a biplot): the plot area takes the data's aspect,
  // within limits; past them the shorter axis is widened instead.
  // Labelled arrow tips reach a little further so their labels stay inside the frame.
  let xs = extent([...x, ...cx, ...arrows.map((a) => (a.labelled ? a.ax * 1.35 : a.ax))]);
  let ys = extent([...y, ...cy, ...arrows.map((a) => a.ay * 1.1)]);
  const width = 760;
  const margin = { left: 64, right: 20, top: 16, bottom: 52 };
  const plotW = width - margin.left - margin.right;
  const [minH, maxH] = [300, 620];
  let plotH = (plotW * (ys[1] - ys[0])) / (xs[1] - xs[0]);
  if (plotH < minH) {
    plotH = minH;
    const half = ((xs[1] - xs[0]) * (minH / plotW)) / 2;
    const mid = (ys[0] + ys[1]) / 2;
    ys = [mid - half, mid + half];
  } else if (plotH > maxH) {
    plotH = maxH;
    const half = ((ys[1] - ys[0]) * (plotW / maxH)) / 2;
    const mid = (xs[0] + xs[1]) / 2;
    xs = [mid - half, mid + half];
  }
  const legendLines = svgLegendLines(k, names, width - 80);
  const frameH = plotH + margin.top + margin.bottom;
  const height = frameH + 10 + legendLines * 20;
  const f = frame({ width, height: frameH, margin, x: { domain: xs, title: xTitle }, y: { domain: ys, title: yTitle } });
  const body = [...f.under];
  const stride = Math.max(1, Math.ceil(n / MAX_STATIC_POINTS));
  for (let i = 0; i < n; i += stride) {
    const r = n > 1500 ? 2 : 3.2;
    if (isNoise[i]) {
      body.push(svgEl.circle({ cx: f.x(x[i]), cy: f.y(y[i]), r, fill: 'none', stroke: NOISE_INK, 'stroke-width': 1 }));
      continue;
    }
    body.push(
      unsure(i)
        ? svgEl.circle({ cx: f.x(x[i]), cy: f.y(y[i]), r: r + 0.8, fill: 'none', stroke: segmentColour(labels[i]), 'stroke-width': 1.2 })
        : svgEl.circle({ cx: f.x(x[i]), cy: f.y(y[i]), r, fill: segmentColour(labels[i]), 'fill-opacity': 0.72 }),
    );
  }
  // Arrow labels go where they cover no centre disc: first beside the tip, else the other side
  // or above / below it; the discs are drawn last, so no label can hide one.
  const discs = Array.from({ length: k }, (_, s) => [f.x(cx[s]), f.y(cy[s])] as const);
  const taken: { x0: number; x1: number; y0: number; y1: number }[] = [];
  const clashes = (b: { x0: number; x1: number; y0: number; y1: number }) =>
    discs.some(([px, py]) => px + 13 > b.x0 && px - 13 < b.x1 && py + 13 > b.y0 && py - 13 < b.y1) ||
    taken.some((t) => t.x1 > b.x0 && t.x0 < b.x1 && t.y1 > b.y0 && t.y0 < b.y1);
  const arrowLabels: string[] = [];
  const livePlace = new Map<string, { x: number; y: number; anchor: 'left' | 'right' }>();
  for (const a of arrows) {
    body.push(svgEl.line({ x1: f.x(0), y1: f.y(0), x2: f.x(a.ax), y2: f.y(a.ay), stroke: INK.text, 'stroke-width': 1.3 }));
    body.push(svgEl.circle({ cx: f.x(a.ax), cy: f.y(a.ay), r: 2.5, fill: INK.text }));
    if (!a.labelled) continue;
    const tx = f.x(a.ax);
    const ty = f.y(a.ay);
    const w = a.name.length * 6.3 + 4;
    const right = a.ax >= 0;
    const tries: [number, number, 'start' | 'end'][] = [
      [right ? tx + 4 : tx - 4, a.ay >= 0 ? ty - 4 : ty + 12, right ? 'start' : 'end'],
      [right ? tx + 4 : tx - 4, a.ay >= 0 ? ty + 12 : ty - 4, right ? 'start' : 'end'],
      [right ? tx - 4 : tx + 4, a.ay >= 0 ? ty - 4 : ty + 12, right ? 'end' : 'start'],
      [tx, ty - 26, right ? 'start' : 'end'],
      [tx, ty + 28, right ? 'start' : 'end'],
    ];
    const box = ([lx, ly, anchor]: [number, number, 'start' | 'end']) => ({
      x0: anchor === 'start' ? lx : lx - w,
      x1: anchor === 'start' ? lx + w : lx,
      y0: ly - 11,
      y1: ly + 3,
    });
    const pick = tries.find((t) => !clashes(box(t))) ?? tries[0];
    taken.push(box(pick));
    // The live chart puts the label at the same place, in data units (both charts keep equal units).
    const b = box(pick);
    livePlace.set(a.name, {
      x: xs[0] + (((pick[2] === 'start' ? b.x0 : b.x1) - f.left) / (f.right - f.left)) * (xs[1] - xs[0]),
      y: ys[0] + ((f.bottom - (b.y0 + b.y1) / 2) / (f.bottom - f.top)) * (ys[1] - ys[0]),
      anchor: pick[2] === 'start' ? 'left' : 'right',
    });
    arrowLabels.push(
      svgEl.text(a.name, {
        x: pick[0],
        y: pick[1],
        'text-anchor': pick[2],
        'font-size': 11,
        fill: INK.text,
        stroke: '#ffffff',
        'stroke-width': 3,
        'paint-order': 'stroke',
      }),
    );
  }
  body.push(...arrowLabels);
  for (let s = 0; s < k; s++) {
    const [px, py] = discs[s];
    body.push(svgEl.circle({ cx: px, cy: py, r: 10, fill: segmentColour(s), stroke: '#ffffff', 'stroke-width': 2.5 }));
    body.push(
      svgEl.text(String(s + 1), {
        x: px,
        y: py + 4,
        'text-anchor': 'middle',
        'font-size': 11,
        'font-weight': 700,
        fill: textOn(segmentColour(s)),
      }),
    );
  }
  body.push(...svgLegend(k, 64, frameH + 14, names, width - 80));
  const still = svgDocument(width, height, title, body);
  const notes = stride > 1 ? [`${n} rows: the static picture draws ${everyNth(stride)} row; the live chart draws all.`] : [];
  if (unlabelled.length) notes.push(`Short arrows, unlabelled (little weight on these two components): ${unlabelled.join(', ')}.`);
  if (noiseRows)
    notes.push(`${noiseRows.toLocaleString('en-US')} of ${n.toLocaleString('en-US')} rows are in no segment (noise): grey rings.`);

  // Live chart: one trace per segment so the legend toggles segments.
  const hoverCols = Object.entries(opts.hover ?? {});
  for (const [name, values] of hoverCols)
    if (values.length !== n) refuse(where, `hover column "${name}" has ${values.length} values for ${n} rows.`);
  const data: object[] = [];
  // Above a few thousand points SVG markers get slow; WebGL draws them instead, and then the
  // centres too (a WebGL layer covers the SVG one, which would hide them).
  const traceType = n > 5000 ? 'scattergl' : 'scatter';
  for (let s = 0; s < k; s++) {
    const rows: number[] = [];
    for (let i = 0; i < n; i++) if (labels[i] === s && !isNoise[i]) rows.push(i);
    // The legend shows a trace's first marker: certain rows first, so a segment is not keyed as an
    // open ring because its first row happens to be uncertain (the uncertain ones then draw on top).
    if (opts.uncertain) rows.sort((a, b) => Number(unsure(a)) - Number(unsure(b)) || a - b);
    data.push({
      type: traceType,
      mode: 'markers',
      name: plotText(names[s] ? `${s + 1} · ${names[s]}` : `${s + 1}`),
      x: rows.map((i) => x[i]),
      y: rows.map((i) => y[i]),
      marker: {
        color: segmentColour(s),
        size: n > 1500 ? 5 : 7,
        opacity: 0.75,
        line: { width: opts.uncertain ? 1.2 : 0, color: segmentColour(s) },
        ...(opts.uncertain ? { symbol: rows.map((i) => (unsure(i) ? 'circle-open' : 'circle')) } : {}),
      },
      text: rows.map((i) => {
        const parts = [`<b>${plotText(ids?.[i] ?? `row ${i + 1}`)}</b>`, `segment ${s + 1}${unsure(i) ? ' (uncertain)' : ''}`];
        for (const [name, values] of hoverCols) {
          const v = values[i];
          parts.push(`${plotText(name)}: ${plotText(typeof v === 'number' ? Number(v.toPrecision(4)) : v)}`);
        }
        return parts.join('<br>');
      }),
      hovertemplate: '%{text}<extra></extra>',
    });
  }
  if (noiseRows) {
    const rows: number[] = [];
    for (let i = 0; i < n; i++) if (isNoise[i]) rows.push(i);
    data.push({
      type: traceType,
      mode: 'markers',
      name: 'noise (no segment)',
      x: rows.map((i) => x[i]),
      y: rows.map((i) => y[i]),
      marker: { color: 'rgba(0,0,0,0)', size: n > 1500 ? 5 : 7, line: { color: NOISE_INK, width: 1 } },
      text: rows.map((i) => `<b>${plotText(ids?.[i] ?? `row ${i + 1}`)}</b><br>noise: in no segment`),
      hovertemplate: '%{text}<extra></extra>',
    });
  }
  data.push({
    type: traceType,
    mode: 'markers+text',
    name: 'centres',
    x: Array.from(cx),
    y: Array.from(cy),
    text: Array.from({ length: k }, (_, s) => String(s + 1)),
    textfont: { color: Array.from({ length: k }, (_, s) => textOn(segmentColour(s))), size: 11 },
    marker: {
      size: 22,
      color: Array.from({ length: k }, (_, s) => segmentColour(s)),
      line: { color: '#ffffff', width: 2.5 },
      symbol: 'circle',
    },
    hovertemplate: 'centre of segment %{text}<extra></extra>',
  });
  const annotations = arrows.flatMap((a) => [
    {
      x: a.ax,
      y: a.ay,
      ax: 0,
      ay: 0,
      axref: 'x',
      ayref: 'y',
      showarrow: true,
      arrowhead: 2,
      arrowwidth: 1.3,
      arrowcolor: INK.text,
      text: '',
    },
    ...(a.labelled
      ? [
          {
            x: livePlace.get(a.name)!.x,
            y: livePlace.get(a.name)!.y,
            showarrow: false,
            text: plotText(a.name),
            xanchor: livePlace.get(a.name)!.anchor,
            yanchor: 'middle',
            font: { size: 11, color: INK.text },
          },
        ]
      : []),
  ]);
  const layout = baseLayout(600, {
    xaxis: axisStyle(xTitle, { constrain: 'domain' }),
    // Equal units on both axes: a biplot's angles and lengths mean something.
    yaxis: axisStyle(yTitle, { scaleanchor: 'x', scaleratio: 1, constrain: 'domain' }),
    annotations,
    hovermode: 'closest',
    legend: { orientation: 'h', y: -0.16, x: 0, title: { text: 'segment' } },
  });
  return makeView({ kind: 'projection', title, caption, still, plot: { data, layout }, notes });
}

export function screeView(projection: ProjectionLike, options: { title?: string } = {}): View {
  const where = 'screeView';
  const opts = checkOptions(options, ['title'], where);
  const p = requireProjection(projection, where);
  const ratio = p.explainedVarianceRatio.map(Number);
  const m = ratio.length;
  const cumulative: number[] = [];
  ratio.reduce((acc, r, i) => ((cumulative[i] = acc + r), acc + r), 0);
  const title = opts.title ?? 'Variance explained by each principal component';
  const caption =
    'Bars: the share of the total variance each component carries; line: the running total. ' +
    'Where the bars flatten, further components add little.';
  const width = 760;
  const height = 380;
  const f = frame({
    margin: { left: 64, right: 180, top: 16, bottom: 52 },
    width,
    height,
    x: { domain: [0.4, m + 0.6], title: 'principal component', ticks: ratio.map((_, i) => i + 1) },
    y: { domain: [0, 1], title: 'share of variance', ticks: [0, 0.25, 0.5, 0.75, 1], tickLabels: ['0%', '25%', '50%', '75%', '100%'] },
  });
  const bw = Math.min(46, ((f.right - f.left) / m) * 0.62);
  const body = [...f.under];
  ratio.forEach((r, i) => {
    body.push(svgEl.rect({ x: f.x(i + 1) - bw / 2, y: f.y(r), width: bw, height: f.y(0) - f.y(r), fill: '#1a6699', rx: 2 }));
    body.push(
      svgEl.text(`${(r * 100).toFixed(1)}%`, { x: f.x(i + 1), y: f.y(r) - 4, 'text-anchor': 'middle', 'font-size': 10.5, fill: INK.text }),
    );
  });
  body.push(svgEl.path(pathData(cumulative.map((c, i) => [f.x(i + 1), f.y(c)])), { fill: 'none', stroke: '#e6801a', 'stroke-width': 2 }));
  cumulative.forEach((c, i) => body.push(svgEl.circle({ cx: f.x(i + 1), cy: f.y(c), r: 3.5, fill: '#e6801a' })));
  body.push(svgEl.rect({ x: width - 170, y: 24, width: 14, height: 10, fill: '#1a6699' }));
  body.push(svgEl.text('this component', { x: width - 150, y: 33, 'font-size': 11, fill: INK.text }));
  body.push(svgEl.line({ x1: width - 170, x2: width - 156, y1: 47, y2: 47, stroke: '#e6801a', 'stroke-width': 2 }));
  body.push(svgEl.text('running total', { x: width - 150, y: 51, 'font-size': 11, fill: INK.text }));
  const still = svgDocument(width, height, title, body);
  const comps = ratio.map((_, i) => i + 1);
  const data = [
    {
      type: 'bar',
      name: 'this component',
      x: comps,
      y: ratio,
      marker: { color: '#1a6699' },
      hovertemplate: 'component %{x}: %{y:.1%}<extra></extra>',
    },
    {
      type: 'scatter',
      mode: 'lines+markers',
      name: 'running total',
      x: comps,
      y: cumulative,
      line: { color: '#e6801a', width: 2 },
      hovertemplate: 'components 1–%{x}: %{y:.1%}<extra></extra>',
    },
  ];
  const layout = baseLayout(380, {
    xaxis: axisStyle('principal component', { dtick: 1 }),
    yaxis: axisStyle('share of variance', { tickformat: '.0%', range: [0, 1.02] }),
  });
  return makeView({ kind: 'scree', title, caption, still, plot: { data, layout } });
}
