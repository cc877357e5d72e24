'use strict';
// Child process of the memory case: run one kinsort agglomeration on a raw float64 file and
// report its wall time and this process's peak resident memory (so nothing else is counted).
//   node bench/memory-child.js <dist dir> <data file> <n> <d> <method>
const { readFloat64 } = require('./data');

const [distDir, dataFile, nText, dText, method] = process.argv.slice(2);
const kinsort = require(distDir);
const n = Number(nText);
const d = Number(dText);
const matrix = kinsort.createMatrix(n, d, readFloat64(dataFile));
const beforeMB = process.resourceUsage().maxRSS / 1024; // maxRSS is in KiB
const start = process.hrtime.bigint();
const tree = kinsort.agglomerate(matrix, { method });
const ms = Number(process.hrtime.bigint() - start) / 1e6;
const peakMB = process.resourceUsage().maxRSS / 1024;
process.stdout.write(JSON.stringify({ ms, peakMB, beforeMB, merges: tree.merges.length }) + '\n');
