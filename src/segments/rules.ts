// Rules that say who is in each segment: a shallow CART tree fitted to predict the segment from
// the original, unscaled columns, read out as one rule per leaf, with how often the rules agree
// with the segmentation, applied to new rows in memory or as one SQL CASE.
import { KinsortError } from '../core/errors';
import { checkOptions } from '../core/options';
import { readTable } from '../table/read';
import type { Cell } from '../table/types';
import { classificationTree, leafOf, type ClassificationTreeOptions, type RuleTree } from '../methods/rules';
import { codeCells, ruleColumn, type RuleColumnSpec } from './rules-columns';
import { leafPaths, ruleText, type RuleCondition } from './rules-text';
import { rulesSql, type RulesSqlOptions } from './rules-sql';

export interface SegmentRule {
  /** Segment the leaf gives, 1..k as printed. */
  readonly segment: number;
  /** The segment's title when one was given. */
  readonly title?: string;
  readonly conditions: readonly RuleCondition[];
  /** The conditions as one line, e.g. "trips_per_week ≥ 9.5 and peak_share < 0.62". */
  readonly text: string;
  /** The whole rule in words: "trips_per_week ≥ 9.5 and peak_share < 0.62 → segment 2 (Weekday commuters)". */
  readonly sentence: string;
  /** Training rows in the leaf. */
  readonly size: number;
  /** Share of the leaf's rows that are in `segment`. */
  readonly purity: number;
  /** Leaf number in the tree (root 1, children 2n, 2n + 1). */
  readonly leaf: number;
}

export interface RulesAgreement {
  /** Share of all training rows whose segment the rules give. */
  readonly overall: number;
  /** Per segment 1..k (index 0 is segment 1): share of its rows the rules give to it. */
  readonly bySegment: readonly number[];
}

export interface SegmentRules {
  readonly kind: 'segment-rules';
  /** One rule per leaf, leaves left to right. */
  readonly rules: readonly SegmentRule[];
  readonly agreement: RulesAgreement;
  readonly columns: readonly RuleColumnSpec[];
  readonly tree: RuleTree;
  readonly k: number;
  /** The segment (1..k) the rules give to each row of records, a CSV text or a table; one per row, in order. */
  apply(rows: unknown): number[];
  /** One SELECT giving each row's segment by the same rules, in portable SQL. */
  toSql(options: RulesSqlOptions): string;
}

export interface RulesTraining {
  readonly specs: readonly RuleColumnSpec[];
  /** Raw training cells per column, same order as `specs`. */
  readonly cells: readonly (readonly Cell[])[];
  /** 0-based segment of each training row. */
  readonly assignment: Int32Array;
  readonly k: number;
  readonly titles?: Readonly<Record<number, string>>;
  readonly ids?: readonly string[];
}

export type RulesOptions = ClassificationTreeOptions;

export function fitRules(training: RulesTraining, options: RulesOptions = {}, where = 'rules'): SegmentRules {
  const opts = checkOptions(options, ['depth', 'minLeaf', 'minSplit'], where);
  const { specs, assignment, k } = training;
  const rowName = (i: number) => (training.ids ? `row ${i + 1} (id "${training.ids[i]}")` : `row ${i + 1}`);
  const columns = specs.map((s, j) => ruleColumn(s, codeCells(s, training.cells[j], where, rowName)));
  const tree = classificationTree(columns, assignment, opts);
  const bySpec = new Map(specs.map((s) => [s.name, s]));
  const rules: SegmentRule[] = leafPaths(tree.root, specs).map(({ leaf, conditions }) => {
    const segment = leaf.prediction + 1;
    const title = training.titles?.[segment];
    const text = ruleText(conditions, bySpec);
    return {
      segment,
      ...(title ? { title } : {}),
      conditions,
      text,
      sentence: `${text} → segment ${segment}${title ? ` (${title})` : ''}`,
      size: leaf.size,
      purity: leaf.size ? leaf.counts[leaf.prediction] / leaf.size : 0,
      leaf: leaf.id,
    };
  });

  const hits = new Array<number>(k).fill(0);
  const sizes = new Array<number>(k).fill(0);
  let agree = 0;
  for (let i = 0; i < assignment.length; i++) {
    const s = assignment[i];
    sizes[s]++;
    if (leafOf(tree, (j) => columns[j].values[i]).prediction === s) {
      hits[s]++;
      agree++;
    }
  }
  const agreement = { overall: agree / assignment.length, bySegment: hits.map((h, s) => (sizes[s] ? h / sizes[s] : 0)) };

  const apply = (input: unknown): number[] => {
    const table = readTable(input);
    const coded = specs.map((spec) => {
      const column = table.columns.find((c) => c.name === spec.name);
      if (!column) {
        throw new KinsortError(`${where}.apply: the rows have no column "${spec.name}", which the rules read.`, 'unknown-column');
      }
      return codeCells(spec, column.values, `${where}.apply`, (i) => `row ${i + 1}`);
    });
    const out: number[] = new Array(table.rowCount);
    for (let i = 0; i < table.rowCount; i++) out[i] = leafOf(tree, (j) => coded[j][i]).prediction + 1;
    return out;
  };

  return {
    kind: 'segment-rules',
    rules,
    agreement,
    columns: specs,
    tree,
    k,
    apply,
    toSql: (sqlOptions: RulesSqlOptions) => rulesSql(rules, sqlOptions),
  };
}
