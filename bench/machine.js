'use strict';
// What the bench ran on, recorded with every run: cores, CPU, memory, versions, BLAS kernel, load.
const fs = require('fs');
const os = require('os');

function cpuModel() {
  try {
    const line = fs
      .readFileSync('/proc/cpuinfo', 'utf8')
      .split('\n')
      .find((l) => l.startsWith('model name'));
    return line ? line.split(':')[1].trim() : (os.cpus()[0]?.model ?? 'unknown');
  } catch {
    return os.cpus()[0]?.model ?? 'unknown';
  }
}

/** MemAvailable from /proc/meminfo in MB (free memory plus what the kernel can reclaim). */
function availableMB() {
  try {
    const match = /MemAvailable:\s+(\d+) kB/.exec(fs.readFileSync('/proc/meminfo', 'utf8'));
    if (match) return Number(match[1]) / 1024;
  } catch {
    /* not Linux: fall back below */
  }
  return os.freemem() / 2 ** 20;
}

/**
 * @param {{ mode: string, python?: PythonInfo | null, pythonMissing?: string | null, npmPeers: Record<string, string> }} run
 */
function describeMachine({ mode, python, pythonMissing, npmPeers }) {
  return {
    type: 'machine',
    date: new Date().toISOString(),
    cpus: os.cpus().length,
    cpuModel: cpuModel(),
    memoryGB: Math.round(os.totalmem() / 2 ** 30),
    availableMB: Math.round(availableMB()),
    node: process.version,
    python: python ?? null,
    pythonMissing: pythonMissing ?? null,
    // Set on some machines to pin OpenBLAS to one kernel; removed from the python peer's environment.
    openblasVariablesRemoved: ['OPENBLAS_CORETYPE', 'OPENBLAS_L2_SIZE'].filter((v) => v in process.env),
    npmPeers,
    mode,
    loadAverage: os.loadavg(),
    exposeGc: typeof global.gc === 'function',
  };
}

/**
 * @typedef {object} PythonInfo what the python peer reports about itself (bench/peer.py)
 * @property {string} python
 * @property {string} numpy
 * @property {string} scipy
 * @property {string} sklearn
 * @property {string} blasKernel
 * @property {{ internal_api: string, num_threads: number }[]} [threadpools]
 */

module.exports = { describeMachine, availableMB };
