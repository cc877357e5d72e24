// The prepared study's used columns as a matrix for the variable tree: numeric values (after
// imputation and log, before scaling — correlations do not see scaling), binary columns as 0/1,
// ordinal columns as level ranks. Unordered categorical columns have no correlation with a number
// (a correlation ratio is not symmetric and not defined between two of them), so they are left
// out and reported.
import { createMatrix, type Matrix } from '../core/matrix';
import type { MixedTable } from '../core/mixed';
import type { LeftOutColumn } from './variable-hierarchy';

export function variableColumns(mixed: MixedTable): { matrix: Matrix; leftOut: LeftOutColumn[]; entered: string[] } {
  const taken = mixed.columns.filter((c) => c.kind !== 'categorical');
  const leftOut = mixed.columns
    .filter((c) => c.kind === 'categorical')
    .map((c) => ({
      name: c.name,
      reason: `categorical with ${c.levels?.length ?? 'several'} unordered levels: a correlation needs an order or exactly two levels`,
    }));
  const n = mixed.rows;
  const p = taken.length;
  const data = new Float64Array(n * p);
  taken.forEach((c, j) => {
    for (let i = 0; i < n; i++) data[i * p + j] = c.values[i];
  });
  const entered = taken.map((c) =>
    c.kind === 'binary'
      ? `binary: "${c.levels?.[0]}" = 0, "${c.levels?.[1]}" = 1`
      : c.kind === 'ordinal'
        ? 'ordinal: level rank 0, 1, … lowest first'
        : 'numeric',
  );
  return { matrix: createMatrix(n, p, data, { rowLabels: mixed.rowLabels, colNames: taken.map((c) => c.name) }), leftOut, entered };
}
