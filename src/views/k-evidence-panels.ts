// The panels of the evidence for k: which criteria, in which order, what each reads, and the k
// each one picks by itself. The order follows the recommendation rule: stability, then the gap
// statistic, then the within-SS bend; the three ratio measures after them.

export interface KEvidenceRow {
  readonly k: number;
  readonly withinSS?: number;
  readonly silhouette?: number;
  readonly calinskiHarabasz?: number;
  readonly daviesBouldin?: number;
  readonly gap?: number;
  readonly gapSE?: number;
  readonly stability?: number;
  readonly weakestStability?: number;
  readonly stabilityBySegment?: readonly number[];
  readonly predictionStrength?: number;
}

export type PickedBy = 'stability' | 'gap' | 'knee' | 'silhouette' | 'calinskiHarabasz' | 'daviesBouldin' | 'predictionStrength';

export interface KComparisonLike {
  readonly table: readonly KEvidenceRow[];
  readonly recommended?: number;
  readonly headline?: string;
  readonly rule?: string;
  readonly noStructure?: boolean;
  readonly reasons?: readonly string[];
  readonly byCriterion?: { readonly [C in PickedBy]?: number };
}

export type PanelKey = 'weakestStability' | 'gap' | 'withinSS' | 'silhouette' | 'calinskiHarabasz' | 'daviesBouldin';

export interface PanelSpec {
  readonly key: PanelKey;
  readonly title: string;
  /** What the panel reads, in a few words. */
  readonly reads: string;
  /** Which entry of byCriterion holds this panel's own pick. */
  readonly pickedBy: PickedBy;
  /** Column heading in the table under the chart. */
  readonly column: string;
}

export const PANELS: readonly PanelSpec[] = [
  {
    key: 'weakestStability',
    title: 'Stability',
    reads: 'Jaccard per segment; line: weakest',
    pickedBy: 'stability',
    column: 'weakest Jaccard',
  },
  { key: 'gap', title: 'Gap statistic', reads: 'vs. structureless data, ± 1 SE', pickedBy: 'gap', column: 'gap' },
  { key: 'withinSS', title: 'Within-segment SS', reads: 'look for the bend', pickedBy: 'knee', column: 'within-SS' },
  { key: 'silhouette', title: 'Average silhouette', reads: 'higher: rows nearer their own', pickedBy: 'silhouette', column: 'silhouette' },
  {
    key: 'calinskiHarabasz',
    title: 'Calinski–Harabasz',
    reads: 'higher: between ÷ within spread',
    pickedBy: 'calinskiHarabasz',
    column: 'Calinski–Harabasz',
  },
  {
    key: 'daviesBouldin',
    title: 'Davies–Bouldin',
    reads: 'lower: neighbours further apart',
    pickedBy: 'daviesBouldin',
    column: 'Davies–Bouldin',
  },
];

/** How many panels go in each row so that no cell of the grid stays empty. */
export function panelRows(count: number): number[] {
  if (count <= 3) return [count];
  if (count === 4) return [2, 2];
  const rows: number[] = [];
  for (let left = count; left > 0; left -= 3) rows.push(Math.min(3, left));
  if (rows[rows.length - 1] === 1) {
    rows[rows.length - 2]--;
    rows[rows.length - 1]++;
  }
  return rows;
}

/** Position of panel i: its row, its column and how many share the row. */
export function panelSlot(rows: readonly number[], i: number): { row: number; col: number; across: number } {
  let start = 0;
  for (let row = 0; row < rows.length; row++) {
    if (i < start + rows[row]) return { row, col: i - start, across: rows[row] };
    start += rows[row];
  }
  throw new Error(`panel ${i} is beyond the grid`);
}
