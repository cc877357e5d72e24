'use strict';
// Data for the database case: n rows × d numeric columns plus an id, written by DuckDB itself to
// Parquet files (nothing passes through node). Each row belongs to one of 8 centres drawn from the
// bench seed with kinsort's generator; its values are that centre plus normal noise made from
// DuckDB's hash() of (row number, seed, column) by the Box–Muller transform: deterministic, no
// Math.random, the same files for the same seed and DuckDB version.
const fs = require('fs');
const path = require('path');

const CENTRE_COUNT = 8;
const SPREAD = 1.5;
const PARTS = 4;

/**
 * @param {any} kinsort the built package
 * @param {any} connection a DuckDB connection (@duckdb/node-api)
 * @param {{ n: number, d: number, seed: number, dir: string }} options
 * @returns {Promise<{ glob: string, columns: string[] }>}
 */
async function writeParquet(kinsort, connection, { n, d, seed, dir }) {
  fs.mkdirSync(dir, { recursive: true });
  const rng = kinsort.createRandom(seed).fork('database-centres');
  const centres = Array.from({ length: CENTRE_COUNT * d }, () => rng.uniform(-10, 10));
  const list = `[${centres.map((c) => c.toPrecision(17)).join(', ')}]::DOUBLE[]`;
  // A uniform in (0, 1) from 53 bits of a 64-bit hash.
  /** @param {number} stream */
  const uniform = (stream) => `((hash(i, ${seed}, ${stream}) >> 11)::DOUBLE + 0.5) / 9007199254740992.0`;
  const columns = Array.from({ length: d }, (_, j) => `x${j + 1}`);
  const values = columns.map(
    (name, j) =>
      `list_extract(${list}, CAST(c * ${d} + ${j + 1} AS BIGINT)) + ${SPREAD} * sqrt(-2 * ln(${uniform(2 * j)})) * cos(2 * pi() * ${uniform(2 * j + 1)}) AS ${name}`,
  );
  for (let p = 0; p < PARTS; p++) {
    const from = Math.floor((p * n) / PARTS);
    const to = Math.floor(((p + 1) * n) / PARTS);
    const file = path.join(dir, `part-${p}.parquet`);
    await connection.run(
      `COPY (SELECT i AS id, ${values.join(', ')} FROM (SELECT i, hash(i, ${seed}) % ${CENTRE_COUNT} AS c FROM range(${from}, ${to}) t(i))) TO '${file}' (FORMAT parquet)`,
    );
  }
  return { glob: path.join(dir, 'part-*.parquet'), columns };
}

module.exports = { writeParquet, CENTRE_COUNT };
