'use strict';
// The memory case: Ward from vectors at n = 30,000. kinsort runs in a child node process, SciPy in
// a fresh python process, so each peak resident set size belongs to that computation alone.
const { runJsonChild } = require('./json-child');
const path = require('path');
const { timePythonOnce } = require('./python-peer');
const { availableMB } = require('./machine');
const { targetText, verdict } = require('./compare');

/** @typedef {{ ms: number, peakMB: number, note?: string }} ChildMeasure */

/**
 * @param {string} distDir
 * @param {import('./compare').BenchSet} set
 * @param {string} method
 * @param {number} timeoutMs
 * @returns {Promise<ChildMeasure>}
 */
async function runKinsortChild(distDir, set, method, timeoutMs) {
  const args = [path.join(__dirname, 'memory-child.js'), distDir, set.dataFile, String(set.n), String(set.d), method];
  const r = await runJsonChild(args, timeoutMs);
  return 'value' in r ? r.value : { ms: NaN, peakMB: NaN, note: `kinsort child ${r.failure}: ${r.stderr.slice(0, 3).join(' ')}` };
}

// SciPy at n = 30,000 took 77 s on a quiet run here (7 GB peak); a loaded machine needs longer.
const SCIPY_TIMEOUT_MS = 600_000;

/**
 * SciPy's linkage keeps the condensed matrix and a copy: about n² · 8 bytes.
 * @param {number} n
 */
function scipyNeedsMB(n) {
  return (n * n * 8) / 2 ** 20;
}

/**
 * @param {object} run
 * @param {any} run.kinsort the built package, looked up by function name
 * @param {string} run.distDir
 * @param {typeof import('./cases').MEMORY_CASE} run.memoryCase
 * @param {import('./compare').BenchSet} run.set
 * @param {import('./python-peer').PythonPeer | null} run.python
 * @param {boolean} run.skipPython
 */
async function runMemoryCase({ kinsort, distDir, memoryCase, set, python, skipPython }) {
  const base = { type: 'case', case: memoryCase.id, title: memoryCase.title, n: set.n, d: set.d };
  /** @type {ChildMeasure} */
  let mine;
  if (typeof kinsort[memoryCase.kinsortFunction] !== 'function') {
    mine = { ms: NaN, peakMB: NaN, note: `kinsort.${memoryCase.kinsortFunction} is not in dist/ yet` };
  } else {
    mine = await runKinsortChild(distDir, set, memoryCase.method, 3 * memoryCase.maxMs);
  }
  const limitsMet = mine.ms <= memoryCase.maxMs && mine.peakMB <= memoryCase.maxMB;
  /** @type {(import('./report').CaseRow & Record<string, unknown> & { kinsortTimes: number[] })[]} */
  const rows = [
    {
      ...base,
      tool: '(limits only)',
      kinsortMs: mine.ms,
      kinsortTimes: Number.isFinite(mine.ms) ? [mine.ms] : [],
      peerMs: NaN,
      peerTimes: [],
      ratio: null,
      target: `< ${memoryCase.maxMs / 1000} s and < ${memoryCase.maxMB} MB`,
      status: Number.isFinite(mine.ms) ? (limitsMet ? 'PASS' : 'MISS') : 'PENDING',
      peakMB: mine.peakMB,
      note: mine.note,
    },
  ];

  /** @type {ChildMeasure} */
  let peer = { ms: NaN, peakMB: NaN, note: 'python peer not run' };
  if (python && skipPython) peer.note = 'SciPy at this size skipped (--no-scipy-memory)';
  else if (python) {
    const need = scipyNeedsMB(set.n);
    const free = availableMB();
    if (free < 1.5 * need) {
      peer.note = `SciPy skipped: needs about ${need.toFixed(0)} MB, ${free.toFixed(0)} MB available`;
    } else {
      try {
        const reply = await timePythonOnce(memoryCase.method, set, {}, { repeats: 1, budgetMs: 0, timeoutMs: SCIPY_TIMEOUT_MS });
        peer = { ms: reply.times[0], peakMB: reply.peakMB };
      } catch (err) {
        peer.note = `SciPy failed: ${/** @type {Error} */ (err).message}`;
      }
    }
  }
  const ratio = mine.ms / peer.ms;
  rows.push({
    ...base,
    tool: 'SciPy linkage ward (own process)',
    kinsortMs: mine.ms,
    kinsortTimes: rows[0].kinsortTimes,
    peerMs: peer.ms,
    peerTimes: Number.isFinite(peer.ms) ? [peer.ms] : [],
    ratio: Number.isFinite(ratio) ? ratio : null,
    target: targetText(1.0),
    status: verdict(mine.ms, peer.ms, 1.0),
    peakMB: mine.peakMB,
    peerPeakMB: peer.peakMB,
    note: [mine.note, peer.note].filter(Boolean).join('; ') || undefined,
  });
  return rows;
}

module.exports = { runMemoryCase };
