// Engine adapters for the tests: each is `{ dialect, query }` (src/engines/engine.ts) plus a way
// to load a table whose every column is text, as a warehouse table loaded from CSV without type
// guessing holds it. DuckDB and PostgreSQL use the adapters kinsort ships; SQLite (better-sqlite3)
// and ClickHouse (its HTTP interface, two shards behind a Distributed table) are written here, as
// a user would write them.
import Database from 'better-sqlite3';
import { DuckDBInstance } from '@duckdb/node-api';
import { Client } from 'pg';
import { dialectNamed } from '../../src/engines/dialects';
import { duckdbEngine, postgresEngine, type SqlEngine } from '../../src/engines/engine';
import { clickhouseHttp, type ClickHouseServer, type PostgresServer } from '../servers/servers';

export interface TestEngine extends SqlEngine {
  /** Create `table` with text columns (NULL allowed) and these rows; replaces an older one. */
  loadText(table: string, columns: readonly string[], rows: readonly (readonly (string | null)[])[]): Promise<void>;
  close(): Promise<void>;
}

function valuesList(engine: SqlEngine, rows: readonly (readonly (string | null)[])[]): string {
  const d = dialectNamed(engine.dialect);
  return rows.map((r) => `(${r.map((c) => (c === null ? 'NULL' : d.quoteString(c))).join(', ')})`).join(',\n');
}

export async function duckdbTestEngine(): Promise<TestEngine> {
  const instance = await DuckDBInstance.create(':memory:');
  const connection = await instance.connect();
  const engine = duckdbEngine(connection);
  const d = dialectNamed('duckdb');
  return {
    ...engine,
    async loadText(table, columns, rows) {
      await engine.query(
        `CREATE OR REPLACE TABLE ${d.quoteIdentifier(table)} (${columns.map((c) => `${d.quoteIdentifier(c)} VARCHAR`).join(', ')})`,
      );
      for (let i = 0; i < rows.length; i += 500)
        await engine.query(`INSERT INTO ${d.quoteIdentifier(table)} VALUES ${valuesList(engine, rows.slice(i, i + 500))}`);
    },
    async close() {
      connection.closeSync();
    },
  };
}

export async function postgresTestEngine(server: PostgresServer): Promise<TestEngine> {
  const client = new Client({ connectionString: server.url });
  await client.connect();
  // Doubles come back as JavaScript numbers (pg's default for float8 already), bigints as text.
  const engine = postgresEngine(client);
  const d = dialectNamed('postgres');
  return {
    ...engine,
    async loadText(table, columns, rows) {
      await engine.query(`DROP TABLE IF EXISTS ${d.quoteIdentifier(table)}`);
      await engine.query(`CREATE TABLE ${d.quoteIdentifier(table)} (${columns.map((c) => `${d.quoteIdentifier(c)} TEXT`).join(', ')})`);
      for (let i = 0; i < rows.length; i += 500)
        await engine.query(`INSERT INTO ${d.quoteIdentifier(table)} VALUES ${valuesList(engine, rows.slice(i, i + 500))}`);
    },
    close: () => client.end(),
  };
}

export async function sqliteTestEngine(): Promise<TestEngine> {
  const db = new Database(':memory:');
  const d = dialectNamed('sqlite');
  return {
    dialect: 'sqlite',
    query: async (sql) => db.prepare(sql).all() as Record<string, unknown>[],
    async loadText(table, columns, rows) {
      db.exec(`DROP TABLE IF EXISTS ${d.quoteIdentifier(table)}`);
      db.exec(`CREATE TABLE ${d.quoteIdentifier(table)} (${columns.map((c) => `${d.quoteIdentifier(c)} TEXT`).join(', ')})`);
      const insert = db.prepare(`INSERT INTO ${d.quoteIdentifier(table)} VALUES (${columns.map(() => '?').join(', ')})`);
      db.transaction(() => rows.forEach((r) => insert.run(...r)))();
    },
    async close() {
      db.close();
    },
  };
}

/**
 * ClickHouse over HTTP, rows as JSON. `loadText` makes a MergeTree table on each of the two shards
 * and a Distributed table over both under the given name; rows alternate between the shards.
 */
export function clickhouseTestEngine(server: ClickHouseServer): TestEngine {
  const d = dialectNamed('clickhouse');
  const [first, second] = server.shards.map((s) => (sql: string) => clickhouseHttp(s.httpPort, sql));
  return {
    dialect: 'clickhouse',
    async query(sql) {
      const text = await first(`${sql.trimEnd()}\nFORMAT JSONEachRow`);
      return text
        .split('\n')
        .filter((l) => l !== '')
        .map((l) => JSON.parse(l) as Record<string, unknown>);
    },
    async loadText(table, columns, rows) {
      const local = d.quoteIdentifier(`${table}_local`);
      for (const shard of [first, second]) {
        await shard(`DROP TABLE IF EXISTS ${d.quoteIdentifier(table)}`);
        await shard(`DROP TABLE IF EXISTS ${local}`);
        await shard(
          `CREATE TABLE ${local} (${columns.map((c) => `${d.quoteIdentifier(c)} Nullable(String)`).join(', ')}) ENGINE = MergeTree() ORDER BY tuple()`,
        );
      }
      await first(
        `CREATE TABLE ${d.quoteIdentifier(table)} AS ${local} ENGINE = Distributed(${server.cluster}, default, ${local.replace(/`/g, '')})`,
      );
      const halves = [rows.filter((_, i) => i % 2 === 0), rows.filter((_, i) => i % 2 === 1)];
      const engine = { dialect: 'clickhouse' as const, query: async () => [] };
      if (halves[0].length > 0) await first(`INSERT INTO ${local} VALUES ${valuesList(engine, halves[0])}`);
      if (halves[1].length > 0) await second(`INSERT INTO ${local} VALUES ${valuesList(engine, halves[1])}`);
    },
    async close() {},
  };
}
