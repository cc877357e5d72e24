// Shapes of the classification tree: the columns it reads (numbers or level codes, NaN missing),
// its nodes, and its splits.

export type RuleColumnKind = 'numeric' | 'categorical' | 'ordinal';

export interface RuleColumn {
  readonly name: string;
  readonly kind: RuleColumnKind;
  /**
   * One value per row, NaN when missing. numeric: the value in its own units; categorical: level
   * code 0..L-1; ordinal: level rank 0..L-1, lowest first.
   */
  readonly values: Float64Array;
  /** categorical / ordinal: level names, code i names levels[i]. */
  readonly levels?: readonly string[];
}

/** numeric / ordinal: rows with value < threshold go left. */
export interface ThresholdSplit {
  readonly kind: 'threshold';
  readonly column: number;
  /** Midpoint between the two neighbouring training values (ordinal: between two ranks). */
  readonly threshold: number;
  /** Missing values (and unseen levels) follow the child with more training rows; a tie goes left. */
  readonly missingGoesLeft: boolean;
  /** Decrease in Gini impurity, in rows: n·G(node) − nL·G(left) − nR·G(right) over rows with a value. */
  readonly improvement: number;
}

/** categorical: rows whose level is in `left` go left, other seen levels right. */
export interface LevelSplit {
  readonly kind: 'levels';
  readonly column: number;
  readonly left: readonly number[];
  readonly right: readonly number[];
  readonly missingGoesLeft: boolean;
  readonly improvement: number;
}

export type RuleSplit = ThresholdSplit | LevelSplit;

export interface RuleTreeNode {
  /** Numbered as in Breiman et al. (and R's rpart): root 1, children 2·id and 2·id + 1. */
  readonly id: number;
  readonly depth: number;
  /** Training rows reaching the node. */
  readonly size: number;
  /** Training rows of each class at the node. */
  readonly counts: readonly number[];
  /** Most frequent class (the lowest class number on a tie). */
  readonly prediction: number;
  split?: RuleSplit;
  left?: RuleTreeNode;
  right?: RuleTreeNode;
}

export interface RuleTree {
  readonly kind: 'rule-tree';
  readonly columns: readonly { readonly name: string; readonly kind: RuleColumnKind; readonly levels?: readonly string[] }[];
  readonly classes: number;
  readonly root: RuleTreeNode;
  readonly depth: number;
  readonly minLeaf: number;
  readonly minSplit: number;
}
