// Pieces several views share: segment labels and legends, the plotly base layout, and the
// refusal of a result that cannot make the view asked for.
import { KinsortError } from '../core/errors';
import { INK, segmentColour, textOn } from './palette';
import { svgEl } from './svg';

/** "1" or "1 · Off-peak explorers" (1-based, as people read it). */
export function segmentLabel(s: number, names?: readonly (string | undefined)[]): string {
  const name = names?.[s];
  return name ? `${s + 1} · ${name}` : `Segment ${s + 1}`;
}

/** What a result is, for messages: its kind, or a short description. */
export function kindOf(value: unknown): string {
  if (value === null || value === undefined) return String(value);
  if (typeof value !== 'object') return typeof value;
  const kind = (value as { kind?: unknown }).kind;
  if (typeof kind === 'string') return `a ${kind} result`;
  if (Array.isArray(value)) return `an array of length ${value.length}`;
  return 'an object without a kind';
}

export function refuse(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-input');
}

const legendLabel = (s: number, names?: readonly (string | undefined)[]): string => (names?.[s] ? `${names[s]}` : `segment ${s + 1}`);
const legendWidth = (label: string): number => 44 + Math.min(label.length, 28) * 6.6;

/** How many lines svgLegend takes for k entries in maxWidth (each line 20 px): leave that room. */
export function svgLegendLines(k: number, names?: readonly (string | undefined)[], maxWidth = 900): number {
  let lines = 1;
  let used = 0;
  for (let s = 0; s < k; s++) {
    const w = legendWidth(legendLabel(s, names));
    if (used > 0 && used + w > maxWidth) {
      lines++;
      used = 0;
    }
    used += w;
  }
  return lines;
}

/** Swatches with numbers printed on them, for SVG views; wraps onto further lines 20 px apart
 *  (svgLegendLines says how many, so the picture can make room for every entry). */
export function svgLegend(k: number, x: number, y: number, names?: readonly (string | undefined)[], maxWidth = 900): string[] {
  const out: string[] = [];
  let cx = x;
  let cy = y;
  for (let s = 0; s < k; s++) {
    const label = legendLabel(s, names);
    const w = legendWidth(label);
    if (cx > x && cx + w > x + maxWidth) {
      cx = x;
      cy += 20;
    }
    const colour = segmentColour(s);
    out.push(svgEl.rect({ x: cx, y: cy - 11, width: 20, height: 15, rx: 3, fill: colour }));
    out.push(
      svgEl.text(String(s + 1), {
        x: cx + 10,
        y: cy,
        'text-anchor': 'middle',
        'font-size': 10.5,
        'font-weight': 700,
        fill: textOn(colour),
      }),
    );
    out.push(svgEl.text(label.length > 28 ? label.slice(0, 27) + '…' : label, { x: cx + 25, y: cy, 'font-size': 11.5, fill: INK.text }));
    cx += w;
  }
  return out;
}

/** An HTML swatch with the segment number on it. */
export function htmlSwatch(s: number): string {
  const colour = segmentColour(s);
  return `<span class="ks-swatch" style="background:${colour};color:${textOn(colour)}">${s + 1}</span>`;
}

/**
 * Plotly reads text as a small markup language: data strings are escaped before they go in,
 * quotes as numeric references (plotly decodes those, but shows &quot; literally).
 */
export function plotText(value: unknown): string {
  return String(value ?? '').replace(/[&<>"'`]/g, (c) => `&#${c.charCodeAt(0)};`);
}

export function axisStyle(title: string, extra: object = {}): object {
  return {
    title: { text: plotText(title), font: { size: 12.5, color: INK.text } },
    gridcolor: INK.grid,
    zerolinecolor: INK.axis,
    linecolor: INK.axis,
    tickfont: { size: 11, color: INK.muted },
    automargin: true,
    ...extra,
  };
}

export function baseLayout(height: number, extra: object = {}): object {
  return {
    height,
    margin: { l: 64, r: 24, t: 16, b: 56 },
    paper_bgcolor: INK.paper,
    plot_bgcolor: INK.panel,
    font: { family: "system-ui, -apple-system, 'Segoe UI', sans-serif", color: INK.text },
    hoverlabel: { bgcolor: '#ffffff', bordercolor: INK.axis, font: { color: INK.text } },
    legend: { orientation: 'h', y: -0.18, x: 0 },
    ...extra,
  };
}

/** Names per segment from an optional record keyed 1..k. */
export function namesFrom(k: number, names?: Readonly<Record<number, string>>): (string | undefined)[] {
  return Array.from({ length: k }, (_, s) => names?.[s + 1]);
}

/** A name shortened to at most `max` characters, cut at a word where it can, with an ellipsis
 *  so a reader sees it was cut ("Weekday peak…", never "Weekday peak commu"). */
export function shortName(name: string, max: number): string {
  if (name.length <= max) return name;
  const room = name.slice(0, max - 1);
  const space = room.lastIndexOf(' ');
  return (space >= max / 2 ? room.slice(0, space) : room).trimEnd() + '…';
}

/** "every second", "every third", "every 21st" … for notes on thinned pictures. */
export function everyNth(n: number): string {
  if (n === 2) return 'every second';
  if (n === 3) return 'every third';
  const teen = n % 100 >= 11 && n % 100 <= 13;
  const suffix = teen ? 'th' : n % 10 === 1 ? 'st' : n % 10 === 2 ? 'nd' : n % 10 === 3 ? 'rd' : 'th';
  return `every ${n}${suffix}`;
}
