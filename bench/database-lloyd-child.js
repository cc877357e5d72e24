'use strict';
// Child process of the database case: the check. Every row of the Parquet files in memory (n × d
// float64, prepared with the sample's centres and spreads exactly as the SQL prepares them), then
// Lloyd's iterations from the same start as the database path (kinsort kmeans with the given
// centres, no single-row transfers): its within-SS. Not memory-capped.
//   node bench/database-lloyd-child.js <dist dir> <parquet glob> <json: { columns, startCenters }>
const fs = require('fs');

const [distDir, glob, specFile] = process.argv.slice(2);
const kinsort = require(distDir);
const { DuckDBInstance } = require('@duckdb/node-api');

async function main() {
  /** @type {{ columns: { name: string, center: number, spread: number }[], startCenters: number[][] }} */
  const spec = JSON.parse(fs.readFileSync(specFile, 'utf8'));
  const instance = await DuckDBInstance.create(':memory:', { threads: '2' });
  const connection = await instance.connect();
  const names = spec.columns.map((c) => `"${c.name}"`).join(', ');
  const count = await connection.runAndReadAll(`SELECT count(*) AS n FROM read_parquet('${glob}')`);
  const n = Number(count.getRowObjectsJS()[0].n);
  const d = spec.columns.length;
  const data = new Float64Array(n * d);
  const started = process.hrtime.bigint();
  const result = await connection.run(`SELECT ${names} FROM read_parquet('${glob}')`);
  let row = 0;
  for (;;) {
    const chunk = await result.fetchChunk();
    if (!chunk || chunk.rowCount === 0) break;
    for (let j = 0; j < d; j++) {
      const vector = chunk.getColumnVector(j);
      const { center, spread } = spec.columns[j];
      // (x − center) / spread, as the SQL (and applyPreparation) computes it.
      for (let i = 0; i < chunk.rowCount; i++) {
        const x = /** @type {number} */ (vector.getItem(i));
        data[(row + i) * d + j] = (x - center) / spread;
      }
    }
    row += chunk.rowCount;
  }
  const readMs = Number(process.hrtime.bigint() - started) / 1e6;
  const matrix = kinsort.createMatrix(n, d, data);
  const t = process.hrtime.bigint();
  const fit = kinsort.kmeans(matrix, {
    k: spec.startCenters.length,
    start: spec.startCenters,
    refine: false,
    maxIterations: 300,
    tolerance: 0,
  });
  const lloydMs = Number(process.hrtime.bigint() - t) / 1e6;
  process.stdout.write(
    JSON.stringify({ n, withinSS: fit.withinSS, iterations: fit.iterations, converged: fit.converged, readMs, lloydMs }) + '\n',
  );
  connection.closeSync();
}

main().catch((err) => {
  process.stderr.write(`lloyd child: ${err.stack ?? err.message}\n`);
  process.exitCode = 1;
});
