// The fluent hierarchy: a tree that knows its ids and prepared data, draws its dendrogram and
// cuts into the same Segmentation that k-means gives.
import { checkOptions } from '../core/options';
import { KinsortError } from '../core/errors';
import type { PreparedData } from '../prepare';
import type { Tree, CutSpec } from '../methods/hierarchy';
import type { Dissimilarity } from '../measure/condensed';
import { dissimilarity } from '../measure/dissimilarity';
import { dendrogramView, heatmapView, HEATMAP_MAX_ROWS, type View } from '../views';
import { Segmentation } from './segmentation';
import { segmentMeans } from './centres';
import { installWrongStepGuards, SEGMENTATION_CALLS, type CutTheTreeFirst } from './wrong-step';

export class Hierarchy {
  readonly tree: Tree;
  readonly data: PreparedData;
  /** The dissimilarity the tree was built on, when it was built on one. */
  readonly dissimilarity?: Dissimilarity;
  private readonly options: Record<string, unknown>;

  // Segment calls asked of the uncut tree: typed as markers, they throw saying to cut first.
  declare readonly name: CutTheTreeFirst;
  declare readonly names: CutTheTreeFirst;
  declare readonly cards: CutTheTreeFirst;
  declare readonly projection: CutTheTreeFirst;
  declare readonly silhouette: CutTheTreeFirst;
  declare readonly stability: CutTheTreeFirst;
  declare readonly profiles: CutTheTreeFirst;
  declare readonly compare: CutTheTreeFirst;
  declare readonly writeUp: CutTheTreeFirst;
  declare readonly definition: CutTheTreeFirst;
  declare readonly assign: CutTheTreeFirst;
  declare readonly members: CutTheTreeFirst;
  declare readonly segmentOf: CutTheTreeFirst;
  declare readonly rules: CutTheTreeFirst;

  constructor(tree: Tree, data: PreparedData, options: Record<string, unknown>, used?: Dissimilarity) {
    this.tree = tree;
    this.data = data;
    this.options = options;
    this.dissimilarity = used;
  }

  get merges(): Tree['merges'] {
    return this.tree.merges;
  }

  /** Leaves in drawing order, as ids. */
  get order(): string[] {
    return this.tree.order.map((i) => this.data.ids[i]);
  }

  get monotonic(): Tree['monotonic'] {
    return this.tree.monotonic;
  }

  /** Pearson correlation between cophenetic heights and the original dissimilarities. */
  copheneticCorrelation(): number {
    return this.dissimilarity ? this.tree.copheneticCorrelation(this.dissimilarity) : this.tree.copheneticCorrelation();
  }

  /** Cut into exactly k segments, or at a height; the result works like any other segmentation. */
  cut(spec: CutSpec): Segmentation {
    const assignment = this.tree.cut(spec);
    let k = 0;
    for (let i = 0; i < assignment.length; i++) if (assignment[i] + 1 > k) k = assignment[i] + 1;
    const { centers, withinSS } = segmentMeans(this.data.matrix, assignment, k);
    return new Segmentation({
      method: 'hierarchy',
      options: { ...this.options, ...spec, k },
      assignment,
      centers,
      fit: this.tree,
      objective: { name: 'withinSS', value: withinSS },
      data: this.data,
      dissimilarity: this.dissimilarity,
    });
  }

  /** The dendrogram, coloured by a cut when `k` or `height` is given, leaves labelled by id. */
  dendrogram(options: { k?: number; height?: number; labelled?: number; branches?: number; branch?: number; title?: string } = {}): View {
    const opts = checkOptions(options, ['k', 'height', 'labelled', 'branches', 'branch', 'title'], 'dendrogram');
    const t = this.tree;
    const drawn = {
      kind: t.kind,
      size: t.size,
      method: t.method,
      merges: t.merges,
      order: t.order,
      labels: this.data.ids,
      cut: (c: CutSpec) => t.cut(c),
    };
    return dendrogramView(drawn, opts);
  }

  /** The dissimilarity matrix as a heatmap, rows in dendrogram order. */
  heatmap(options: { k?: number; title?: string } = {}): View {
    const opts = checkOptions(options, ['k', 'title'], 'heatmap');
    const n = this.data.ids.length;
    if (n > HEATMAP_MAX_ROWS) {
      throw new KinsortError(
        `heatmap: ${n} rows are too many to draw as ${n}² cells (at most ${HEATMAP_MAX_ROWS}); use the projection or the dendrogram, or a hierarchy of a sample.`,
        'too-large',
      );
    }
    const d = this.dissimilarity ?? dissimilarity(this.data.matrix, { metric: (this.options.metric as 'euclidean') ?? 'euclidean' });
    const assignment = opts.k === undefined ? undefined : this.tree.cut({ k: opts.k });
    return heatmapView(d, { order: this.tree.order, labels: this.data.ids, assignment, title: opts.title });
  }
}

installWrongStepGuards(
  Hierarchy.prototype,
  SEGMENTATION_CALLS,
  (name, tree) =>
    `${name}: a hierarchy is a tree of ${tree.data.ids.length} rows, not yet segments. Cut it first, ` +
    `then ask the segmentation: tree.cut({ k: 4 }).${name}(…) for a number of segments, or ` +
    `tree.cut({ height: … }).${name}(…) at a height (tree.dendrogram() shows the heights).`,
);
