// sampleFromDatabase on DuckDB, SQLite, PostgreSQL 15 and ClickHouse 18.16 (two shards behind a
// Distributed table). Outside check: the keys are recomputed here from their stated definition
// (MD5 by Node's crypto, FNV-1a + MurmurHash3 finaliser in plain integer arithmetic), and every
// engine must return exactly the rows with the smallest keys, in key order.
import { describe, expect, it } from 'vitest';
import { sampleFromDatabase, type DatabaseSample } from '../../src/engines/sample';
import { sampleKeyFnv, sampleKeyMd5 } from '../../src/engines/sample-order';
import { study } from '../../src/study';
import { engineTitle, engineTitles, loadOneClickHouseTable, refusal, type DatabaseEngines } from './database-engines';

const COLUMNS = ['rider', 'trips', 'zone'];
/** Ids of every kind the text rule keeps: leading zeros, spaces, accents, emoji, quotes. */
function table(n: number): (string | null)[][] {
  const awkward = ['007', ' 7', 'Zoë', 'a\'b"c', '🚲-1', '1e3', '-0', 'NULL?', 'x\\y'];
  return Array.from({ length: n }, (_, i) => [
    i < awkward.length ? awkward[i] : `r-${String(i).padStart(4, '0')}`,
    String((i * 37) % 101),
    ['north', 'south', 'east'][i % 3],
  ]);
}

/** The stated method, computed here: smallest keys first, ties by the id's UTF-8 bytes. */
function expectedIds(dialect: string, ids: readonly string[], seed: string, rows: number): string[] {
  const keyed = ids.map((id) => ({ id, key: dialect === 'sqlite' ? sampleKeyFnv(seed, id) : sampleKeyMd5(seed, id) }));
  keyed.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : Buffer.compare(Buffer.from(a.id), Buffer.from(b.id))));
  return keyed.slice(0, rows).map((k) => k.id);
}

function shuffled<T>(values: readonly T[], seed: number): T[] {
  const out = [...values];
  let s = seed;
  for (let i = out.length - 1; i > 0; i--) {
    s = (Math.imul(s, 1103515245) + 12345) >>> 0;
    const j = s % (i + 1);
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

const rowsOf = (s: DatabaseSample) => s.records().map((r) => COLUMNS.map((c) => r[c]));

/** The cases, registered on engines started once for the database tests (database.test.ts). */
export function sampleCases(engines: DatabaseEngines): void {
  describe(`sampleFromDatabase on ${engineTitles}`, () => {
    const rows = table(400);
    const ids = rows.map((r) => r[0] as string);

    it('takes exactly the rows with the smallest keys of the seed and id text, in key order', async () => {
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        for (const seed of [7, 'autumn']) {
          const sample = await sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 60, seed });
          expect(sample.ids, `${engine.dialect}, seed ${seed}`).toEqual(expectedIds(engine.dialect, ids, String(seed), 60));
          expect(sample.population).toBe(400);
          expect(sample.columnNames()).toEqual(COLUMNS);
          // Cells come back exactly as stored.
          const byId = new Map(rows.map((r) => [r[0], r]));
          for (const r of rowsOf(sample)) expect(r, engine.dialect).toEqual(byId.get(r[0]));
        }
      }
    });

    it('gives the same sample whatever the physical order of the rows', async () => {
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        const first = await sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 50, seed: 3 });
        await engine.loadText('riders', COLUMNS, shuffled(rows, 99));
        const again = await sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 50, seed: 3 });
        expect(rowsOf(again), engine.dialect).toEqual(rowsOf(first));
        const other = await sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 50, seed: 4 });
        expect(other.ids, engine.dialect).not.toEqual(first.ids);
      }
    });

    it('DuckDB, PostgreSQL and ClickHouse draw one sample for one seed (the same MD5 key)', async () => {
      const samples: string[][] = [];
      for (const engine of engines.all.filter((e) => e.dialect !== 'sqlite')) {
        await engine.loadText('riders', COLUMNS, rows);
        samples.push([...(await sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 40, seed: 11 })).ids]);
      }
      for (const s of samples) expect(s).toEqual(samples[0]);
    });

    it('ClickHouse: two shards behind a Distributed table give the sample of the same rows in one table', async () => {
      const server = engines.clickhouse();
      const engine = engines.all.find((e) => e.dialect === 'clickhouse');
      if (!server || !engine) return; // no ClickHouse here (and not required): the other engines ran
      await engine.loadText('riders_spread', COLUMNS, rows);
      await loadOneClickHouseTable(server, 'riders_whole', COLUMNS, [...rows].reverse());
      const spread = await sampleFromDatabase(engine, { table: 'riders_spread', id: 'rider', rows: 70, seed: 5 });
      const whole = await sampleFromDatabase(engine, { table: 'riders_whole', id: 'rider', rows: 70, seed: 5 });
      expect(rowsOf(spread)).toEqual(rowsOf(whole));
      expect(spread.ids).toEqual(expectedIds('clickhouse', ids, '5', 70));
    });

    it('a sample goes straight into study(), ids kept exactly as text', async () => {
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        const sample = await sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 400, seed: 1 });
        const prepared = study(sample, { id: 'rider', types: { trips: 'numeric', zone: 'categorical' } }).prepare({ scale: 'zscore' });
        expect([...prepared.ids].sort(), engine.dialect).toEqual([...ids].sort());
        expect(prepared.ids).toContain('007');
        expect(prepared.ids).toContain(' 7');
      }
    });

    it('samples a query of the user, and only the columns asked for', async () => {
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, rows);
        const north = rows.filter((r) => r[2] === 'north');
        const sample = await sampleFromDatabase(engine, {
          query: "SELECT rider, trips FROM riders WHERE zone = 'north';",
          id: 'rider',
          rows: 30,
          seed: 2,
          columns: ['trips'],
        });
        expect(sample.columnNames()).toEqual(['rider', 'trips']);
        expect(sample.population).toBe(north.length);
        expect(sample.ids, engine.dialect).toEqual(
          expectedIds(
            engine.dialect,
            north.map((r) => r[0] as string),
            '2',
            30,
          ),
        );
      }
    });
  });

  describe(`sampleFromDatabase refuses clearly, naming the engine, on ${engineTitles}`, () => {
    it('a table that is not there, a column that is not there', async () => {
      for (const engine of engines.all) {
        await engine.loadText('riders', COLUMNS, table(20));
        const noTable = await refusal(() => sampleFromDatabase(engine, { table: 'no_such_riders', id: 'rider', rows: 5 }));
        expect(noTable.message).toContain(`sampleFromDatabase on ${engineTitle(engine)}: table "no_such_riders" cannot be read`);
        const noColumn = await refusal(() => sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 5, columns: ['tripz'] }));
        expect(noColumn.message).toContain(`on ${engineTitle(engine)}: table "riders" has no column "tripz"`);
        const noId = await refusal(() => sampleFromDatabase(engine, { table: 'riders', id: 'rider_id', rows: 5 }));
        expect(noId.message).toContain('has no column "rider_id"');
      }
    });

    it('rows without an id, and an id that is not unique', async () => {
      for (const engine of engines.all) {
        const rows = table(20);
        await engine.loadText('riders', COLUMNS, [...rows, [null, '1', 'north']]);
        const missing = await refusal(() => sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 5 }));
        expect(missing.message).toContain(`1 of 21 rows of table "riders" have no id`);
        await engine.loadText('riders', COLUMNS, [...rows, rows[3]]);
        const twice = await refusal(() => sampleFromDatabase(engine, { table: 'riders', id: 'rider', rows: 21 }));
        expect(twice.code).toBe('duplicate-id');
      }
    });

    it('an id is required', async () => {
      const engine = engines.all[0];
      const error = await refusal(() => sampleFromDatabase(engine, { table: 'riders', rows: 5 } as never));
      expect(error.message).toContain('give id');
    });
  });

  describe('the engines this run used', () => {
    it('includes every server the machine has (all four where KINSORT_REQUIRE_SERVERS=1)', () => {
      if (process.env.KINSORT_REQUIRE_SERVERS === '1')
        expect(engines.all.map((e) => e.dialect)).toEqual(['duckdb', 'sqlite', 'postgres', 'clickhouse']);
    });
  });
}
