// Nothing lost: every input row is followed from intake through preparation (drop policy), fitting,
// assignment of new rows and SQL scoring in DuckDB (@duckdb/node-api). Each row is in the output or
// in a report of dropped / refused rows with its reason, and the counts add up at every step.
// Data of our own making: test/segments/definition-data.ts (seeded), with damage added here.
import { mkdtempSync, rmSync, writeFileSync } from 'fs';
import { tmpdir } from 'os';
import { join } from 'path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DuckDBConnection, DuckDBInstance } from '@duckdb/node-api';
import { readTable, study } from '../../src';
import { dialectNamed } from '../../src/engines/dialects';

const { quoteString } = dialectNamed('duckdb');
import { riders, toCsv } from '../segments/definition-data';

const dir = mkdtempSync(join(tmpdir(), 'kinsort-lost-'));
let instance: DuckDBInstance;
let db: DuckDBConnection;
beforeAll(async () => {
  instance = await DuckDBInstance.create(':memory:');
  db = await instance.connect();
});
afterAll(() => {
  db?.closeSync();
  rmSync(dir, { recursive: true, force: true });
});

// Training rows: 9 with a missing used cell (dropped under 'drop'), one missing only a kept column.
const train = riders(160, 31);
const missingAt = [3, 17, 18, 40, 41, 42, 99, 120, 159];
missingAt.forEach((i, t) => {
  const r = train[i];
  if (t % 3 === 0) r.trips = null;
  else if (t % 3 === 1) r.fare = null;
  else r.autopay = null;
});
// New rows: missing cells, an unseen categorical level, an unseen binary level.
const fresh = riders(50, 32, 'n');
fresh[2].trips = null;
fresh[5].peak = null;
fresh[11].fare = 'night-owl'; // unseen categorical: all indicators 0, reported, still assigned
fresh[20].autopay = 'maybe'; // unseen binary level: refused with its reason
fresh[33].tenure = null;

describe('row counts through intake → preparation → fitting → assignment → SQL', () => {
  it('every row is accounted for at every step, with reasons', async () => {
    // Intake.
    const csvText = toCsv(train);
    const table = readTable(csvText);
    expect(table.rowCount).toBe(160);

    // Preparation with the drop policy: kept + dropped = input, disjoint, each dropped with a reason.
    const s = study(table, { id: 'rider', use: ['trips', 'peak', 'tenure', 'fare', 'autopay'], keep: ['postcode'] }).prepare({
      missing: 'drop',
    });
    const rep = s.report;
    expect(rep.inputRows).toBe(160);
    expect(rep.keptRows + rep.dropped.length).toBe(160);
    expect(rep.dropped.map((d) => d.row)).toEqual(missingAt);
    for (const d of rep.dropped) {
      expect(d.id).toBe(train[d.row].rider);
      expect(d.reason.length).toBeGreaterThan(0);
      expect(d.columns.length).toBe(1);
    }
    const everyone = new Set([...s.ids, ...rep.dropped.map((d) => d.id)]);
    expect(everyone.size).toBe(160);
    expect([...everyone].sort()).toEqual(train.map((r) => r.rider).sort());

    // Fitting: every kept row has exactly one segment; sizes add up.
    const seg = s.kmeans({ k: 4, seed: 3, restarts: 3 });
    expect(seg.assignment.length).toBe(rep.keptRows);
    expect(seg.sizes.reduce((a, b) => a + b, 0)).toBe(rep.keptRows);
    let members = 0;
    for (let g = 1; g <= 4; g++) members += seg.members(g).length;
    expect(members).toBe(rep.keptRows);

    // Assignment of new rows: every row in the output; assigned + refused = input.
    const def = seg.definition();
    const out = def.assign(fresh);
    expect(out.rows.length).toBe(50);
    expect(out.rows.map((r) => r.id)).toEqual(fresh.map((r) => r.rider));
    expect(out.report.inputRows).toBe(50);
    expect(out.report.assignedRows + out.report.refused.length).toBe(50);
    expect(out.report.refused.map((r) => r.row)).toEqual([2, 5, 20, 33]);
    for (const r of out.report.refused) {
      expect(r.reason.length).toBeGreaterThan(0);
      expect(out.rows[r.row].segment).toBeNull();
    }
    expect(out.report.refused.find((r) => r.row === 20)!.reason).toMatch(/maybe/);
    expect(out.rows.filter((r) => r.segment !== null).length).toBe(out.report.assignedRows);
    expect(out.report.unseenLevels.map((u) => [u.row, u.column, u.level])).toEqual([[11, 'fare', 'night-owl']]);
    expect(out.rows[11].segment).not.toBeNull();

    // SQL in DuckDB on the same new rows: one output row per input row, same id set; every row
    // assign scored gets the same segment; rows assign refused for a missing value get none.
    const csv = join(dir, 'fresh.csv');
    writeFileSync(csv, toCsv(fresh));
    await db.run(`CREATE OR REPLACE VIEW fresh_rows AS SELECT * FROM read_csv(${quoteString(csv)}, header = true, all_varchar = false)`);
    const sql = def.toSql({ table: 'fresh_rows' });
    const scored = (await db.runAndReadAll(sql)).getRowObjects() as Record<string, unknown>[];
    expect(scored.length).toBe(50);
    const byId = new Map(scored.map((r) => [String(r.rider), r]));
    expect(byId.size).toBe(50);
    for (const row of out.rows) {
      const hit = byId.get(row.id)!;
      expect(hit, row.id).toBeDefined();
      if (row.segment !== null) expect(Number(hit.segment), row.id).toBe(row.segment);
    }
    for (const r of out.report.refused.filter((x) => /missing/.test(x.reason))) {
      expect(byId.get(r.id)!.segment, r.id).toBeNull();
    }
  }, 60_000);
});
