// seg.rules(): readable rules per leaf, agreement, apply() on the training rows reproduces the
// agreement, and toSql() gives every row the same segment as apply() on DuckDB (@duckdb/node-api),
// SQLite (better-sqlite3) and PostgreSQL 15 (test/servers), for the training rows and for new rows
// with missing values, unseen levels and text that needs quoting.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DuckDBConnection, DuckDBInstance } from '@duckdb/node-api';
import Database from 'better-sqlite3';
import { Client } from 'pg';
import { study } from '../../src/study';
import { rulesSql, type SegmentRules } from '../../src/segments';
import { labelledTree } from '../../src/segments/rules-text';
import { rulesTreeView } from '../../src/views';
import { dialectNamed } from '../../src/engines';

const { quoteIdentifier, quoteString, doubleLiteral } = dialectNamed('duckdb');
import { useServer, serverAvailable } from '../servers/servers';
import { AWKWARD_ZONE, NUMERIC, TEXT, newRows, trainingRows, zoneRulesFor, type Row } from './rules-data';

const training = trainingRows();
const fresh = newRows(training);
const seg = study(training, { id: 'holder_id' }).prepare({ scale: 'zscore', missing: 'median' }).kmeans({ k: 4, seed: 3, restarts: 4 });
seg.name(2, { title: 'Weekday <peak> riders' });
const rules = seg.rules({ depth: 4, minLeaf: 10 });

const zoneRules = zoneRulesFor(training);

describe('seg.rules()', () => {
  it('one rule per leaf, in the columns’ units and level names, with size and purity', () => {
    expect(rules.rules.length).toBeGreaterThan(3);
    expect(rules.rules.reduce((s, r) => s + r.size, 0)).toBe(seg.ids.length);
    for (const r of rules.rules) {
      expect(r.segment).toBeGreaterThanOrEqual(1);
      expect(r.segment).toBeLessThanOrEqual(4);
      expect(r.purity).toBeGreaterThan(0);
      expect(r.purity).toBeLessThanOrEqual(1);
      expect(r.text.length).toBeGreaterThan(5);
      expect(r.sentence).toBe(`${r.text} → segment ${r.segment}${r.title ? ` (${r.title})` : ''}`);
    }
    // Thresholds in the raw units: trips per week are whole-ish numbers of trips, not z-scores.
    const trips = rules.rules.flatMap((r) => r.conditions).filter((c) => c.column === 'trips_per_week' && 'value' in c);
    for (const c of trips) expect((c as { value: number }).value).toBeGreaterThan(0.5);
    for (const r of rules.rules.filter((x) => x.segment === 2)) expect(r.sentence).toMatch(/→ segment 2 \(Weekday <peak> riders\)$/);
  });

  it('agreement equals what apply() gives on the training rows', () => {
    const given = rules.apply(training);
    expect(given).toHaveLength(training.length);
    let agree = 0;
    const hits = [0, 0, 0, 0];
    seg.assignment.forEach((s, i) => {
      if (given[i] === s + 1) {
        agree++;
        hits[s]++;
      }
    });
    expect(rules.agreement.overall).toBeCloseTo(agree / training.length, 15);
    rules.agreement.bySegment.forEach((share, s) => expect(share).toBeCloseTo(hits[s] / seg.sizes[s], 15));
    expect(rules.agreement.overall).toBeGreaterThan(0.7);
  });

  it('apply() keeps every new row, sends missing values and unseen levels down the larger branch, refuses unreadable cells', () => {
    expect(rules.apply(fresh)).toHaveLength(fresh.length);
    const bad = fresh.slice(0, 3).map((r) => ({ ...r }));
    bad[1].trips_per_week = 'many';
    expect(() => rules.apply(bad)).toThrow(/row 2, column "trips_per_week" holds "many"/);
    const { trips_per_week: _gone, ...rest } = fresh[0];
    void _gone;
    if (rules.columns.some((c) => c.name === 'trips_per_week')) expect(() => rules.apply([rest])).toThrow(/no column "trips_per_week"/);
  });

  it('a zone named with quotes and non-ASCII letters is split on by name and read back exactly', () => {
    expect(zoneRules.agreement.overall).toBe(1);
    expect(zoneRules.rules.some((r) => r.text.includes(`“${AWKWARD_ZONE}”`))).toBe(true);
    expect(zoneRules.toSql({ table: 't' })).toContain(`'Harbour''s "Quay" — Süd'`);
  });

  it('toSql quotes identifiers and levels', () => {
    const sql = rules.toSql({ table: 'pass "holders"', id: 'holder_id' });
    expect(sql).toMatch(/^SELECT "holder_id", CASE\n/);
    expect(sql).toContain('FROM "pass ""holders"""');
    const fake = rulesSql(
      [{ segment: 1, conditions: [{ column: 'home_zone', test: 'oneOf', levels: [AWKWARD_ZONE], orMissing: false }] }],
      { table: 't' },
    );
    expect(fake).toContain(`"home_zone" IN ('Harbour''s "Quay" — Süd')`);
  });

  it('the view lists the rules per segment, escaped, with a fragment for one segment', async () => {
    const html = rules.html();
    expect(html).toContain('Weekday &lt;peak&gt; riders');
    expect(html).not.toContain('Weekday <peak> riders');
    const { segmentRulesHtml } = await import('../../src/views');
    const fragment = segmentRulesHtml(rules, 1);
    expect(fragment).toContain('data-segment="1"');
    expect(fragment).not.toContain('"Quay"');
  });

  it('draws the tree: one box per leaf, branch conditions escaped, names from the segmentation', () => {
    const svg = rules.drawTree().svg();
    expect(svg.match(/rows · \d+%/g)).toHaveLength(rules.rules.length);
    expect(svg).toContain('Weekday &lt;peak');
    expect(svg).not.toContain('<peak>');
    const zoneSvg = rulesTreeView(labelledTree(zoneRules.tree.root, zoneRules.columns)).svg();
    expect(zoneSvg).toContain('“Harbour&#39;s');
    expect(zoneSvg).toContain('&quot;Quay&quot;');
  });
});

// ---- SQL on three engines: every row, the segment apply() gives --------------------------------

const CASES = [
  ['training row (k-means rules)', training, rules],
  ['new row (k-means rules)', fresh, rules],
  ['training row (zone rules)', training, zoneRules],
  ['new row (zone rules)', fresh, zoneRules],
] as const;

function createTableSql(name: string): string {
  const cols = [...TEXT.map((c) => `${quoteIdentifier(c)} TEXT`), ...NUMERIC.map((c) => `${quoteIdentifier(c)} DOUBLE PRECISION`)];
  return `CREATE TABLE ${quoteIdentifier(name)} (${cols.join(', ')})`;
}

function valuesSql(rows: Row[]): string {
  const cell = (v: Row[string], numeric: boolean) =>
    v === null || v === undefined ? 'NULL' : numeric ? doubleLiteral(Number(v)) : quoteString(String(v));
  return rows.map((r) => `(${[...TEXT.map((c) => cell(r[c], false)), ...NUMERIC.map((c) => cell(r[c], true))].join(', ')})`).join(',\n');
}

function expected(set: SegmentRules, rows: Row[]): Map<string, number> {
  const given = set.apply(rows);
  return new Map(rows.map((r, i) => [String(r.holder_id), given[i]]));
}

function compare(set: SegmentRules, rows: Row[], got: { holder_id: unknown; segment: unknown }[]): void {
  const want = expected(set, rows);
  expect(got).toHaveLength(rows.length);
  let mismatches = 0;
  for (const g of got) if (Number(g.segment) !== want.get(String(g.holder_id))) mismatches++;
  expect(mismatches).toBe(0);
}

describe('toSql on DuckDB', () => {
  let instance: DuckDBInstance;
  let db: DuckDBConnection;
  beforeAll(async () => {
    instance = await DuckDBInstance.create(':memory:');
    db = await instance.connect();
  });
  afterAll(() => db?.closeSync());
  for (const [name, rows, set] of CASES) {
    it(`agrees with apply() on every ${name}`, async () => {
      await db.run(`DROP TABLE IF EXISTS "pass ""holders"""`);
      await db.run(createTableSql('pass "holders"'));
      await db.run(`INSERT INTO "pass ""holders""" VALUES ${valuesSql(rows)}`);
      const got = (await db.runAndReadAll(set.toSql({ table: 'pass "holders"', id: 'holder_id' }))).getRowObjects();
      compare(set, rows, got as never);
    });
  }
});

describe('toSql on SQLite', () => {
  for (const [name, rows, set] of CASES) {
    it(`agrees with apply() on every ${name}`, () => {
      const db = new Database(':memory:');
      db.exec(createTableSql('pass "holders"'));
      const insert = db.prepare(`INSERT INTO "pass ""holders""" VALUES (${[...TEXT, ...NUMERIC].map(() => '?').join(', ')})`);
      db.transaction(() => {
        for (const r of rows) insert.run(...[...TEXT, ...NUMERIC].map((c) => (r[c] === undefined ? null : r[c])));
      })();
      const got = db.prepare(set.toSql({ table: 'pass "holders"', id: 'holder_id' })).all();
      compare(set, rows, got as never);
      db.close();
    });
  }
});

describe.skipIf(!serverAvailable.postgres)('toSql on PostgreSQL', () => {
  const pg = useServer('postgres');
  for (const [name, rows, set] of CASES) {
    it(`agrees with apply() on every ${name}`, async () => {
      const client = new Client({ connectionString: pg.server.url });
      await client.connect();
      try {
        await client.query(`DROP TABLE IF EXISTS "pass ""holders"""`);
        await client.query(createTableSql('pass "holders"'));
        await client.query(`INSERT INTO "pass ""holders""" VALUES ${valuesSql(rows)}`);
        const got = (await client.query(set.toSql({ table: 'pass "holders"', id: 'holder_id' }))).rows;
        compare(set, rows, got);
      } finally {
        await client.end();
      }
    }, 60_000);
  }
});
