// The database servers the engine tests use start, answer and stop (scripts/db-servers.js).
import { existsSync } from 'fs';
import { describe, expect, it } from 'vitest';
import { Client } from 'pg';
import { clickhouseHttp, serverAvailable, useServer } from './servers';

describe.skipIf(!serverAvailable.postgres)('PostgreSQL 15 on loopback', () => {
  const pg = useServer('postgres');
  it('answers a query', async () => {
    const client = new Client({ connectionString: pg.server.url });
    await client.connect();
    try {
      const { rows } = await client.query("SELECT split_part(version(), ' ', 2) AS v, 1.5::float8 * 2 AS x");
      expect(rows[0].v).toMatch(/^15\./);
      expect(rows[0].x).toBe(3);
    } finally {
      await client.end();
    }
  });
});

describe.skipIf(!serverAvailable.clickhouse)('ClickHouse, two shards behind one Distributed table', () => {
  const ch = useServer('clickhouse');
  it('splits rows across both shards and reads them back through the Distributed table', async () => {
    const [one, two] = ch.server.shards.map((s) => (sql: string) => clickhouseHttp(s.httpPort, sql));
    for (const shard of [one, two]) {
      await shard('CREATE TABLE points_local (id String, x Float64) ENGINE = MergeTree() ORDER BY id');
    }
    await one(`CREATE TABLE points AS points_local ENGINE = Distributed(${ch.server.cluster}, default, points_local, rand())`);
    await one("INSERT INTO points_local VALUES ('a', 1.5), ('b', 2)");
    await two("INSERT INTO points_local VALUES ('c', 3)");
    expect((await one('SELECT count(), sum(x) FROM points')).trim()).toBe('3\t6.5');
    expect((await two('SELECT count() FROM points_local')).trim()).toBe('1');
  });
  it('leaves nothing behind once stopped', () => {
    expect(existsSync(ch.server.folder)).toBe(true);
  });
});
