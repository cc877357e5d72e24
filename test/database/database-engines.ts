// The four engines for a test file of the database passes: DuckDB and SQLite in memory always,
// PostgreSQL 15 and the two-shard ClickHouse when their servers can start (useServer; with
// KINSORT_REQUIRE_SERVERS=1 a server that cannot start fails the file instead of skipping it).
import { afterAll, beforeAll, expect } from 'vitest';
import { KinsortError } from '../../src/core/errors';
import { dialectNamed } from '../../src/engines/dialects';
import { clickhouseHttp, serverAvailable, useServer, type ClickHouseServer } from '../servers/servers';
import { clickhouseTestEngine, duckdbTestEngine, postgresTestEngine, sqliteTestEngine, type TestEngine } from '../engines/adapters';

export interface DatabaseEngines {
  /** Every engine that started, DuckDB first. */
  readonly all: TestEngine[];
  /** The ClickHouse server, when it started (for tables made by hand on one shard). */
  clickhouse(): ClickHouseServer | undefined;
}

export function useDatabaseEngines(): DatabaseEngines {
  const pg = serverAvailable.postgres ? useServer('postgres') : undefined;
  const ch = serverAvailable.clickhouse ? useServer('clickhouse') : undefined;
  const all: TestEngine[] = [];
  beforeAll(async () => {
    all.push(await duckdbTestEngine(), await sqliteTestEngine());
    if (pg) all.push(await postgresTestEngine(pg.server));
    if (ch) all.push(clickhouseTestEngine(ch.server));
  }, 120_000);
  afterAll(async () => {
    for (const e of all) await e.close();
  });
  return { all, clickhouse: () => ch?.server };
}

/** Names of the engines this file runs on, for describe titles. */
export const engineTitles = [
  'DuckDB',
  'SQLite',
  serverAvailable.postgres && 'PostgreSQL 15',
  serverAvailable.clickhouse && 'ClickHouse 18.16 (two shards)',
]
  .filter(Boolean)
  .join(', ');

/** ClickHouse: all rows in one plain MergeTree table on the first shard (no Distributed table). */
export async function loadOneClickHouseTable(
  server: ClickHouseServer,
  table: string,
  columns: readonly string[],
  rows: readonly (readonly (string | null)[])[],
): Promise<void> {
  const d = dialectNamed('clickhouse');
  const port = server.shards[0].httpPort;
  await clickhouseHttp(port, `DROP TABLE IF EXISTS ${d.quoteIdentifier(table)}`);
  await clickhouseHttp(
    port,
    `CREATE TABLE ${d.quoteIdentifier(table)} (${columns.map((c) => `${d.quoteIdentifier(c)} Nullable(String)`).join(', ')}) ENGINE = MergeTree() ORDER BY tuple()`,
  );
  const values = rows.map((r) => `(${r.map((c) => (c === null ? 'NULL' : d.quoteString(c))).join(', ')})`).join(',\n');
  await clickhouseHttp(port, `INSERT INTO ${d.quoteIdentifier(table)} VALUES ${values}`);
}

/** The engine's name as kinsort's messages give it. */
export const engineTitle = (e: TestEngine): string =>
  ({ duckdb: 'DuckDB', sqlite: 'SQLite', postgres: 'PostgreSQL', clickhouse: 'ClickHouse' })[e.dialect];

/** The KinsortError a call is refused with (the test fails when it is not refused, or not with one). */
export async function refusal(run: () => Promise<unknown>): Promise<KinsortError> {
  const error = await run().then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(KinsortError);
  return error as KinsortError;
}
