// seg.rules(): the segmentation's training rows, their original cells for the chosen columns and
// the segment titles, handed to fitRules; the result draws itself as the list of rules.
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import type { PreparedData } from '../prepare';
import { fitRules, type RulesOptions, type SegmentRules } from '../segments/rules';
import { specFromCells } from '../segments/rules-columns';
import { rulesTreeView, rulesView, type View } from '../views';
import { labelledTree } from '../segments/rules-text';
import { showable, type Showable } from './showable';

export interface SegmentRulesOptions extends RulesOptions {
  /** Columns the rules may use (default: the used columns; kept columns may be named too). */
  columns?: readonly string[];
}

export function segmentRules(
  data: PreparedData,
  assignment: Int32Array,
  k: number,
  titles: Readonly<Record<number, string>>,
  options: SegmentRulesOptions,
): SegmentRules & Showable & { drawTree(): View } {
  const opts = checkOptions(options, ['depth', 'minLeaf', 'minSplit', 'columns'], 'rules');
  const prepared = new Map(data.preparation.columns.map((c) => [c.name, c]));
  const names = opts.columns ?? [...data.preparation.columns.map((c) => c.name)];
  const available = Object.keys(data.profile.columns);
  const specs = names.map((name) => {
    const cells = data.profile.columns[name];
    if (!cells) {
      throw new KinsortError(`rules: no column "${name}" among the used and kept columns (${available.join(', ')}).`, 'unknown-column');
    }
    const declared = prepared.get(name);
    return specFromCells(
      name,
      cells,
      declared ? { type: declared.type, levels: declared.levels } : undefined,
      data.preparation.decimalMark,
    );
  });
  const { depth, minLeaf, minSplit } = opts;
  const result = fitRules(
    { specs, cells: names.map((n) => data.profile.columns[n]), assignment, k, titles, ids: data.ids },
    { depth, minLeaf, minSplit },
  );
  const notes = [
    `Depth ${result.tree.depth}, at least ${result.tree.minLeaf} rows per leaf; splits that change no row's segment are pruned.`,
    'A missing value, or a level the rules never saw, follows the branch that held more training rows.',
  ];
  const withTree = Object.assign(result, {
    /** The rule tree drawn, branches labelled with their conditions, leaves coloured by segment. */
    drawTree: (): View => rulesTreeView(labelledTree(result.tree.root, result.columns), { names: titles }),
  });
  return showable(withTree, () => rulesView(result, { notes }));
}
