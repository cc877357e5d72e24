'use strict';
// Child process of the database case: the whole larger-than-memory path with DuckDB's memory
// capped — seeded sample, k-means on it in memory, Lloyd over every row in SQL, scoring, profiles —
// and this process's peak resident memory (node and DuckDB share it: /proc/self/status VmHWM).
//   node bench/database-child.js <dist dir> <parquet glob> <sample rows> <k> <seed> <memory limit> <threads>
const fs = require('fs');

const [distDir, glob, sampleText, kText, seedText, memoryLimit, threads] = process.argv.slice(2);
const kinsort = require(distDir);
const { DuckDBInstance } = require('@duckdb/node-api');

/** Peak resident set of this process in MB (Linux), else from resourceUsage. */
function peakMB() {
  try {
    const m = /VmHWM:\s+(\d+) kB/.exec(fs.readFileSync('/proc/self/status', 'utf8'));
    if (m) return Number(m[1]) / 1024;
  } catch {
    /* not Linux: below */
  }
  return process.resourceUsage().maxRSS / 1024;
}

async function main() {
  const k = Number(kText);
  const seed = Number(seedText);
  const instance = await DuckDBInstance.create(':memory:', { memory_limit: memoryLimit, threads });
  const connection = await instance.connect();
  const engine = kinsort.duckdbEngine(connection);
  // The table the path reads: a view over the Parquet files (kinsort writes nothing).
  await engine.query(`CREATE VIEW points AS SELECT * FROM read_parquet('${glob.replace(/'/g, "''")}')`);
  /** @type {Record<string, number>} */
  const ms = {};
  let last = process.hrtime.bigint();
  const start = last;
  /** @param {string} phase */
  const lap = (phase) => {
    const now = process.hrtime.bigint();
    ms[phase] = Number(now - last) / 1e6;
    last = now;
    process.stderr.write(`database child: ${phase} ${(ms[phase] / 1000).toFixed(1)} s, peak ${peakMB().toFixed(0)} MB\n`);
  };

  const sample = await kinsort.sampleFromDatabase(engine, { table: 'points', id: 'id', rows: Number(sampleText), seed });
  lap('sample');
  const fitted = kinsort.study(sample, { id: 'id' }).prepare({ scale: 'zscore' }).kmeans({ k, seed, restarts: 10 });
  const definition = fitted.definition().definition;
  lap('kmeansOnSample');
  // The fluent path a user takes: Lloyd over every row, then the profiles in SQL (approximate
  // quartiles: exact ones would hold every value of a column in DuckDB's memory).
  const whole = await fitted.refineInDatabase(engine, {
    table: 'points',
    maxIterations: 100,
    quantiles: 'approximate',
    onProgress: (/** @type {{ done: number, detail?: string }} */ e) =>
      process.stderr.write(`database child: ${e.done} ${e.detail ?? ''}\n`),
  });
  const refined = whole.population;
  if (!refined) throw new Error('refineInDatabase gave no whole-table figures');
  lap('refineAndProfile');
  const sql = whole.definition().toSql({ table: 'points', engine });
  const scored = await engine.query(
    `SELECT count(*) AS rows, sum(distance * distance) AS ss, count(DISTINCT segment) AS segments FROM (${sql}) AS s`,
  );
  lap('score');
  const profile = refined.profile;
  const totalMs = Number(process.hrtime.bigint() - start) / 1e6;
  const prep = definition.preparation;
  process.stdout.write(
    JSON.stringify({
      ms,
      totalMs,
      peakMB: peakMB(),
      rows: refined.rows,
      iterations: refined.iterations,
      stoppedBy: refined.stoppedBy,
      withinSS: refined.withinSS,
      scoredSS: Number(scored[0].ss),
      scoredRows: Number(scored[0].rows),
      profileQueries: profile.queries,
      sizes: profile.profiles.map((/** @type {{ size: number }} */ p) => p.size),
      startCenters: definition.segments.map((/** @type {{ center: number[] }} */ s) => s.center),
      columns: prep.columns.map((/** @type {{ name: string, center: number, spread: number }} */ c) => ({
        name: c.name,
        center: c.center,
        spread: c.spread,
      })),
    }) + '\n',
  );
  connection.closeSync();
}

main().catch((err) => {
  process.stderr.write(`database child: ${err.stack ?? err.message}\n`);
  process.exitCode = 1;
});
