// One readable rule per leaf: the conditions on the path from the root, in the column's own
// units and level names, with "(or missing)" where missing values follow that branch.
import type { RuleSplit, RuleTreeNode } from '../methods/rules';
import type { RuleColumnSpec } from './rules-columns';

/**
 * One condition of a rule. `below` / `atLeast`: a number compared with `value`. `oneOf`: the level
 * is one of `levels`. `noneOf`: the level is not one of `levels` (the branch that also takes
 * levels the tree never saw there); `shown` lists the levels seen on this branch, for reading.
 * `orMissing`: rows without a value satisfy it too.
 */
export type RuleCondition =
  | { readonly column: string; readonly test: 'below' | 'atLeast'; readonly value: number; readonly orMissing: boolean }
  | { readonly column: string; readonly test: 'oneOf'; readonly levels: readonly string[]; readonly orMissing: false }
  | {
      readonly column: string;
      readonly test: 'noneOf';
      readonly levels: readonly string[];
      readonly shown: readonly string[];
      readonly orMissing: true;
    };

/** The condition a row meets to take one branch of a split. */
export function branchCondition(split: RuleSplit, spec: RuleColumnSpec, left: boolean): RuleCondition {
  const missingHere = split.missingGoesLeft === left;
  if (split.kind === 'threshold' && spec.kind === 'numeric') {
    return { column: spec.name, test: left ? 'below' : 'atLeast', value: split.threshold, orMissing: missingHere };
  }
  // Levels: ordinal thresholds are ranks; categorical splits name their sides.
  const names = (codes: readonly number[]) => codes.map((c) => spec.levels![c]);
  let leftLevels: string[];
  let rightLevels: string[];
  if (split.kind === 'threshold') {
    leftLevels = spec.levels!.filter((_, rank) => rank < split.threshold);
    rightLevels = spec.levels!.filter((_, rank) => rank > split.threshold);
  } else {
    leftLevels = names(split.left);
    rightLevels = names(split.right);
  }
  const here = left ? leftLevels : rightLevels;
  const other = left ? rightLevels : leftLevels;
  return missingHere
    ? { column: spec.name, test: 'noneOf', levels: other, shown: here, orMissing: true }
    : { column: spec.name, test: 'oneOf', levels: here, orMissing: false };
}

/** Threshold as people read it: exact when short, else six significant figures. */
export function formatThreshold(v: number): string {
  const exact = String(v);
  return exact.length <= 9 ? exact : String(Number(v.toPrecision(6)));
}

// Plain level names stand as they are; others (spaces at the ends, punctuation, empty) go in
// typographic quotes, which read as quotes without escaping what is inside.
const quoteLevel = (l: string) => (/^[\w .+\-/]*$/.test(l) && l.trim() === l && l !== '' ? l : `“${l}”`);

/** A rule's conditions as one line; numeric bounds on one column merge into a range. */
export function ruleText(conditions: readonly RuleCondition[], specs: ReadonlyMap<string, RuleColumnSpec>): string {
  const parts: string[] = [];
  const done = new Set<number>();
  conditions.forEach((c, i) => {
    if (done.has(i)) return;
    const missing = (m: boolean) => (m && specs.get(c.column)?.hadMissing ? ' (or missing)' : '');
    if (c.test === 'below' || c.test === 'atLeast') {
      let low: number | undefined;
      let high: number | undefined;
      let orMissing = true;
      conditions.forEach((d, t) => {
        if (d.column !== c.column || (d.test !== 'below' && d.test !== 'atLeast')) return;
        done.add(t);
        orMissing &&= d.orMissing;
        if (d.test === 'atLeast') low = low === undefined ? d.value : Math.max(low, d.value);
        else high = high === undefined ? d.value : Math.min(high, d.value);
      });
      const range =
        low !== undefined && high !== undefined
          ? `${formatThreshold(low)} ≤ ${c.column} < ${formatThreshold(high)}`
          : low !== undefined
            ? `${c.column} ≥ ${formatThreshold(low)}`
            : `${c.column} < ${formatThreshold(high!)}`;
      parts.push(range + missing(orMissing));
      return;
    }
    done.add(i);
    const levels = c.test === 'oneOf' ? c.levels : (c as { shown: readonly string[] }).shown;
    const list = levels.map(quoteLevel);
    const said = list.length === 1 ? `${c.column} is ${list[0]}` : `${c.column} is one of ${list.join(', ')}`;
    parts.push(said + missing(c.orMissing));
  });
  return parts.length ? parts.join(' and ') : 'every row';
}

/** Leaves left to right with the conditions of their path. */
export function leafPaths(root: RuleTreeNode, specs: readonly RuleColumnSpec[]): { leaf: RuleTreeNode; conditions: RuleCondition[] }[] {
  const out: { leaf: RuleTreeNode; conditions: RuleCondition[] }[] = [];
  const walk = (node: RuleTreeNode, path: RuleCondition[]) => {
    if (!node.split) {
      out.push({ leaf: node, conditions: path });
      return;
    }
    const spec = specs[node.split.column];
    walk(node.left!, [...path, branchCondition(node.split, spec, true)]);
    walk(node.right!, [...path, branchCondition(node.split, spec, false)]);
  };
  walk(root, []);
  return out;
}

/** The tree as the drawing reads it: each branch labelled with its condition in words. */
export interface LabelledRuleNode {
  readonly size: number;
  readonly segment: number;
  readonly purity: number;
  readonly branches?: readonly [
    { readonly label: string; readonly node: LabelledRuleNode },
    { readonly label: string; readonly node: LabelledRuleNode },
  ];
}

export function labelledTree(node: RuleTreeNode, specs: readonly RuleColumnSpec[]): LabelledRuleNode {
  const base = { size: node.size, segment: node.prediction + 1, purity: node.size ? node.counts[node.prediction] / node.size : 0 };
  if (!node.split) return base;
  const spec = specs[node.split.column];
  const byName = new Map([[spec.name, spec]]);
  const branch = (left: boolean, child: RuleTreeNode) => ({
    label: ruleText([branchCondition(node.split!, spec, left)], byName),
    node: labelledTree(child, specs),
  });
  return { ...base, branches: [branch(true, node.left!), branch(false, node.right!)] };
}
