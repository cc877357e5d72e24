// SQL scoring, run for real in DuckDB (embedded, @duckdb/node-api) on CSV and Parquet files: the
// SELECT from toSql must give every row the same segment (and distance, and far flag) as
// assign(). Data of our own making (definition-data.ts, fixed seeds), with unseen category levels
// and missing values in the new rows.
import { mkdtempSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DuckDBConnection, DuckDBInstance } from '@duckdb/node-api';
import { prepareTable } from '../../src/prepare';
import type { PrepareOptions } from '../../src/prepare';
import { kmeans, kmedoids } from '../../src/methods/partition';
import { buildDefinition } from '../../src/segments/definition-exports';
import { loadDefinition } from '../../src/study/definition-handle';
import type { DefinitionHandle } from '../../src/study/definition-handle';
import { dialectNamed } from '../../src/engines/dialects';

const { doubleLiteral, quoteIdentifier, quoteString } = dialectNamed('duckdb');
import { riders, toCsv, type RiderRecord } from './definition-data';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-sql-'));
let instance: DuckDBInstance;
let db: DuckDBConnection;

beforeAll(async () => {
  instance = await DuckDBInstance.create(':memory:');
  db = await instance.connect();
});
afterAll(() => {
  db?.closeSync();
});

async function query(sql: string): Promise<Record<string, unknown>[]> {
  return (await db.runAndReadAll(sql)).getRowObjects() as Record<string, unknown>[];
}

/** A CSV file and a Parquet copy written by DuckDB itself; returns the two view names. */
async function stage(name: string, records: readonly RiderRecord[]): Promise<[string, string]> {
  const csv = join(dir, `${name}.csv`);
  const parquet = join(dir, `${name}.parquet`);
  writeFileSync(csv, toCsv(records));
  // Every column as text (all_varchar): the SQL reads cells by the text rule, as assign reads the CSV.
  await query(`CREATE OR REPLACE VIEW ${name}_csv AS SELECT * FROM read_csv(${quoteString(csv)}, header = true, all_varchar = true)`);
  await query(`COPY ${name}_csv TO ${quoteString(parquet)} (FORMAT PARQUET)`);
  await query(`CREATE OR REPLACE VIEW ${name}_parquet AS SELECT * FROM read_parquet(${quoteString(parquet)})`);
  return [`${name}_csv`, `${name}_parquet`];
}

function fit(records: RiderRecord[], prepare: PrepareOptions, k = 4): DefinitionHandle {
  const prepared = prepareTable(records, prepare);
  const result = kmeans(prepared.matrix, { k, seed: 5, restarts: 4 });
  return loadDefinition(
    buildDefinition({
      preparation: prepared.preparation,
      method: { name: 'kmeans', options: { k, seed: 5, restarts: 4 } },
      centers: result.centers,
      training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
    }),
  );
}

/** New rows with the awkward cases the SQL must treat as assign does. */
function awkward(records: RiderRecord[]): RiderRecord[] {
  const out = records.map((r) => ({ ...r }));
  out[1].fare = 'night-owl'; // unseen categorical level: baseline
  out[4].trips = null; // missing numeric
  out[7].fare = null; // missing categorical
  out[9].autopay = null; // missing binary
  out[12].band = null; // missing ordinal
  out[15].postcode = 'Z00'; // profile-only column: no effect
  return out;
}

async function expectSameAsAssign(handle: DefinitionHandle, views: string[], records: RiderRecord[]): Promise<void> {
  const outcome = handle.assign(records);
  for (const view of views) {
    const sqlRows = await query(handle.toSql({ table: view }));
    expect(sqlRows).toHaveLength(records.length);
    const byId = new Map(sqlRows.map((r) => [String(r.rider), r]));
    for (const row of outcome.rows) {
      const s = byId.get(row.id)!;
      expect(s, `row ${row.id} in ${view}`).toBeDefined();
      expect(s.segment === null ? null : Number(s.segment), `segment of ${row.id} in ${view}`).toBe(row.segment);
      if (row.distance === null) {
        expect(s.distance).toBeNull();
        expect(s.far).toBeNull();
      } else {
        // log1p in SQL (Goldberg's form) against Math.log1p in JavaScript: equal to a few units in the last place.
        expect(Math.abs((s.distance as number) - row.distance)).toBeLessThanOrEqual(1e-12 * Math.max(1, row.distance));
        expect(Number(s.far) === 1).toBe(row.far);
      }
    }
  }
}

const MIXED: PrepareOptions = {
  id: 'rider',
  use: ['trips', 'peak', 'tenure', 'fare', 'autopay', 'band'],
  keep: ['postcode'],
  log: ['trips'],
  weights: { fare: 0.5, tenure: 2 },
  ordinalLevels: { band: ['low', 'mid', 'high'] },
};

describe('toSql in DuckDB (CSV and Parquet) equals assign on every row', () => {
  it('z-score, log1p, weights, one-hot, binary and ordinal; missing policy refuse (missing rows get NULL)', async () => {
    const training = riders(200, 31);
    const handle = fit(training, MIXED);
    await expectSameAsAssign(handle, await stage('train_refuse', training), training);
    const fresh = awkward(riders(80, 32, 'n'));
    await expectSameAsAssign(handle, await stage('new_refuse', fresh), fresh);
    // The training rows' SQL segments are the fitted ones too (assign reproduces the fit, see definition.test.ts).
    const outcome = handle.assign(fresh);
    expect(outcome.report.refused.map((r) => r.row)).toEqual([4, 7, 9, 12]);
    expect(outcome.report.unseenLevels.map((u) => u.row)).toEqual([1]);
  });

  it('median imputation: COALESCE with the stored training medians', async () => {
    const training = awkward(riders(200, 41));
    training[20].tenure = null;
    training[30].peak = null;
    const handle = fit(training, { ...MIXED, missing: 'median' });
    await expectSameAsAssign(handle, await stage('train_median', training), training);
    const fresh = awkward(riders(60, 42, 'm'));
    fresh[3].tenure = null;
    await expectSameAsAssign(handle, await stage('new_median', fresh), fresh);
    const outcome = handle.assign(fresh);
    expect(outcome.report.imputed.map((c) => c.column).sort()).toEqual(['autopay', 'band', 'fare', 'tenure', 'trips']);
  });

  it('robust and min-max scaling, and "none"', async () => {
    const training = riders(150, 51);
    const fresh = awkward(riders(50, 52, 'q'));
    for (const scale of ['robust', 'minmax', 'none'] as const) {
      const handle = fit(training, { ...MIXED, scale }, 3);
      await expectSameAsAssign(handle, await stage(`new_${scale}`, fresh), fresh);
    }
  });
});

describe('toSql for medoids under other metrics, in DuckDB', () => {
  it('manhattan and squared Euclidean k-medoids give the same segments, distances and far flags as assign', async () => {
    const training = riders(120, 95);
    const fresh = awkward(riders(40, 96, 'p'));
    const [csvView, parquetView] = await stage('medoid_new', fresh);
    for (const metric of ['manhattan', 'sqeuclidean'] as const) {
      const prepared = prepareTable(training, MIXED);
      const result = kmedoids(prepared.matrix, { k: 3, metric });
      const handle = loadDefinition(
        buildDefinition({
          preparation: prepared.preparation,
          method: { name: 'kmedoids', options: { k: 3, metric } },
          medoids: result.medoids,
          training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
        }),
      );
      expect(handle.definition.metric).toBe(metric);
      await expectSameAsAssign(handle, [csvView, parquetView], fresh);
    }
  });
});

describe('SQL text', () => {
  it('quotes identifiers and strings by doubling quotes, so hostile names cannot break out', async () => {
    expect(quoteIdentifier('a"b')).toBe('"a""b"');
    expect(quoteString("it's")).toBe("'it''s'");
    // Unicode and very long ids travel through CSV, DuckDB and back unchanged.
    const idOf = (id: string, i: number) => (i % 3 === 0 ? `${id}-Zürich-東京-🚇` : i % 3 === 1 ? id + 'x'.repeat(400) : id);
    const records = riders(60, 61).map((r, i) => ({
      'rider "id"': idOf(r.rider, i),
      'trips; DROP TABLE x': r.trips,
      "fare'type": r.fare === 'student' ? "o'brien" : r.fare,
    }));
    const prepared = prepareTable(records, { id: 'rider "id"', use: ['trips; DROP TABLE x', "fare'type"] });
    const result = kmeans(prepared.matrix, { k: 2, seed: 1 });
    const handle = loadDefinition(
      buildDefinition({
        preparation: prepared.preparation,
        method: { name: 'kmeans', options: { k: 2 } },
        centers: result.centers,
        training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
      }),
    );
    const csv = join(dir, 'hostile.csv');
    writeFileSync(csv, toCsv(records));
    await query(`CREATE OR REPLACE VIEW "odd table" AS SELECT * FROM read_csv(${quoteString(csv)}, header = true, all_varchar = true)`);
    const sqlRows = await query(handle.toSql({ table: 'odd table' }));
    const byId = new Map(sqlRows.map((r) => [String(r['rider "id"']), Number(r.segment)]));
    const assigned = handle.assign(records).rows;
    expect(assigned.map((r) => r.id)).toEqual(records.map((r) => r['rider "id"']));
    for (const row of assigned) expect(byId.get(row.id)).toBe(row.segment);
  });

  it('breaks ties to the lower segment number, as assign does', async () => {
    const records = riders(30, 91);
    const prepared = prepareTable(records, { id: 'rider', use: ['trips', 'peak'] });
    const d = prepared.matrix.cols;
    const far = Array.from({ length: d }, () => 50);
    const twin = Array.from({ length: d }, () => 0);
    const handle = loadDefinition(
      buildDefinition({
        preparation: prepared.preparation,
        method: { name: 'kmeans' },
        centers: [far, twin, twin.slice()],
        training: { ids: prepared.ids, matrix: prepared.matrix, assignment: prepared.ids.map((_, i) => i % 3) },
      }),
    );
    const outcome = handle.assign(records);
    expect(outcome.rows.every((r) => r.segment === 2)).toBe(true);
    const [csvView] = await stage('ties', records);
    const sqlRows = await query(handle.toSql({ table: csvView }));
    expect(sqlRows.every((r) => Number(r.segment) === 2)).toBe(true);
  });

  it('writes doubles as approximate literals that read back to the same double', async () => {
    const values = [0.1, -3e-7, 1e300, 5e-324, 123456789.123456789, -0];
    const rows = await query(`SELECT ${values.map((v, i) => `${doubleLiteral(v)} AS v${i}`).join(', ')}`);
    values.forEach((v, i) => expect(rows[0][`v${i}`]).toBe(v === 0 ? 0 : v));
  });

  it('uses no window functions, LATERAL or engine casts outside the dialect layer', () => {
    const sql = fit(riders(60, 71), MIXED, 3).toSql({ table: 'riders' });
    expect(sql).not.toMatch(/\bOVER\b|\bLATERAL\b|\bUNNEST\b|\bIIF\b|::/);
  });

  it('refuses an unknown option and a table without an id column', () => {
    const handle = fit(riders(40, 81), MIXED, 2);
    expect(() => handle.toSql({ tabel: 'x' } as never)).toThrow(/unknown option "tabel".*Did you mean "table"/);
    const prepared = prepareTable(riders(40, 81), { use: ['trips', 'peak'] });
    const result = kmeans(prepared.matrix, { k: 2, seed: 1 });
    const noId = loadDefinition(
      buildDefinition({
        preparation: prepared.preparation,
        method: { name: 'kmeans' },
        centers: result.centers,
        training: { ids: prepared.ids, matrix: prepared.matrix, assignment: result.assignment },
      }),
    );
    expect(() => noId.toSql({ table: 'riders' })).toThrow(/no id column.*give idColumn/);
    expect(noId.toSql({ table: 'riders', idColumn: 'rider' })).toContain('"rider"');
  });
});

describe('a column DuckDB typed BOOLEAN', () => {
  it('stops the query naming the column and the fix, rather than scoring every row NULL', async () => {
    const records = riders(40, 111);
    const handle = fit(records, MIXED, 2);
    const csv = join(dir, 'typed.csv');
    writeFileSync(csv, toCsv(records));
    // Without all_varchar DuckDB reads the yes/no column "autopay" as BOOLEAN.
    await query(`CREATE OR REPLACE VIEW typed AS SELECT * FROM read_csv(${quoteString(csv)}, header = true)`);
    expect((await query(`SELECT typeof(autopay) AS t FROM typed LIMIT 1`))[0].t).toBe('BOOLEAN');
    await expect(query(handle.toSql({ table: 'typed' }))).rejects.toThrow(/column "autopay" is BOOLEAN in DuckDB.*all_varchar = true/);
  });
});
