#!/usr/bin/env node
// Database servers on loopback for the tests and for trying kinsort by hand: PostgreSQL 15 and a
// two-shard ClickHouse (two server processes and a `Distributed` table over both), each in its
// own temporary folder on free ports, stopped and removed afterwards. Debian's packages
// (`postgresql`, `clickhouse-server`) provide the programs; nothing is installed or started as a
// system service.
//
//   node scripts/db-servers.js start postgres|clickhouse   prints the servers' details as JSON
//                                                         and leaves them running
//   node scripts/db-servers.js stop FOLDER                 stops what `start` left in FOLDER
//
// From code: `const s = await startPostgres(); …; await s.stop()` (likewise startClickHouse).
'use strict';
const { execFileSync, spawn } = require('child_process');
const fs = require('fs');
const net = require('net');
const os = require('os');
const path = require('path');
const http = require('http');

const POSTGRES_BIN = process.env.KINSORT_POSTGRES_BIN || '/usr/lib/postgresql/15/bin';
const CLICKHOUSE_SERVER = process.env.KINSORT_CLICKHOUSE_SERVER || '/usr/sbin/clickhouse-server';

/**
 * A TCP port nobody listens on right now (the kernel picks it).
 * @returns {Promise<number>}
 */
function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      // Listening on TCP, so the address is an AddressInfo, never a pipe name or null.
      const { port } = /** @type {import('net').AddressInfo} */ (server.address());
      server.close(() => resolve(port));
    });
  });
}

/** @param {number} ms */
const sleep = (ms) => new Promise((r) => setTimeout(r, ms));
const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/**
 * PostgreSQL refuses to run as root: as root, its programs run as the `postgres` user.
 * @param {string} program
 * @param {string[]} args
 * @param {import('child_process').ExecFileSyncOptions} [options]
 */
function asPostgresUser(program, args, options = {}) {
  const file = path.join(POSTGRES_BIN, program);
  return isRoot() ? execFileSync('runuser', ['-u', 'postgres', '--', file, ...args], options) : execFileSync(file, args, options);
}

function postgresAvailable() {
  return fs.existsSync(path.join(POSTGRES_BIN, 'initdb')) && fs.existsSync(path.join(POSTGRES_BIN, 'pg_ctl'));
}

function clickhouseAvailable() {
  return fs.existsSync(CLICKHOUSE_SERVER);
}

/** @param {string} name */
function temporaryFolder(name) {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), `kinsort-${name}-`));
  fs.chmodSync(folder, 0o755);
  return folder;
}

/**
 * initdb + pg_ctl start in a fresh folder, trust authentication on loopback only, a unix socket in
 * the folder (never the system's). Returns { kind, folder, host, port, user, database, url, stop }.
 */
async function startPostgres() {
  if (!postgresAvailable()) {
    throw new Error(`PostgreSQL programs not found in ${POSTGRES_BIN} (Debian package "postgresql").`);
  }
  const folder = temporaryFolder('postgres');
  const data = path.join(folder, 'data');
  if (isRoot()) execFileSync('chown', ['-R', 'postgres:', folder]);
  asPostgresUser('initdb', ['-D', data, '-U', 'kinsort', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8'], { stdio: 'pipe' });
  const port = await freePort();
  const options = `-p ${port} -k ${folder} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off`;
  asPostgresUser('pg_ctl', ['-D', data, '-l', path.join(folder, 'server.log'), '-o', options, '-w', '-t', '60', 'start'], {
    stdio: 'pipe',
  });
  const info = {
    kind: 'postgres',
    folder,
    host: '127.0.0.1',
    port,
    user: 'kinsort',
    database: 'postgres',
    url: `postgres://kinsort@127.0.0.1:${port}/postgres`,
  };
  fs.writeFileSync(path.join(folder, 'server.json'), JSON.stringify(info, null, 2));
  return { ...info, stop: () => stopFolder(folder) };
}

/** @typedef {{ http: number, tcp: number, interserver: number }} ShardPorts */

/**
 * @param {string} folder
 * @param {number} shard
 * @param {ShardPorts} ports
 * @param {number[]} shardPorts
 */
function clickhouseConfig(folder, shard, ports, shardPorts) {
  const dir = path.join(folder, `shard${shard}`);
  for (const sub of ['data', 'tmp', 'user_files', 'log']) fs.mkdirSync(path.join(dir, sub), { recursive: true });
  const replicas = shardPorts.map((p) => `      <shard><replica><host>127.0.0.1</host><port>${p}</port></replica></shard>`).join('\n');
  const config = `<?xml version="1.0"?>
<yandex>
  <logger><level>warning</level><log>${dir}/log/server.log</log><errorlog>${dir}/log/error.log</errorlog><console>0</console></logger>
  <http_port>${ports.http}</http_port>
  <tcp_port>${ports.tcp}</tcp_port>
  <interserver_http_port>${ports.interserver}</interserver_http_port>
  <listen_host>127.0.0.1</listen_host>
  <max_connections>64</max_connections>
  <keep_alive_timeout>3</keep_alive_timeout>
  <uncompressed_cache_size>67108864</uncompressed_cache_size>
  <mark_cache_size>67108864</mark_cache_size>
  <path>${dir}/data/</path>
  <tmp_path>${dir}/tmp/</tmp_path>
  <user_files_path>${dir}/user_files/</user_files_path>
  <users_config>${folder}/users.xml</users_config>
  <default_profile>default</default_profile>
  <default_database>default</default_database>
  <remote_servers>
    <kinsort_two_shards>
${replicas}
    </kinsort_two_shards>
  </remote_servers>
</yandex>
`;
  const file = path.join(dir, 'config.xml');
  fs.writeFileSync(file, config);
  return file;
}

const CLICKHOUSE_USERS = `<?xml version="1.0"?>
<yandex>
  <profiles><default><max_memory_usage>4000000000</max_memory_usage></default></profiles>
  <users><default><password></password><networks><ip>127.0.0.1</ip></networks><profile>default</profile><quota>default</quota></default></users>
  <quotas><default><interval><duration>3600</duration><queries>0</queries><errors>0</errors><result_rows>0</result_rows><read_rows>0</read_rows><execution_time>0</execution_time></interval></default></quotas>
</yandex>
`;

/**
 * One statement over ClickHouse's HTTP interface; resolves to the response text.
 * @param {number} port
 * @param {string} sql
 * @returns {Promise<string>}
 */
function clickhouseHttp(port, sql) {
  return new Promise((resolve, reject) => {
    const request = http.request(
      { host: '127.0.0.1', port, method: 'POST', path: '/', headers: { 'Content-Type': 'text/plain; charset=utf-8' } },
      (response) => {
        /** @type {Buffer[]} */
        const chunks = [];
        response.on('data', (c) => chunks.push(c));
        response.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          if (response.statusCode === 200) resolve(text);
          else reject(new Error(`ClickHouse on port ${port}: ${text.trim()}`));
        });
      },
    );
    request.on('error', reject);
    request.end(sql);
  });
}

/**
 * @param {number} port
 * @param {import('child_process').ChildProcess} process
 * @param {string} log
 */
async function waitUntilAnswering(port, process, log) {
  for (let i = 0; i < 300; i++) {
    if (process.exitCode !== null) break;
    try {
      await clickhouseHttp(port, 'SELECT 1');
      return;
    } catch {
      await sleep(100);
    }
  }
  const tail = fs.existsSync(log) ? fs.readFileSync(log, 'utf8').slice(-2000) : '';
  throw new Error(`ClickHouse on port ${port} did not start within 30 s.\n${tail}`);
}

/**
 * Two clickhouse-server processes on loopback, each one shard of the cluster "kinsort_two_shards".
 * Returns { kind, folder, cluster, shards: [{ httpPort, tcpPort }], stop }. Tables are made by the
 * caller: a local table on each shard and a `Distributed(kinsort_two_shards, db, local, …)` over them.
 */
async function startClickHouse() {
  if (!clickhouseAvailable()) {
    throw new Error(`ClickHouse server not found at ${CLICKHOUSE_SERVER} (Debian package "clickhouse-server").`);
  }
  const folder = temporaryFolder('clickhouse');
  fs.writeFileSync(path.join(folder, 'users.xml'), CLICKHOUSE_USERS);
  /** @type {ShardPorts[]} */
  const ports = [];
  for (let s = 0; s < 2; s++) ports.push({ http: await freePort(), tcp: await freePort(), interserver: await freePort() });
  const pids = [];
  const started = [];
  for (let s = 0; s < 2; s++) {
    const config = clickhouseConfig(
      folder,
      s + 1,
      ports[s],
      ports.map((p) => p.tcp),
    );
    const log = path.join(folder, `shard${s + 1}`, 'log', 'console.log');
    const out = fs.openSync(log, 'a');
    const child = spawn(CLICKHOUSE_SERVER, [`--config-file=${config}`], { detached: true, stdio: ['ignore', out, out] });
    child.unref();
    pids.push(child.pid);
    started.push({ child, log });
  }
  fs.writeFileSync(path.join(folder, 'pids'), pids.join('\n'));
  try {
    await Promise.all(started.map((s, i) => waitUntilAnswering(ports[i].http, s.child, s.log)));
  } catch (e) {
    stopFolder(folder);
    throw e;
  }
  const info = {
    kind: 'clickhouse',
    folder,
    cluster: 'kinsort_two_shards',
    shards: ports.map((p) => ({ host: '127.0.0.1', httpPort: p.http, tcpPort: p.tcp })),
  };
  fs.writeFileSync(path.join(folder, 'server.json'), JSON.stringify(info, null, 2));
  return { ...info, stop: () => stopFolder(folder) };
}

/** @param {number} pid */
function processAlive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Stop whatever `start` left in `folder` (PostgreSQL via pg_ctl, ClickHouse by its pids), then remove the folder. */
/** @param {string} folder */
function stopFolder(folder) {
  const data = path.join(folder, 'data');
  if (fs.existsSync(path.join(data, 'postmaster.pid'))) {
    try {
      asPostgresUser('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop'], { stdio: 'pipe' });
    } catch {
      /* already stopped */
    }
  }
  const pidFile = path.join(folder, 'pids');
  if (fs.existsSync(pidFile)) {
    const pids = fs.readFileSync(pidFile, 'utf8').split('\n').filter(Boolean).map(Number);
    for (const pid of pids) {
      try {
        process.kill(pid, 'SIGKILL');
      } catch {
        /* already gone */
      }
    }
    const until = Date.now() + 5000;
    while (pids.some(processAlive) && Date.now() < until) execFileSync('sleep', ['0.05']);
  }
  fs.rmSync(folder, { recursive: true, force: true });
}

module.exports = { startPostgres, startClickHouse, stopFolder, clickhouseHttp, postgresAvailable, clickhouseAvailable };

if (require.main === module) {
  const [command, what] = process.argv.slice(2);
  const usage = 'usage: node scripts/db-servers.js start postgres|clickhouse | stop FOLDER';
  (async () => {
    if (command === 'start' && (what === 'postgres' || what === 'clickhouse')) {
      const server = what === 'postgres' ? await startPostgres() : await startClickHouse();
      const { stop: _stop, ...info } = server;
      console.log(JSON.stringify(info, null, 2));
      console.error(`stop with: node scripts/db-servers.js stop ${info.folder}`);
    } else if (command === 'stop' && what) {
      stopFolder(path.resolve(what));
    } else {
      console.error(usage);
      process.exitCode = 2;
    }
  })().catch((e) => {
    console.error(e.message);
    process.exitCode = 1;
  });
}
