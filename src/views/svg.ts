// A small SVG writer for the static stand-ins: scales, nice ticks, axes and a few shapes. Every
// text passes through escapeHtml; numbers are rounded so the markup stays small.
import { escapeHtml } from './escape';
import { INK } from './palette';

export type Attrs = Record<string, string | number | undefined>;

const r2 = (v: number): string => (Number.isFinite(v) ? String(Math.round(v * 100) / 100) : '0');

function attrs(a: Attrs): string {
  let out = '';
  for (const [k, v] of Object.entries(a)) {
    if (v === undefined) continue;
    out += ` ${k}="${typeof v === 'number' ? r2(v) : escapeHtml(v)}"`;
  }
  return out;
}

export const svgEl = {
  rect: (a: Attrs): string => `<rect${attrs(a)}/>`,
  line: (a: Attrs): string => `<line${attrs(a)}/>`,
  circle: (a: Attrs): string => `<circle${attrs(a)}/>`,
  path: (d: string, a: Attrs): string => `<path d="${d}"${attrs(a)}/>`,
  text: (content: string, a: Attrs): string => `<text${attrs(a)}>${escapeHtml(content)}</text>`,
  /** A tooltip for the shape before it (shown by browsers on hover, even with scripts off). */
  group: (children: string[], a: Attrs = {}, tip?: string): string =>
    `<g${attrs(a)}>${tip === undefined ? '' : `<title>${escapeHtml(tip)}</title>`}${children.join('')}</g>`,
};

/** Path data from points, numbers rounded. */
export function pathData(points: readonly (readonly [number, number])[], close = false): string {
  return points.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${r2(x)} ${r2(y)}`).join('') + (close ? 'Z' : '');
}

export interface Scale {
  (v: number): number;
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const [d0, d1] = domain;
  const span = d1 - d0 || 1;
  const f = ((v: number) => range[0] + ((v - d0) / span) * (range[1] - range[0])) as Scale;
  return Object.assign(f, { domain, range });
}

/** Round tick values (1, 2, 5 × 10^k steps) covering [min, max]. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
  if (min > max) [min, max] = [max, min];
  if (min === max) return [min];
  const raw = (max - min) / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const ticks: number[] = [];
  for (let v = Math.ceil(min / step) * step; v <= max + step * 1e-9; v += step) ticks.push(Math.round(v / step) * step);
  return ticks;
}

/** Domain padded a little and widened to include `include` (e.g. 0). */
export function extent(values: ArrayLike<number>, pad = 0.05, include?: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (include !== undefined) {
    lo = Math.min(lo, include);
    hi = Math.max(hi, include);
  }
  if (!Number.isFinite(lo)) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  const p = (hi - lo) * pad;
  return [include === lo ? lo : lo - p, include === hi ? hi : hi + p];
}

export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(1);
  return String(Math.round(v * 1000) / 1000);
}

export interface FrameSpec {
  width: number;
  height: number;
  x: { domain: [number, number]; title: string; ticks?: number[]; tickLabels?: string[] };
  y: { domain: [number, number]; title: string; ticks?: number[]; tickLabels?: string[]; reversed?: boolean };
  margin?: { left: number; right: number; top: number; bottom: number };
}

export interface Frame {
  x: Scale;
  y: Scale;
  /** Axes, grid and titles, drawn under the marks. */
  under: string[];
  left: number;
  right: number;
  top: number;
  bottom: number;
}

/** Plot area with grid, ticks and axis titles. */
export function frame(spec: FrameSpec): Frame {
  const m = spec.margin ?? { left: 64, right: 20, top: 16, bottom: 52 };
  const left = m.left;
  const right = spec.width - m.right;
  const top = m.top;
  const bottom = spec.height - m.bottom;
  const x = linearScale(spec.x.domain, [left, right]);
  const y = linearScale(spec.y.domain, spec.y.reversed ? [top, bottom] : [bottom, top]);
  const under: string[] = [svgEl.rect({ x: left, y: top, width: right - left, height: bottom - top, fill: INK.panel })];
  const xt = spec.x.ticks ?? niceTicks(spec.x.domain[0], spec.x.domain[1], 6);
  const yt = spec.y.ticks ?? niceTicks(spec.y.domain[0], spec.y.domain[1], 5);
  const font = { 'font-size': 11, fill: INK.muted };
  xt.forEach((t, i) => {
    const px = x(t);
    under.push(svgEl.line({ x1: px, x2: px, y1: top, y2: bottom, stroke: INK.grid }));
    under.push(svgEl.text(spec.x.tickLabels?.[i] ?? formatTick(t), { x: px, y: bottom + 15, 'text-anchor': 'middle', ...font }));
  });
  yt.forEach((t, i) => {
    const py = y(t);
    under.push(svgEl.line({ x1: left, x2: right, y1: py, y2: py, stroke: INK.grid }));
    under.push(svgEl.text(spec.y.tickLabels?.[i] ?? formatTick(t), { x: left - 6, y: py + 4, 'text-anchor': 'end', ...font }));
  });
  under.push(svgEl.line({ x1: left, x2: right, y1: bottom, y2: bottom, stroke: INK.axis }));
  under.push(svgEl.line({ x1: left, x2: left, y1: top, y2: bottom, stroke: INK.axis }));
  under.push(
    svgEl.text(spec.x.title, { x: (left + right) / 2, y: spec.height - 12, 'text-anchor': 'middle', 'font-size': 12, fill: INK.text }),
  );
  under.push(
    svgEl.text(spec.y.title, {
      x: 14,
      y: (top + bottom) / 2,
      'text-anchor': 'middle',
      'font-size': 12,
      fill: INK.text,
      transform: `rotate(-90 14 ${r2((top + bottom) / 2)})`,
    }),
  );
  return { x, y, under, left, right, top, bottom };
}

/** The whole <svg> element, with an accessible title. */
export function svgDocument(width: number, height: number, title: string, body: string[]): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" ` +
    `role="img" aria-label="${escapeHtml(title)}" font-family="system-ui, -apple-system, 'Segoe UI', sans-serif" ` +
    `style="max-width:100%;height:auto">` +
    `<title>${escapeHtml(title)}</title>${body.join('')}</svg>`
  );
}
