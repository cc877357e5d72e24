// The fluent variable tree: a hierarchy of the prepared study's columns that draws its
// dendrogram (variable names as leaves) and its correlation grid in tree order, summarises the
// groups of a cut and hands back the representatives to use in a new preparation.
import { checkOptions } from '../core/options';
import type { CutSpec } from '../methods/hierarchy';
import type { VariableGroup, VariableTree } from '../methods/variables';
import { correlationHeatmapView, dendrogramView, variableGroupsView, type View } from '../views';
import { showable, type Showable } from './showable';

export interface LeftOutColumn {
  readonly name: string;
  readonly reason: string;
}

export class VariableHierarchy {
  constructor(
    readonly tree: VariableTree,
    /** Used columns that could not enter (unordered categorical), with the reason. */
    readonly leftOut: readonly LeftOutColumn[],
    /** How each column entered (numeric, binary 0/1, ordinal ranks), leaf order of the tree. */
    readonly entered: readonly string[] = tree.entered,
  ) {}

  get names(): readonly string[] {
    return this.tree.names;
  }

  /** Variable names in drawing order. */
  get order(): string[] {
    return this.tree.order.map((i) => this.tree.names[i]);
  }

  /** Group (1-based) of every variable, by name. */
  cut(spec: CutSpec): Record<string, number> {
    const a = this.tree.cut(spec);
    const out: Record<string, number> = {};
    this.tree.names.forEach((name, j) => (out[name] = a[j] + 1));
    return out;
  }

  /** Members, first-component share and representative of each group of a cut; `.show()` draws the table. */
  groups(spec: CutSpec): VariableGroup[] & Showable {
    const groups = this.tree.groups(spec);
    return showable(groups, () => variableGroupsView(groups, { notes: this.notes() }));
  }

  /** One variable per group of the cut (the smallest 1 − R² ratio), in input column order. */
  representatives(spec: CutSpec): string[] {
    const chosen = new Set(this.tree.groups(spec).map((g) => g.representative));
    return this.tree.names.filter((n) => chosen.has(n));
  }

  /** The dendrogram with the variable names as leaves, coloured by a cut when k or height is given. */
  dendrogram(options: { k?: number; height?: number; orientation?: 'upright' | 'lying'; title?: string } = {}): View {
    const opts = checkOptions(options, ['k', 'height', 'orientation', 'title'], 'dendrogram');
    const t = this.tree;
    const what = t.strength === 'squared' ? `1 − ${t.similarity} r²` : `1 − |${t.similarity} r|`;
    return dendrogramView(
      { kind: 'tree', size: t.size, method: t.method, merges: t.merges, order: t.order, labels: t.names, cut: (c) => t.cut(c) },
      { ...opts, title: opts.title ?? `Which variables go together (${what}, ${t.method} linkage)` },
    );
  }

  /** Signed correlations in tree order, groups of a cut framed when k or height is given. */
  heatmap(options: { k?: number; height?: number; title?: string } = {}): View {
    const opts = checkOptions(options, ['k', 'height', 'title'], 'heatmap');
    const spec = opts.k !== undefined ? { k: opts.k } : opts.height !== undefined ? { height: opts.height } : undefined;
    const t = this.tree;
    return correlationHeatmapView(
      { names: t.names, correlation: t.correlation, order: t.order },
      {
        assignment: spec ? t.cut(spec) : undefined,
        similarity: t.similarity === 'pearson' ? 'Pearson' : 'Spearman',
        title: opts.title,
        notes: this.notes(),
      },
    );
  }

  /** Columns left out and how the others entered, as plain sentences for the views. */
  private notes(): string[] {
    const out = this.leftOut.map((c) => `Left out: ${c.name} (${c.reason}).`);
    this.entered.forEach((how, j) => {
      if (how !== 'numeric') out.push(`${this.tree.names[j]} entered as ${how}.`);
    });
    return out;
  }
}
