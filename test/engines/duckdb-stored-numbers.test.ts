// DuckDB reads a cell stored as DOUBLE or as an integer directly instead of printing it and
// reading the text back (the dialect's nativeNumber): the scoring SQL must give every row the
// segment and distance it gives the same table stored as the text DuckDB prints for those cells.
// The text table is the reference (test/engines/engines.test.ts holds it to assign); NaN (text
// 'nan', a missing marker), ±Infinity (not a number), −0, subnormals, integers beyond 2^53, FLOAT
// and DECIMAL (which keep the text rule) are all in it.
import { DuckDBInstance } from '@duckdb/node-api';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { duckdbEngine, type SqlEngine } from '../../src/engines/engine';
import { createRandom } from '../../src/random';
import { profileInDatabase } from '../../src/segments/database/profile-in-database';
import { study } from '../../src/study/study';

const random = createRandom('stored-numbers');
const TRAINING = Array.from({ length: 120 }, (_, i) => ({
  id: `t${i}`,
  a: String(Math.round((random.normal() + (i % 2) * 4) * 1e6) / 1e6),
  b: String(random.int(1000) + (i % 2) * 2000),
  c: String(Math.round(random.uniform(0, 10) * 100) / 100),
  e: String(Math.round(random.uniform(0, 10) * 100) / 100),
}));

/** Special cells for the DOUBLE column a and the BIGINT column b (SQL literals). */
// sa4 (1e300) is left out of the profiles below.
const SPECIAL_A = ["'NaN'", "'Infinity'", "'-Infinity'", '-0.0', '1e300', '5e-324', '0.1', '123456789.123456789', '-2.5e-8'];
const SPECIAL_B = ['9007199254740993', '-9223372036854775808', '0', '-1'];

let connection: Awaited<ReturnType<DuckDBInstance['connect']>>;
let engine: SqlEngine;
beforeAll(async () => {
  connection = await (await DuckDBInstance.create(':memory:')).connect();
  engine = duckdbEngine(connection);
  const values = TRAINING.map((r) => `('${r.id}', ${r.a}, ${r.b}, ${r.c}, ${r.e})`);
  SPECIAL_A.forEach((a, i) => values.push(`('sa${i}', ${a}, 5, 1.5, 2.25)`));
  SPECIAL_B.forEach((b, i) => values.push(`('sb${i}', 1.5, ${b}, 0.1, 7.77)`));
  values.push(`('nulls', NULL, NULL, NULL, NULL)`);
  await engine.query('CREATE TABLE stored (id VARCHAR, a DOUBLE, b BIGINT, c FLOAT, e DECIMAL(10, 2))');
  await engine.query(`INSERT INTO stored VALUES ${values.join(', ')}`);
  // Profiles: without the 1e300 cell, whose square overflows (DuckDB stops var_samp there).
  await engine.query("CREATE VIEW stored_profiled AS SELECT * FROM stored WHERE id <> 'sa4'");
  await engine.query(
    'CREATE TABLE printed AS SELECT id, CAST(a AS VARCHAR) AS a, CAST(b AS VARCHAR) AS b, CAST(c AS VARCHAR) AS c, CAST(e AS VARCHAR) AS e FROM stored',
  );
  await engine.query("CREATE VIEW printed_profiled AS SELECT * FROM printed WHERE id <> 'sa4'");
});
afterAll(() => connection?.closeSync());

const byId = (rows: Record<string, unknown>[]) => new Map(rows.map((r) => [String(r.id), r]));

describe('DuckDB cells stored as numbers', () => {
  for (const missing of ['median', 'refuse'] as const) {
    it(`score as their printed text does (missing: ${missing})`, async () => {
      const handle = study(TRAINING, { id: 'id', types: { a: 'numeric', b: 'numeric', c: 'numeric', e: 'numeric' } })
        .prepare({ scale: 'zscore', missing, log: ['b'] })
        .kmeans({ k: 3, seed: 2, restarts: 2 })
        .definition();
      const stored = byId(await engine.query(handle.toSql({ table: 'stored', engine })));
      const printed = byId(await engine.query(handle.toSql({ table: 'printed', engine })));
      expect(stored.size).toBe(TRAINING.length + SPECIAL_A.length + SPECIAL_B.length + 1);
      for (const [id, want] of printed) {
        const got = stored.get(id)!;
        expect([got.segment, got.distance, got.far], id).toEqual([want.segment, want.distance, want.far]);
      }
      // The special rows are not all refused: the comparison covers scored rows too.
      const scored = [...printed.entries()].filter(([id, r]) => /^s[ab]/.test(id) && r.segment !== null);
      expect(scored.length).toBeGreaterThan(5);
    });
  }

  it('profile as their printed text does', async () => {
    const handle = study(TRAINING, { id: 'id', keep: ['e'] })
      .prepare({ scale: 'zscore', missing: 'median' })
      .kmeans({ k: 2, seed: 1 })
      .definition();
    const stored = await profileInDatabase(engine, handle.definition, { table: 'stored_profiled' });
    const printed = await profileInDatabase(engine, handle.definition, { table: 'printed_profiled' });
    expect(stored.segments).toEqual(printed.segments);
    expect(stored.allRows).toEqual(printed.allRows);
    expect(stored.unscored).toBe(printed.unscored);
  });
});
