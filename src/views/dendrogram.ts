// Dendrogram, lying down: the root on the left, leaves down the right edge, each label printed
// right beside its own leaf, one line per leaf, so names never overlap and never sit far from what
// they name. Segments of a cut are shown as tinted bands behind their leaves with a numbered tab;
// the branches stay in ink (no colour code per branch). Past `labelled` leaves, the top of the
// tree is drawn down to `branches` branches, each marked with its member count and segment;
// `branch: j` draws branch j of that picture on its own (and so on down). Plain SVG: it reads the
// same with scripts off, and hovering a branch names its size.
import { compactLabels } from '../core/assignment';
import { checkInteger, checkNumber, checkOptions } from '../core/options';
import { kindOf, refuse, shortName, svgLegend } from './common';
import { INK, segmentColour, textOn } from './palette';
import { linearScale, niceTicks, formatTick, pathData, svgDocument, svgEl } from './svg';
import { makeView, View } from './view';

export interface DendrogramTree {
  readonly kind: 'tree';
  readonly size: number;
  readonly method?: string;
  readonly merges: readonly { left: number; right: number; height: number; size: number }[];
  readonly order: readonly number[];
  readonly labels?: readonly string[];
  cut(spec: { k: number } | { height: number }): Int32Array;
}

export interface DendrogramOptions {
  /** Mark a cut into k segments. */
  k?: number;
  /** Mark a cut at this height. */
  height?: number;
  /** Leaf labels (default: the tree's labels, else row numbers). */
  labels?: readonly string[];
  /** Most leaves drawn one by one, each labelled (default 80). */
  labelled?: number;
  /** Past `labelled` leaves, how many branches the top of the tree is drawn down to (default 24). */
  branches?: number;
  /** Draw only this branch (1-based, as numbered in the picture of the top of the tree). */
  branch?: number;
  title?: string;
}

const LINK = '#4b5563';
const ROW = 15;

/** A place on the leaf axis: a real leaf, or a whole branch drawn as one row. */
interface Tip {
  node: number;
  size: number;
  /** Segment of every row under it, or -1 when it spans several (or there is no cut). */
  segment: number;
  /** Branch number (1-based) when it stands for a branch. */
  branch?: number;
}

export function dendrogramView(tree: DendrogramTree, options: DendrogramOptions = {}): View {
  const where = 'dendrogramView';
  const opts = checkOptions(options, ['k', 'height', 'labels', 'labelled', 'branches', 'branch', 'title'], where);
  if (!tree || (tree as { kind?: string }).kind !== 'tree' || !Array.isArray(tree.merges)) {
    refuse(
      where,
      `a dendrogram needs a tree from agglomerate(), but got ${kindOf(tree)}. ` +
        `Build one first, e.g. agglomerate(rows, { method: 'ward' }), then ask for its dendrogram; ` +
        `for a k-means or k-medoids result use projectionView or profileCardsView instead.`,
    );
  }
  const n = tree.size;
  if (opts.k !== undefined && opts.height !== undefined) refuse(where, 'give either k or height for the cut, not both.');
  if (opts.labels !== undefined && opts.labels.length !== n) refuse(where, `${opts.labels.length} labels for ${n} leaves.`);
  const labelled = opts.labelled === undefined ? 80 : checkInteger(opts.labelled, 'dendrogramView labelled', 2);
  const branches = opts.branches === undefined ? 24 : checkInteger(opts.branches, 'dendrogramView branches', 2);
  let assignment: Int32Array | undefined;
  let cutHeight: number | undefined;
  const heights = tree.merges.map((m) => m.height);
  if (opts.k !== undefined) {
    const k = checkInteger(opts.k, 'dendrogramView k', 1, n);
    assignment = tree.cut({ k });
    // The cut sits between the last merge kept and the first one undone.
    if (k > 1) cutHeight = (heights[n - 1 - k] ?? 0) / 2 + heights[n - k] / 2;
  } else if (opts.height !== undefined) {
    cutHeight = checkNumber(opts.height, 'dendrogramView height');
    assignment = tree.cut({ height: cutHeight });
  }
  const k = assignment ? compactLabels(assignment, n, where).k : 0;
  const labels = (opts.labels ?? tree.labels ?? Array.from({ length: n }, (_, i) => `row ${i + 1}`)).map(String);
  const nodes = 2 * n - 1;
  const child = (node: number) => tree.merges[node - n];
  const seg = new Int32Array(nodes).fill(-1);
  const size = new Int32Array(nodes).fill(1);
  for (let i = 0; i < n; i++) seg[i] = assignment ? assignment[i] : -1;
  tree.merges.forEach((m, i) => {
    seg[n + i] = seg[m.left] >= 0 && seg[m.left] === seg[m.right] ? seg[m.left] : -1;
    size[n + i] = m.size;
  });
  const heightOf = (node: number) => (node < n ? 0 : heights[node - n]);

  // The top of the tree down to `branches` branches (whole tree, or the branch asked for).
  const top = (root: number): { tips: Tip[]; inner: Set<number> } => {
    const inner = new Set<number>();
    if (size[root] > labelled) {
      // Undo the highest joins under root until `branches` groups are left.
      const open = [root];
      while (open.length < branches) {
        let best = -1;
        for (let i = 0; i < open.length; i++) if (open[i] >= n && (best < 0 || open[i] > open[best])) best = i;
        if (best < 0) break;
        const node = open.splice(best, 1)[0];
        inner.add(node);
        open.push(child(node).left, child(node).right);
      }
    }
    const tips: Tip[] = [];
    const walk = (node: number) => {
      if (node >= n && (inner.has(node) || size[root] <= labelled)) {
        walk(child(node).left);
        walk(child(node).right);
      } else tips.push({ node, size: size[node], segment: seg[node] });
    };
    walk(root);
    if (size[root] > labelled) tips.forEach((t, i) => (t.branch = i + 1));
    return { tips, inner };
  };

  let root = nodes - 1;
  let scope = '';
  if (opts.branch !== undefined) {
    const whole = top(nodes - 1);
    if (whole.tips.length === 0 || whole.tips[0].branch === undefined) {
      refuse(where, `branch: the whole tree (${n} leaves) is drawn leaf by leaf; branches are numbered only past ${labelled} leaves.`);
    }
    const j = checkInteger(opts.branch, 'dendrogramView branch', 1, whole.tips.length);
    root = whole.tips[j - 1].node;
    scope = `branch ${j} of ${whole.tips.length} (${size[root]} row${size[root] === 1 ? '' : 's'})`;
  }
  const { tips } = top(root);
  const collapsed = tips.some((t) => t.branch !== undefined);

  const title =
    opts.title ??
    `Dendrogram${tree.method ? ` (${tree.method} linkage)` : ''}${k ? `, cut into ${k} segments` : ''}${scope ? `: ${scope}` : ''}`;
  const caption =
    'Rows join where their branches meet: the further left the join, the less alike the groups it joins. ' +
    (k ? 'Tinted bands with numbered tabs are the segments of the cut (the vertical line). ' : '') +
    (collapsed
      ? `The top of the tree is drawn down to ${tips.length} branches, each with its number of rows.`
      : 'Each leaf is labelled beside it.');
  const notes = collapsed
    ? [
        `${size[root]} rows are too many to label one by one (more than ${labelled}): draw one branch with dendrogram({ branch: j${k ? `, k: ${k}` : ''} }), or give labelled: a larger number.`,
      ]
    : [];
  const still = draw(tips, root, child, heightOf, labels, cutHeight, k, title, size);
  return makeView({ kind: 'dendrogram', title, caption, still, notes });
}

function draw(
  tips: Tip[],
  root: number,
  child: (node: number) => { left: number; right: number; height: number },
  heightOf: (node: number) => number,
  labels: string[],
  cutHeight: number | undefined,
  k: number,
  title: string,
  size: Int32Array,
): string {
  const tipText = (t: Tip): string =>
    t.branch === undefined
      ? labels[t.node]
      : `branch ${t.branch} · ${t.size === 1 ? labels[t.node] : `${t.size.toLocaleString('en-US')} rows`}${t.segment >= 0 ? ` · segment ${t.segment + 1}` : ''}`;
  const texts = tips.map((t) => shortName(tipText(t), 40));
  const longest = Math.max(8, ...texts.map((s) => s.length));
  const width = 760;
  const labelRoom = Math.min(300, 14 + longest * 6.4);
  const bandTab = k ? 26 : 0;
  const left = 44;
  const right = width - labelRoom - bandTab;
  const topY = 34;
  const bottom = topY + tips.length * ROW;
  const legendRoom = k ? 34 : 0;
  const height = bottom + 48 + legendRoom;
  const maxHeight = heightOf(root) || 1;
  const x = linearScale([maxHeight * 1.03, 0], [left, right]);
  const y = (i: number) => topY + (i + 0.5) * ROW;
  const body: string[] = [svgEl.rect({ x: left, y: topY, width: right - left, height: bottom - topY, fill: INK.panel })];
  for (const t of niceTicks(0, maxHeight * 1.03, 6)) {
    body.push(svgEl.line({ x1: x(t), x2: x(t), y1: topY, y2: bottom, stroke: INK.grid }));
    body.push(svgEl.text(formatTick(t), { x: x(t), y: bottom + 15, 'text-anchor': 'middle', 'font-size': 11, fill: INK.muted }));
  }
  body.push(
    svgEl.text('height (dissimilarity at which groups join)', {
      x: (left + right) / 2,
      y: bottom + 34,
      'text-anchor': 'middle',
      'font-size': 12,
      fill: INK.text,
    }),
  );

  // Segment bands: one per run of consecutive tips in one segment, behind the leaves and labels.
  if (k) {
    let start = 0;
    for (let i = 1; i <= tips.length; i++) {
      if (i < tips.length && tips[i].segment === tips[start].segment) continue;
      const s = tips[start].segment;
      if (s >= 0) {
        const colour = segmentColour(s);
        const y0 = topY + start * ROW;
        const h = (i - start) * ROW;
        const bx = cutHeight === undefined ? right - 30 : Math.max(left, x(cutHeight));
        body.push(svgEl.rect({ x: bx, y: y0 + 1, width: width - bx, height: h - 2, fill: colour, 'fill-opacity': 0.13 }));
        body.push(svgEl.rect({ x: right + 2, y: y0 + 1, width: 20, height: h - 2, rx: 3, fill: colour }));
        body.push(
          svgEl.text(String(s + 1), {
            x: right + 12,
            y: y0 + h / 2 + 4,
            'text-anchor': 'middle',
            'font-size': 11,
            'font-weight': 700,
            fill: textOn(colour),
          }),
        );
      }
      start = i;
    }
  }

  // Positions: tips in order; each join at the mean of its two children.
  const pos = new Map<number, number>();
  tips.forEach((t, i) => pos.set(t.node, i));
  const drawn = (node: number): number => {
    if (pos.has(node)) return pos.get(node)!;
    const m = child(node);
    const p = (drawn(m.left) + drawn(m.right)) / 2;
    // A leaf starts at height 0, a join or a whole branch at its own height.
    const place = (c: number): [number, number] => [x(heightOf(c)), y(pos.get(c)!)];
    const a = place(m.left);
    const b = place(m.right);
    body.push(
      svgEl.group(
        [svgEl.path(pathData([a, [x(m.height), a[1]], [x(m.height), b[1]], b]), { fill: 'none', stroke: LINK, 'stroke-width': 1.3 })],
        {},
        `${size[node].toLocaleString('en-US')} rows join at height ${formatTick(m.height)}`,
      ),
    );
    pos.set(node, p);
    return p;
  };
  drawn(root);
  // A branch drawn as one row: a wedge from its own join down to height 0, its size written beside.
  tips.forEach((t, i) => {
    if (t.branch === undefined) return;
    const h = heightOf(t.node);
    const half = Math.min(ROW / 2 - 2, 2 + Math.log10(t.size + 1) * 1.6);
    body.push(
      svgEl.group(
        [
          svgEl.path(
            pathData(
              [
                [x(h), y(i)],
                [x(0), y(i) - half],
                [x(0), y(i) + half],
              ],
              true,
            ),
            { fill: LINK, 'fill-opacity': 0.55 },
          ),
        ],
        {},
        `branch ${t.branch}: ${t.size} rows`,
      ),
    );
  });
  // Labels right beside their leaves.
  tips.forEach((t, i) => {
    body.push(
      svgEl.group([svgEl.text(texts[i], { x: right + bandTab + 6, y: y(i) + 4, 'font-size': 11, fill: INK.text })], {}, tipText(t)),
    );
  });
  if (cutHeight !== undefined && cutHeight <= maxHeight * 1.03) {
    body.push(svgEl.line({ x1: x(cutHeight), x2: x(cutHeight), y1: topY - 8, y2: bottom, stroke: INK.accent, 'stroke-width': 1.4 }));
    body.push(
      svgEl.text(`cut: ${k} segments`, { x: x(cutHeight), y: topY - 12, 'text-anchor': 'middle', 'font-size': 11, fill: INK.accent }),
    );
  }
  if (k) body.push(...svgLegend(k, left, height - 14, undefined, width - left - 10));
  return svgDocument(width, height, title, body);
}
