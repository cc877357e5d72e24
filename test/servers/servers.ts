// Real database servers for a test file: PostgreSQL 15 and a two-shard ClickHouse, started on
// loopback in temporary folders by scripts/db-servers.js before the file's tests and stopped after.
// Where Debian's server programs are absent the engine's tests are skipped with the reason, unless
// KINSORT_REQUIRE_SERVERS=1 (set by .ci/run), which turns a missing server into a failure.
import { afterAll, beforeAll } from 'vitest';

const servers = require('../../scripts/db-servers.js') as {
  startPostgres(): Promise<PostgresServer>;
  startClickHouse(): Promise<ClickHouseServer>;
  clickhouseHttp(port: number, sql: string): Promise<string>;
  postgresAvailable(): boolean;
  clickhouseAvailable(): boolean;
};

export interface PostgresServer {
  kind: 'postgres';
  folder: string;
  host: string;
  port: number;
  user: string;
  database: string;
  url: string;
  stop(): void;
}

export interface ClickHouseServer {
  kind: 'clickhouse';
  folder: string;
  /** Cluster name for Distributed(cluster, database, local_table, sharding_key). */
  cluster: string;
  shards: { host: string; httpPort: number; tcpPort: number }[];
  stop(): void;
}

const required = process.env.KINSORT_REQUIRE_SERVERS === '1';

/** Whether this machine can run the engine's tests (or must: then a missing server fails). */
export const serverAvailable = {
  postgres: required || servers.postgresAvailable(),
  clickhouse: required || servers.clickhouseAvailable(),
};

/** One statement over a ClickHouse server's HTTP interface, answer as text. */
export const clickhouseHttp = servers.clickhouseHttp;

/**
 * Start the server before this file's tests and stop it after. Read `.server` inside tests only.
 * Use with `describe.skipIf(!serverAvailable.postgres)`.
 */
export function useServer<K extends 'postgres' | 'clickhouse'>(
  kind: K,
): { readonly server: K extends 'postgres' ? PostgresServer : ClickHouseServer } {
  let started: PostgresServer | ClickHouseServer | undefined;
  beforeAll(async () => {
    if (!serverAvailable[kind]) return;
    started = kind === 'postgres' ? await servers.startPostgres() : await servers.startClickHouse();
  }, 120_000);
  afterAll(() => started?.stop());
  return {
    get server() {
      if (!started) throw new Error(`the ${kind} server did not start`);
      return started as never;
    },
  };
}
