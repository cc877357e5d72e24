// Shared last step of fitting and re-applying: run the transform and build PreparedData.
import { createMatrix } from '../core/matrix';
import { cellNumber, type DecimalMark } from '../table/cells';
import type { MixedColumn } from '../core/mixed';
import type { Cell, Table } from '../table/types';
import { transformRows } from './transform';
import type { Preparation, PreparationReport, PreparedData } from './types';

export interface AssembleInput {
  preparation: Preparation;
  table: Table;
  ids: string[];
  /** Cells of the prepared columns, missing already filled. */
  cells: ReadonlyMap<string, readonly Cell[]>;
  kept: Int32Array;
  where: (row: number) => string;
  /** Columns whose raw values go into the profile (keep + used), those present in the table. */
  profileColumns: readonly string[];
  /** Used columns already parsed (numeric ones as numbers, missing still null), reused for the profile. */
  parsed?: ReadonlyMap<string, readonly Cell[]>;
  report: Omit<PreparationReport, 'keptRows' | 'unseenLevels'>;
}

export function assemble(input: AssembleInput): PreparedData {
  const { preparation, table, kept } = input;
  const { data, mixed, unseen } = transformRows({
    columns: preparation.columns,
    cells: input.cells,
    rows: kept,
    ids: input.ids,
    where: input.where,
    decimalMark: preparation.decimalMark,
  });
  // Constant columns leave the features (they cannot separate rows) but stay in Gower's average,
  // contributing 0, as R's cluster::daisy counts them: dropping them would scale every
  // dissimilarity by p / (p − constants).
  for (const name of preparation.constantColumns) {
    const cells = input.cells.get(name);
    if (cells) mixed.push(constantMixedColumn(name, cells, kept));
  }
  const ids = pick(input.ids, kept);
  const featureNames = [...preparation.featureNames];
  const matrix = createMatrix(kept.length, featureNames.length, data, { rowLabels: ids, colNames: featureNames });
  // Keys come from the data: a null-prototype object, so a column named "__proto__" is a column.
  const profile: Record<string, Cell[]> = Object.create(null);
  const specs = new Map(preparation.columns.map((c) => [c.name, c]));
  for (const name of input.profileColumns) {
    const column = table.columns.find((c) => c.name === name)!;
    const numeric = (specs.get(name)?.type ?? column.declared ?? column.inferred) === 'numeric';
    const parsed = numeric ? input.parsed?.get(name) : undefined;
    const values = pick(parsed ?? column.values, kept);
    profile[name] = numeric && parsed === undefined ? asNumbers(values, preparation.decimalMark) : values;
  }
  const report: PreparationReport = { ...input.report, keptRows: kept.length, unseenLevels: unseen };
  return {
    matrix,
    ids,
    rowNumbers: Int32Array.from(kept),
    featureNames,
    preparation,
    report,
    mixed: { kind: 'mixed', rows: kept.length, columns: mixed, rowLabels: ids },
    profile: { columns: profile },
  };
}

/** A numeric column's cells as numbers for the profile, when every present cell is one; else as given. */
function asNumbers(values: Cell[], decimalMark: DecimalMark): Cell[] {
  const out = new Array<Cell>(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null) {
      out[i] = null;
      continue;
    }
    const n = cellNumber(v, decimalMark);
    if (n === undefined || !Number.isFinite(n)) return values;
    out[i] = n;
  }
  return out;
}

/** A constant column for Gower: code 0 where the cell is present, NaN (skipped) where it is missing. */
function constantMixedColumn(name: string, cells: readonly Cell[], kept: Int32Array): MixedColumn {
  const values = new Float64Array(kept.length);
  for (let r = 0; r < kept.length; r++) values[r] = cells[kept[r]] === null ? NaN : 0;
  return { name, kind: 'numeric', values };
}

/** values[rows[r]] for each r (a plain loop: Array.from with a map function is slow on large inputs). */
function pick<T>(values: readonly T[], rows: Int32Array): T[] {
  const out = new Array<T>(rows.length);
  for (let r = 0; r < rows.length; r++) out[r] = values[rows[r]];
  return out;
}
