// variableTree(): an agglomerative hierarchy of the COLUMNS. Two columns are alike when they are
// strongly correlated; the dissimilarity is 1 − r² (default) or 1 − |r|, and the tree is the same
// Tree that agglomerate() gives (merges, cut, cophenetic), with the names as labels.
import { checkProgress, report, type ProgressCallback } from '../../core/progress';
import { KinsortError, checkChoice } from '../../core/errors';
import { checkOptions } from '../../core/options';
import type { RowsInput } from '../../core/matrix';
import { makeDissimilarity, type Dissimilarity } from '../../measure/condensed';
import type { Table } from '../../table/types';
import { agglomerate } from '../hierarchy/agglomerate';
import type { CutSpec, Tree } from '../hierarchy/tree';
import { correlationMatrix, type CorrelationKind } from './correlation';
import { summariseGroups, type VariableGroup } from './variable-groups';
import { readVariables } from './variable-input';

export type CorrelationStrength = 'squared' | 'absolute';
export type VariableLinkage = 'average' | 'complete' | 'single' | 'weighted';
export const VARIABLE_LINKAGES: readonly VariableLinkage[] = ['average', 'complete', 'single', 'weighted'];

export interface VariableTreeOptions {
  /** 'pearson' (default) or 'spearman' (Pearson on average ranks: monotone, robust to outliers). */
  similarity?: CorrelationKind;
  /**
   * 'squared' (default): dissimilarity 1 − r², the share of one column's variance the other leaves
   * unexplained. 'absolute': 1 − |r|. Both ignore the sign, so reverse-coded columns still join.
   */
  strength?: CorrelationStrength;
  /**
   * Linkage: 'average' (default: the mean dissimilarity between the two groups' columns),
   * 'complete', 'single' or 'weighted'. Ward, centroid and median are refused: 1 − r² is not a
   * Euclidean distance, so their heights would mean nothing.
   */
  method?: VariableLinkage;
  /** Column names, for rows given as number[][]. */
  names?: readonly string[];
  /** For a table: the columns to take (default every column that is not free text). */
  columns?: readonly string[];
  /** Told as the steps finish: correlations (n × p² work), then the tree (task "variable tree"). */
  onProgress?: ProgressCallback;
}

export interface VariableTree extends Tree {
  /** Column names, leaf i is names[i]. */
  readonly names: readonly string[];
  readonly similarity: CorrelationKind;
  readonly strength: CorrelationStrength;
  /** How each column entered the correlations (numeric, binary 0/1, ordinal ranks). */
  readonly entered: readonly string[];
  /** p × p row-major signed correlations (Pearson or Spearman). */
  readonly correlation: Float64Array;
  /** The dissimilarity the tree was built on (1 − r² or 1 − |r|), labelled by name. */
  readonly dissimilarity: Dissimilarity;
  /** The groups of a cut: members, first-component share, representative (see summariseGroups). */
  groups(spec: CutSpec): VariableGroup[];
}

const WHERE = 'variableTree';

/**
 * Hierarchy of the columns of `input` (rows as number[][] or a Matrix with column names, or a
 * table). Default: Pearson, squared, average linkage — R's
 * hclust(as.dist(1 - cor(X)^2), "average").
 */
export function variableTree(input: RowsInput | Table, options: VariableTreeOptions = {}): VariableTree {
  const opts = checkOptions(options, ['similarity', 'strength', 'method', 'names', 'columns', 'onProgress'], WHERE);
  const onProgress = checkProgress(opts.onProgress, WHERE);
  const step = (done: number, detail: string) => report(onProgress, { task: 'variable tree', done, total: 2, detail });
  const similarity = checkChoice(opts.similarity ?? 'pearson', ['pearson', 'spearman'] as const, `${WHERE} similarity`);
  const strength = checkChoice(opts.strength ?? 'squared', ['squared', 'absolute'] as const, `${WHERE} strength`);
  if (opts.method !== undefined && ['ward', 'centroid', 'median'].includes(opts.method)) {
    throw new KinsortError(
      `${WHERE}: method "${opts.method}" works on Euclidean distances between centroids; 1 − r² and 1 − |r| are not Euclidean, so its heights would mean nothing. Use ${VARIABLE_LINKAGES.join(', ')}.`,
      'bad-option',
    );
  }
  const method = checkChoice(opts.method ?? 'average', VARIABLE_LINKAGES, `${WHERE} method`);
  const { matrix, names, entered } = readVariables(input, opts.names, opts.columns, WHERE);
  const p = names.length;
  step(0, `${similarity} correlations of ${p} columns`);
  const r = correlationMatrix(matrix, similarity, names, WHERE);
  step(1, `${method} linkage of ${p} columns`);
  const condensed = new Float64Array((p * (p - 1)) / 2);
  let k = 0;
  for (let a = 0; a < p; a++) {
    for (let b = a + 1; b < p; b++) {
      const v = r[a * p + b];
      condensed[k++] = Math.max(0, strength === 'squared' ? 1 - v * v : 1 - Math.abs(v));
    }
  }
  const metric = strength === 'squared' ? `1 - ${similarity}^2` : `1 - |${similarity}|`;
  const d = makeDissimilarity(p, condensed, metric, names);
  const tree = agglomerate(d, { method });
  step(2, 'done');
  const labelled: VariableTree = {
    ...tree,
    labels: names,
    names,
    similarity,
    strength,
    entered,
    correlation: r,
    dissimilarity: d,
    groups: (spec: CutSpec) => summariseGroups(r, names, tree.cut(spec)),
  };
  return labelled;
}
