// Row ids: the id column's exact text (unique, never missing; never parsed, trimmed or re-formatted) or "1".."n".
import { KinsortError } from '../core/errors';
import { levelKey } from '../table/cells';
import type { Table } from '../table/types';

export function readIds(table: Table, idColumn: string | null, where: string): string[] {
  if (idColumn === null) {
    const ids = new Array<string>(table.rowCount);
    for (let i = 0; i < table.rowCount; i++) ids[i] = String(i + 1);
    return ids;
  }
  const column = table.columns.find((c) => c.name === idColumn)!;
  const firstRow = new Map<string, number>();
  return column.values.map((cell, i) => {
    if (cell === null) {
      throw new KinsortError(`${where}: row ${i + 1} has no value in the id column "${idColumn}".`, 'missing-value');
    }
    const id = levelKey(cell);
    const before = firstRow.get(id);
    if (before !== undefined) {
      throw new KinsortError(
        `${where}: id ${JSON.stringify(id)} appears twice in column "${idColumn}" (rows ${before + 1} and ${i + 1}); ids must be unique.`,
        'duplicate-id',
      );
    }
    firstRow.set(id, i);
    return id;
  });
}

/** How a row is named in messages: its 1-based input position, and its id when there is an id column. */
export function rowText(row: number, ids: readonly string[], hasIdColumn: boolean): string {
  return hasIdColumn ? `row ${row + 1} (id ${JSON.stringify(ids[row])})` : `row ${row + 1}`;
}
