// The one transform from (imputed) cells to features, shared by fitting and re-applying, so the
// training matrix and a re-applied one are identical bit for bit.
import type { MixedColumn } from '../core/mixed';
import { levelKey, type DecimalMark } from '../table/cells';
import type { Cell } from '../table/types';
import type { PreparedColumn, UnseenLevel } from './types';
import { levelCodes, levelIndex, numericCell, requireLevel } from './values';
import { guardPreparedWidth } from './width-guard';

export interface TransformInput {
  columns: readonly PreparedColumn[];
  /** Cells of each prepared column for all input rows, missing cells already filled (kept rows only). */
  cells: ReadonlyMap<string, readonly Cell[]>;
  /** Input rows to transform, in output order. */
  rows: Int32Array;
  ids: readonly string[];
  where: (row: number) => string;
  decimalMark: DecimalMark;
}

export interface TransformOutput {
  data: Float64Array;
  mixed: MixedColumn[];
  unseen: UnseenLevel[];
}

export function transformRows(input: TransformInput): TransformOutput {
  const { columns, rows, ids } = input;
  const p = columns.reduce((s, c) => s + c.features.length, 0);
  const n = rows.length;
  guardPreparedWidth(columns, n, 'prepare');
  const data = new Float64Array(n * p);
  const mixed: MixedColumn[] = [];
  const unseen: UnseenLevel[] = [];
  let offset = 0;
  for (const spec of columns) {
    const cells = input.cells.get(spec.name)!;
    const codes = new Float64Array(n);
    const levels = spec.levels ?? [];
    const codesOf = levelCodes(levels, spec.levelMatch ?? 'exact');
    const where = input.where;
    for (let r = 0; r < n; r++) {
      const row = rows[r];
      const cell = cells[row] as Exclude<Cell, null>;
      const at = r * p + offset;
      switch (spec.type) {
        case 'numeric': {
          const v = numericCell(cell, spec.name, spec.log, where, row, input.decimalMark);
          codes[r] = v;
          data[at] = ((v - spec.center) / spec.spread) * spec.weight;
          break;
        }
        case 'ordinal': {
          const k = requireLevel(cell, codesOf, spec.name, 'ordinal', where, row);
          codes[r] = k;
          data[at] = ((k - spec.center) / spec.spread) * spec.weight;
          break;
        }
        case 'binary': {
          const k = requireLevel(cell, codesOf, spec.name, 'binary', where, row);
          codes[r] = k;
          data[at] = k * spec.weight;
          break;
        }
        case 'categorical': {
          const k = levelIndex(cell, codesOf);
          if (k < 0) {
            // Documented rule: an unseen level sits at the baseline (all indicators 0) and is reported.
            codes[r] = NaN;
            unseen.push({ id: ids[row], row, column: spec.name, level: levelKey(cell) });
          } else {
            codes[r] = k;
            data[at + k] = spec.weight;
          }
          break;
        }
      }
    }
    mixed.push({
      name: spec.name,
      kind: spec.type,
      values: codes,
      ...(spec.type === 'numeric' ? {} : { levels: [...levels] }),
      weight: spec.weight,
    });
    offset += spec.features.length;
  }
  return { data, mixed, unseen };
}
