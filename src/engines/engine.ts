// An engine is a dialect and a way to run one statement: `{ dialect, query(sql) }`. kinsort never
// imports a database driver; these wrap the connection object a user already has, so the drivers
// stay the user's choice (optional peers). Another engine is three lines:
//   const engine = { dialect: 'sqlite', query: async (sql) => db.prepare(sql).all() };
import { KinsortError } from '../core/errors';
import type { DialectName } from './dialect';

export interface SqlEngine {
  readonly dialect: DialectName;
  /** Run one statement; rows as plain objects keyed by column name. */
  query(sql: string): Promise<Record<string, unknown>[]>;
}

/** A DuckDB connection from `@duckdb/node-api` (`(await DuckDBInstance.create()).connect()`). */
export function duckdbEngine(connection: {
  runAndReadAll(sql: string): Promise<{ getRowObjectsJS(): Record<string, unknown>[] }>;
}): SqlEngine {
  if (typeof connection?.runAndReadAll !== 'function') {
    throw new KinsortError('duckdbEngine: give a connection from @duckdb/node-api (instance.connect()).', 'bad-argument');
  }
  return { dialect: 'duckdb', query: async (sql) => (await connection.runAndReadAll(sql)).getRowObjectsJS() };
}

/** A PostgreSQL client or pool from `pg` (connected). */
export function postgresEngine(client: { query(sql: string): Promise<{ rows: Record<string, unknown>[] }> }): SqlEngine {
  if (typeof client?.query !== 'function') {
    throw new KinsortError('postgresEngine: give a connected Client or Pool from pg.', 'bad-argument');
  }
  return { dialect: 'postgres', query: async (sql) => (await client.query(sql)).rows };
}
