// Score one table of text cells with a definition on every engine, and compare each engine's rows
// with assign's, row by row: the same segment (or NULL where assign refuses the row) and the same
// distance to 1e-9 relative.
import { expect } from 'vitest';
import type { DefinitionHandle } from '../../src/study/definition-handle';
import type { TestEngine } from './adapters';

export type TextRows = readonly (readonly (string | null)[])[];

export function asRecords(columns: readonly string[], rows: TextRows): Record<string, string | null>[] {
  return rows.map((r) => Object.fromEntries(columns.map((c, j) => [c, r[j]])));
}

/** Relative agreement of two distances, with an absolute floor for distances near 0. */
export function closeEnough(a: number, b: number): boolean {
  return a === b || Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(b), 1e-6);
}

export async function expectSameEverywhere(
  handle: DefinitionHandle,
  engines: readonly TestEngine[],
  table: string,
  columns: readonly string[],
  rows: TextRows,
): Promise<void> {
  const outcome = handle.assign(asRecords(columns, rows));
  const idColumn = handle.definition.preparation.idColumn as string;
  for (const engine of engines) {
    await engine.loadText(table, columns, rows);
    const sqlRows = await engine.query(handle.toSql({ table, engine }));
    expect(sqlRows, engine.dialect).toHaveLength(rows.length);
    const byId = new Map(sqlRows.map((r) => [String(r[idColumn]), r]));
    for (const row of outcome.rows) {
      const s = byId.get(row.id);
      const where = `${engine.dialect}, row ${JSON.stringify(row.id)}`;
      expect(s, where).toBeDefined();
      const segment = s!.segment === null ? null : Number(s!.segment);
      // The one stated exception (the PostgreSQL dialect's caveat): overflow stops a PostgreSQL
      // query, so a row with a prepared feature beyond 1e150 gets NULL there.
      const metric = handle.definition.metric;
      const beyond = row.distance !== null && row.distance >= (metric === 'sqeuclidean' ? 1e298 : 1e149);
      if (engine.dialect === 'postgres' && beyond && segment === null) continue;
      expect(segment, `segment, ${where}`).toBe(row.segment);
      if (row.distance === null) {
        expect(s!.distance, where).toBeNull();
        expect(s!.far, where).toBeNull();
      } else {
        const distance = Number(s!.distance);
        expect(closeEnough(distance, row.distance), `distance ${distance} vs ${row.distance}, ${where}`).toBe(true);
        // `far` compares a distance with a stored threshold; a row exactly at a threshold (the one
        // row of a one-row segment is at its own) may fall either side by one unit in the last
        // place (log1p and ln are not correctly rounded everywhere), so it is not compared there.
        const atThreshold = handle.definition.segments.some((seg) => closeEnough(row.distance!, seg.farBeyond));
        if (!atThreshold) expect(Number(s!.far) === 1, `far, ${where}`).toBe(row.far);
      }
    }
  }
}
