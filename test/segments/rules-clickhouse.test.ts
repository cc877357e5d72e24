// toSql on ClickHouse (two shards behind a Distributed table, test/servers): every row, the
// segment apply() gives, for the training rows and new rows with missing values and unseen levels.
import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import { dialectNamed } from '../../src/engines';

const { quoteIdentifier, quoteString, doubleLiteral } = dialectNamed('clickhouse');
import { clickhouseHttp, serverAvailable, useServer } from '../servers/servers';
import { NUMERIC, TEXT, newRows, trainingRows, zoneRulesFor, type Row } from './rules-data';

const training = trainingRows();
const fresh = newRows(training);
const seg = study(training, { id: 'holder_id' }).prepare({ scale: 'zscore', missing: 'median' }).kmeans({ k: 4, seed: 3, restarts: 4 });
const rules = seg.rules({ depth: 4, minLeaf: 10 });
const zoneRules = zoneRulesFor(training);

function valuesSql(rows: Row[]): string {
  const cell = (v: Row[string], numeric: boolean) =>
    v === null || v === undefined ? 'NULL' : numeric ? doubleLiteral(Number(v)) : quoteString(String(v));
  return rows.map((r) => `(${[...TEXT.map((c) => cell(r[c], false)), ...NUMERIC.map((c) => cell(r[c], true))].join(', ')})`).join(', ');
}

describe.skipIf(!serverAvailable.clickhouse)('toSql on ClickHouse (Distributed over two shards)', () => {
  const ch = useServer('clickhouse');
  it('agrees with apply() on every training and new row', async () => {
    const [one, two] = ch.server.shards.map((s) => (sql: string) => clickhouseHttp(s.httpPort, sql));
    const columns = [
      ...TEXT.map((c) => `${quoteIdentifier(c)} Nullable(String)`),
      ...NUMERIC.map((c) => `${quoteIdentifier(c)} Nullable(Float64)`),
    ].join(', ');
    for (const shard of [one, two]) await shard(`CREATE TABLE holders_local (${columns}) ENGINE = MergeTree() ORDER BY tuple()`);
    await one(`CREATE TABLE holders AS holders_local ENGINE = Distributed(${ch.server.cluster}, default, holders_local, rand())`);
    const rows = [...training, ...fresh];
    const half = Math.floor(rows.length / 2);
    await one(`INSERT INTO holders_local VALUES ${valuesSql(rows.slice(0, half))}`);
    await two(`INSERT INTO holders_local VALUES ${valuesSql(rows.slice(half))}`);
    for (const set of [rules, zoneRules]) {
      const answer = await one(`${set.toSql({ table: 'holders', id: 'holder_id', dialect: 'clickhouse' })} FORMAT TabSeparated`);
      const got = new Map(
        answer
          .trim()
          .split('\n')
          .map((line) => line.split('\t'))
          .map(([id, s]) => [id, Number(s)]),
      );
      const want = set.apply(rows);
      expect(got.size).toBe(rows.length);
      let mismatches = 0;
      rows.forEach((r, i) => {
        if (got.get(String(r.holder_id)) !== want[i]) mismatches++;
      });
      expect(mismatches).toBe(0);
    }
  }, 120_000);
});
