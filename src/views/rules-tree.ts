// The rule tree drawn: the root at the top, each branch labelled with its condition, leaves as
// boxes in their segment's colour with the segment number, rows and purity. Long conditions wrap;
// the whole condition is in the branch's tooltip.
import { refuse } from './common';
import { INK, segmentColour, textOn } from './palette';
import { svgDocument, svgEl } from './svg';
import { makeView, type View } from './view';

export interface DrawnRuleNode {
  readonly size: number;
  /** Segment the node predicts, 1..k. */
  readonly segment: number;
  readonly purity: number;
  /** Left then right branch, each with its condition as text. */
  readonly branches?: readonly [
    { readonly label: string; readonly node: DrawnRuleNode },
    { readonly label: string; readonly node: DrawnRuleNode },
  ];
}

const LEAF_WIDTH = 128;
const LEVEL_HEIGHT = 112;
const MAX_LEAVES = 64;

function wrap(text: string, width: number, lines: number): string[] {
  const words = text.split(' ');
  const out: string[] = [];
  let line = '';
  for (const w of words) {
    if ((line + ' ' + w).trim().length > width && line) {
      out.push(line);
      line = w;
    } else line = (line + ' ' + w).trim();
  }
  if (line) out.push(line);
  if (out.length > lines) {
    const kept = out.slice(0, lines);
    kept[lines - 1] = kept[lines - 1].slice(0, width - 1) + '…';
    return kept;
  }
  return out;
}

export function rulesTreeView(root: DrawnRuleNode, options: { title?: string; names?: Readonly<Record<number, string>> } = {}): View {
  const leaves: DrawnRuleNode[] = [];
  let depth = 0;
  const walk = (n: DrawnRuleNode, d: number) => {
    depth = Math.max(depth, d);
    if (n.branches) n.branches.forEach((b) => walk(b.node, d + 1));
    else leaves.push(n);
  };
  walk(root, 0);
  if (leaves.length > MAX_LEAVES)
    refuse('rulesTreeView', `${leaves.length} leaves are more than ${MAX_LEAVES} a drawing can hold; read the rules list instead.`);
  const margin = 16;
  const width = Math.max(360, leaves.length * LEAF_WIDTH + 2 * margin);
  const height = 40 + depth * LEVEL_HEIGHT + 70;
  const body: string[] = [];
  let next = 0;
  // Returns the node's centre x; draws children first so lines sit under the boxes.
  const place = (n: DrawnRuleNode, d: number): number => {
    const y = 24 + d * LEVEL_HEIGHT;
    if (!n.branches) {
      const x = margin + (next++ + 0.5) * LEAF_WIDTH;
      const fill = segmentColour(n.segment - 1);
      const name = options.names?.[n.segment];
      const label = name ? `${n.segment} · ${name}` : `Segment ${n.segment}`;
      body.push(
        svgEl.group(
          [
            svgEl.rect({ x: x - LEAF_WIDTH / 2 + 6, y, width: LEAF_WIDTH - 12, height: 46, rx: 7, fill }),
            svgEl.text(label.length > 15 ? label.slice(0, 14) + '…' : label, {
              x,
              y: y + 17,
              'text-anchor': 'middle',
              'font-size': 11.5,
              'font-weight': 700,
              fill: textOn(fill),
            }),
            svgEl.text(`${n.size.toLocaleString('en-US')} rows · ${Math.round(100 * n.purity)}%`, {
              x,
              y: y + 35,
              'text-anchor': 'middle',
              'font-size': 11,
              fill: textOn(fill),
            }),
          ],
          {},
          `${label}: ${n.size} rows, ${(100 * n.purity).toFixed(1)}% in this segment`,
        ),
      );
      return x;
    }
    const xs = n.branches.map((b) => place(b.node, d + 1));
    const x = (xs[0] + xs[1]) / 2;
    const childY = y + LEVEL_HEIGHT;
    n.branches.forEach((b, i) => {
      const cx = xs[i];
      body.push(svgEl.path(`M${x},${y + 30}V${y + 44}H${cx}V${childY}`, { fill: 'none', stroke: INK.axis, 'stroke-width': 1.4 }));
      // Centred on the child's line, no wider than a leaf, so neighbours never overlap; a white
      // halo keeps the line from crossing the words.
      const lines = wrap(b.label.replace(/ ([<≥≤]) /g, ' $1\u00a0'), 19, 3);
      const texts = lines.map((line, t) =>
        svgEl.text(line, {
          x: cx,
          y: y + 60 + t * 12.5,
          'text-anchor': 'middle',
          'font-size': 10.5,
          fill: INK.text,
          stroke: INK.paper,
          'stroke-width': 4,
          'paint-order': 'stroke',
          'stroke-linejoin': 'round',
        }),
      );
      body.push(svgEl.group(texts, {}, b.label));
    });
    body.push(svgEl.rect({ x: x - 42, y, width: 84, height: 30, rx: 6, fill: INK.panel, stroke: INK.grid }));
    body.push(
      svgEl.text(`${n.size.toLocaleString('en-US')} rows`, { x, y: y + 19, 'text-anchor': 'middle', 'font-size': 11, fill: INK.muted }),
    );
    return x;
  };
  place(root, 0);
  const title = options.title ?? `The rule tree: ${leaves.length} leaves, depth ${depth}`;
  return makeView({
    kind: 'rule-tree',
    title,
    caption:
      'Read from the top: each branch is labelled with the condition a row meets to take it; the coloured boxes are the ' +
      'leaves, with the segment they give, their training rows and the share of those rows in that segment.',
    still: svgDocument(width, height, title, body),
  });
}
