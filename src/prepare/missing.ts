// The missing-value policy over the used columns: refuse (default), drop (listed), or impute
// (listed). Profile-only columns are never a reason to drop a row.
import { KinsortError } from '../core/errors';
import type { Cell } from '../table/types';
import type { DroppedRow, ImputedColumn, MissingPolicy } from './types';

export interface MissingOutcome {
  /** Input rows kept, in input order. */
  kept: Int32Array;
  dropped: DroppedRow[];
  imputed: ImputedColumn[];
  /** Used columns with missing cells filled (imputation) — same length as the input. */
  cells: Map<string, Cell[]>;
}

export interface MissingInput {
  policy: MissingPolicy;
  names: readonly string[];
  raw: ReadonlyMap<string, readonly Cell[]>;
  rowCount: number;
  ids: readonly string[];
  where: (row: number) => string;
  /** The value to impute in a column (only asked under 'median', only for columns with missing cells). */
  fillFor: (name: string) => number | string;
}

export function applyMissingPolicy(input: MissingInput): MissingOutcome {
  const { policy, names, raw, rowCount, ids } = input;
  const missingByRow = new Map<number, string[]>();
  const countByColumn = new Map<string, number>();
  let total = 0;
  for (const name of names) {
    const cells = raw.get(name)!;
    for (let i = 0; i < rowCount; i++) {
      if (cells[i] !== null) continue;
      total++;
      countByColumn.set(name, (countByColumn.get(name) ?? 0) + 1);
      const list = missingByRow.get(i);
      if (list) list.push(name);
      else missingByRow.set(i, [name]);
    }
  }
  const cells = new Map<string, Cell[]>(names.map((n) => [n, raw.get(n)! as Cell[]]));
  const all = new Int32Array(rowCount);
  for (let i = 0; i < rowCount; i++) all[i] = i;
  if (total === 0) return { kept: all, dropped: [], imputed: [], cells };

  if (policy === 'refuse') {
    const first = Math.min(...missingByRow.keys());
    const column = missingByRow.get(first)![0];
    const others = total - 1;
    const byColumn = [...countByColumn].map(([n, c]) => `${n} (${c})`).join(', ');
    throw new KinsortError(
      `${input.where(first)}, column "${column}" is missing, and the missing-value policy is 'refuse' ` +
        `(the default). ${
          others === 0 ? 'It is the only missing cell' : `There are ${others} other missing ` + `cell(s)`
        } in the used columns; missing cells per column: ${byColumn}. Choose missing: 'drop' ` +
        `(rows removed and listed) or 'median' (values imputed and listed), or fill the cells.`,
      'missing-value',
    );
  }
  if (policy === 'drop') {
    const dropped: DroppedRow[] = [];
    const kept: number[] = [];
    for (let i = 0; i < rowCount; i++) {
      const columns = missingByRow.get(i);
      if (columns === undefined) kept.push(i);
      else dropped.push({ id: ids[i], row: i, columns, reason: `missing value in ${columns.join(', ')}` });
    }
    return { kept: Int32Array.from(kept), dropped, imputed: [], cells };
  }
  const imputed: ImputedColumn[] = [];
  for (const name of names) {
    const count = countByColumn.get(name);
    if (count === undefined) continue;
    const value = input.fillFor(name);
    const filled = raw.get(name)!.slice();
    const filledIds: string[] = [];
    for (let i = 0; i < rowCount; i++) {
      if (filled[i] === null) {
        filled[i] = value;
        filledIds.push(ids[i]);
      }
    }
    cells.set(name, filled);
    imputed.push({ column: name, value, count, ids: filledIds });
  }
  return { kept: all, dropped: [], imputed, cells };
}
