'use strict';
// The larger-than-memory case: 20 million rows × 8 numeric columns in Parquet files, read by
// DuckDB with its memory capped, through sampleFromDatabase → k-means on the sample →
// refineInDatabase (Lloyd over every row in SQL) → scoring → profileInDatabase, in a child
// process whose peak resident memory (node and DuckDB together) is measured. A second child holds
// every row in memory (not capped) and runs Lloyd from the same start: the within-SS of the two
// must agree within 0.1 %. The data are written once per run by DuckDB (not timed).
const fs = require('fs');
const path = require('path');
const { writeParquet } = require('./database-data');
const { runJsonChild } = require('./json-child');

/**
 * @param {string[]} args
 * @param {number} timeoutMs
 * @returns {Promise<any>} the child's last JSON line, or { error }
 */
async function runChild(args, timeoutMs) {
  const r = await runJsonChild(args, timeoutMs, { echo: true });
  return 'value' in r ? r.value : { error: `${r.failure}: ${r.stderr.slice(0, 4).join(' ')}` };
}

/**
 * @param {object} run
 * @param {any} run.kinsort the built package
 * @param {string} run.distDir
 * @param {typeof import('./cases').DATABASE_CASE} run.databaseCase
 * @param {{ n: number, d: number }} run.size
 * @param {number} run.seed
 * @param {string} run.scratch a folder for the Parquet files
 * @param {(text: string) => void} run.progress
 */
async function runDatabaseCase({ kinsort, distDir, databaseCase, size, seed, scratch, progress }) {
  const { DuckDBInstance } = require('@duckdb/node-api');
  const dir = path.join(scratch, `database-${size.n}x${size.d}-${seed}`);
  const writer = await (await DuckDBInstance.create(':memory:', { threads: '2' })).connect();
  progress(`database-refine: writing ${size.n.toLocaleString('en-US')} × ${size.d} to Parquet`);
  const { glob } = await writeParquet(kinsort, writer, { ...size, seed, dir });
  writer.closeSync();
  const base = { type: 'case', case: databaseCase.id, title: databaseCase.title, n: size.n, d: size.d };
  progress(`database-refine: the path with memory_limit ${databaseCase.memoryLimit}, threads ${databaseCase.threads}`);
  const path1 = await runChild(
    [
      path.join(__dirname, 'database-child.js'),
      distDir,
      glob,
      String(Math.min(databaseCase.sampleRows, size.n)),
      String(databaseCase.k),
      String(seed),
      databaseCase.memoryLimit,
      String(databaseCase.threads),
    ],
    databaseCase.timeoutMs,
  );
  /** @type {any} */
  let check = { error: 'not run: the database path failed' };
  if (!path1.error) {
    progress('database-refine: the check, every row in memory, Lloyd from the same start');
    const specFile = path.join(dir, 'start.json');
    fs.writeFileSync(specFile, JSON.stringify({ columns: path1.columns, startCenters: path1.startCenters }));
    check = await runChild([path.join(__dirname, 'database-lloyd-child.js'), distDir, glob, specFile], databaseCase.timeoutMs);
  }
  fs.rmSync(dir, { recursive: true, force: true });
  const ssGap = !path1.error && !check.error ? Math.abs(path1.withinSS - check.withinSS) / check.withinSS : NaN;
  const limitsMet = path1.totalMs <= databaseCase.maxMs && path1.peakMB <= databaseCase.maxMB && ssGap <= databaseCase.maxSSGap;
  const phases = path1.ms
    ? Object.entries(path1.ms)
        .map(([phase, ms]) => `${phase} ${/** @type {number} */ (ms / 1000).toFixed(1)} s`)
        .join(', ')
    : '';
  const note = path1.error
    ? `database path: ${path1.error}`
    : [
        phases,
        `${path1.iterations} Lloyd iterations (${path1.stoppedBy})`,
        `within-SS ${path1.withinSS.toPrecision(10)} in SQL vs ${check.error ? `— (${check.error})` : `${check.withinSS.toPrecision(10)} in memory (${check.iterations} iterations, own process)`}`,
        Number.isFinite(ssGap) ? `gap ${(ssGap * 100).toPrecision(2)} %` : '',
      ]
        .filter(Boolean)
        .join('; ');
  return [
    {
      ...base,
      // The check is not a peer doing the same work: its figures are in the note and in checkMs.
      tool: '(limits only)',
      kinsortMs: path1.error ? NaN : path1.totalMs,
      kinsortTimes: path1.error ? [] : [path1.totalMs],
      peerMs: NaN,
      checkMs: check.error ? NaN : check.lloydMs,
      peerTimes: [],
      ratio: null,
      target: `< ${databaseCase.maxMs / 1000} s, < ${databaseCase.maxMB} MB, within-SS within ${databaseCase.maxSSGap * 100} %`,
      status: path1.error ? 'FAIL' : limitsMet ? 'PASS' : 'MISS',
      peakMB: path1.error ? NaN : path1.peakMB,
      ssGap,
      iterations: path1.iterations,
      phasesMs: path1.ms,
      note,
    },
  ];
}

module.exports = { runDatabaseCase };
