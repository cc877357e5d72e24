'use strict';
// Bench data: Gaussian blobs from the package's own seeded generator, written once per case to a
// temp file of raw little-endian float64 (row-major) that every tool reads. The blob each row was
// drawn from is written beside it as raw int32, for the silhouette case.
const fs = require('fs');
const os = require('os');
const path = require('path');

const BLOB_COUNT = 8;
const BLOB_SPREAD = 1.5; // standard deviation within a blob; centres lie in [-10, 10]^d

/**
 * n × d blob data as { data: Float64Array, labels: Int32Array }, reproducible from `seed`. A case
 * may ask for a wider `spread` (standard deviation within a blob) to make the blobs overlap.
 * @param {Kinsort} kinsort
 * @param {number} n
 * @param {number} d
 * @param {number} seed
 * @param {{ spread?: number }} [options]
 */
function makeBlobs(kinsort, n, d, seed, { spread = BLOB_SPREAD } = {}) {
  const rng = kinsort.createRandom(seed);
  const centreRng = rng.fork('centres');
  const centres = new Float64Array(BLOB_COUNT * d);
  for (let i = 0; i < centres.length; i++) centres[i] = centreRng.uniform(-10, 10);
  const pointRng = rng.fork('points');
  const data = new Float64Array(n * d);
  const labels = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const blob = pointRng.int(BLOB_COUNT);
    labels[i] = blob;
    for (let j = 0; j < d; j++) data[i * d + j] = centres[blob * d + j] + spread * pointRng.normal();
  }
  return { data, labels };
}

/** @type {string | null} */
let scratchDir = null;
function benchDir() {
  if (!scratchDir) scratchDir = fs.mkdtempSync(path.join(os.tmpdir(), 'kinsort-bench-'));
  return scratchDir;
}

/**
 * Write a typed array's bytes to a temp file named `name`; returns the path.
 * @param {string} name
 * @param {Float64Array | Int32Array} typed
 */
function writeRaw(name, typed) {
  const file = path.join(benchDir(), name);
  fs.writeFileSync(file, Buffer.from(typed.buffer, typed.byteOffset, typed.byteLength));
  return file;
}

/**
 * Read a raw float64 file back (used by the child process of the memory case).
 * @param {string} file
 */
function readFloat64(file) {
  const bytes = fs.readFileSync(file);
  const copy = new Float64Array(bytes.byteLength / 8);
  new Uint8Array(copy.buffer).set(bytes);
  return copy;
}

/**
 * Generate one data set and write it: { n, d, data, labels, dataFile, labelsFile }.
 * @param {Kinsort} kinsort
 * @param {{ n: number, d: number, seed: number, tag: string, spread?: number }} spec
 * @returns {import('./compare').BenchSet}
 */
function prepareDataSet(kinsort, { n, d, seed, tag, spread }) {
  const { data, labels } = makeBlobs(kinsort, n, d, seed, { spread });
  const stem = `${tag}-${n}x${d}`;
  return {
    n,
    d,
    data,
    labels,
    dataFile: writeRaw(`${stem}.f64`, data),
    labelsFile: writeRaw(`${stem}.i32`, labels),
  };
}

function removeScratch() {
  if (scratchDir) fs.rmSync(scratchDir, { recursive: true, force: true });
  scratchDir = null;
}

/**
 * Nested number[][] copy, for the npm peers that take arrays of arrays (built outside the timing).
 * @param {Float64Array} data
 * @param {number} n
 * @param {number} d
 * @returns {number[][]}
 */
function toNestedRows(data, n, d) {
  const rows = new Array(n);
  for (let i = 0; i < n; i++) rows[i] = Array.from(data.subarray(i * d, (i + 1) * d));
  return rows;
}

/** @typedef {typeof import('../src/index')} Kinsort the built package (dist/, typed from src/) */

module.exports = { benchDir, makeBlobs, prepareDataSet, readFloat64, removeScratch, toNestedRows, BLOB_COUNT };
