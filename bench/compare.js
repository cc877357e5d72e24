'use strict';
// Side-by-side rows: kinsort and one peer on the same data set, timed in the same run.
const { median, timeRepeats } = require('./timing');

/** @param {number | null | undefined} ratioMax */
function targetText(ratioMax) {
  if (ratioMax === null || ratioMax === undefined) return 'none (information)';
  if (ratioMax < 1 && Number.isInteger(1 / ratioMax)) return `≥ ${1 / ratioMax}× faster`;
  return `≤ ${ratioMax.toFixed(1)}×`;
}

/**
 * PASS / MISS against the ratio target, or why there is no verdict.
 * @param {number} kinsortMs
 * @param {number} peerMs
 * @param {number | null | undefined} ratioMax
 */
function verdict(kinsortMs, peerMs, ratioMax) {
  if (!Number.isFinite(kinsortMs)) return 'PENDING';
  if (!Number.isFinite(peerMs)) return 'SKIP';
  if (ratioMax === null || ratioMax === undefined) return 'info';
  return kinsortMs / peerMs <= ratioMax ? 'PASS' : 'MISS';
}

/**
 * Time kinsort's call for a case on a data set: { ms, times } or { ms: NaN, note } when the
 * function has not landed in dist/ yet or fails.
 * @param {any} kinsort the built package, looked up by function name
 * @param {string} functionName
 * @param {(kinsort: any, matrix: any, set: BenchSet) => unknown} call
 * @param {BenchSet} set
 * @param {import('./timing').Timing} timing
 * @returns {Promise<Measured>}
 */
async function timeKinsort(kinsort, functionName, call, set, timing) {
  if (typeof kinsort[functionName] !== 'function') {
    return { ms: NaN, times: [], note: `kinsort.${functionName} is not in dist/ yet` };
  }
  const matrix = kinsort.createMatrix(set.n, set.d, set.data);
  try {
    const times = await timeRepeats(() => call(kinsort, matrix, set), timing);
    return { ms: median(times), times };
  } catch (err) {
    return { ms: NaN, times: [], note: `kinsort failed: ${/** @type {Error} */ (err).message}` };
  }
}

/**
 * @param {import('./python-peer').PythonPeer | null} python null when not run
 * @param {string} caseName
 * @param {BenchSet} set
 * @param {object | undefined} params
 * @param {import('./timing').Timing} timing
 * @returns {Promise<Measured>}
 */
async function timePython(python, caseName, set, params, timing) {
  if (!python) return { ms: NaN, times: [], note: 'python peer not run' };
  try {
    const { times } = await python.time(caseName, set, params, timing);
    return { ms: median(times), times };
  } catch (err) {
    return { ms: NaN, times: [], note: /** @type {Error} */ (err).message };
  }
}

/**
 * `rows` are arrays of arrays (the npm peers' input shape), built once per data set, untimed.
 * @param {(rows: number[][]) => unknown} work
 * @param {number[][]} rows
 * @param {import('./timing').Timing} timing
 * @returns {Promise<Measured>}
 */
async function timeNpm(work, rows, timing) {
  try {
    const times = await timeRepeats(() => work(rows), timing);
    return { ms: median(times), times };
  } catch (err) {
    return { ms: NaN, times: [], note: `failed: ${/** @type {Error} */ (err).message}` };
  }
}

/**
 * One output row (also one JSON line).
 * @param {{ caseId: string, title: string, set: { n: number, d: number }, tool: string, kinsort: Measured, peer: Measured, ratioMax?: number | null, extra?: object }} row
 */
function makeRow({ caseId, title, set, tool, kinsort, peer, ratioMax, extra }) {
  const ratio = kinsort.ms / peer.ms;
  const notes = [kinsort.note, peer.note].filter(Boolean);
  return {
    type: 'case',
    case: caseId,
    title,
    n: set.n,
    d: set.d,
    tool,
    kinsortMs: kinsort.ms,
    kinsortTimes: kinsort.times,
    peerMs: peer.ms,
    peerTimes: peer.times,
    ratio: Number.isFinite(ratio) ? ratio : null,
    target: targetText(ratioMax),
    status: verdict(kinsort.ms, peer.ms, ratioMax),
    peakMB: null,
    note: notes.join('; ') || undefined,
    ...extra,
  };
}

/**
 * @typedef {object} BenchSet a generated data set (see data.js)
 * @property {number} n
 * @property {number} d
 * @property {Float64Array} data
 * @property {Int32Array} labels
 * @property {string} dataFile
 * @property {string} labelsFile
 */
/** @typedef {{ ms: number, times: number[], note?: string }} Measured */
/**
 * @typedef {object} InterleavedTool
 * @property {(timing: import('./timing').Timing) => Promise<Measured>} run
 * @property {boolean} [warmUp]
 * @property {number} [maxRepeats]
 */

module.exports = { timeKinsort, timePython, timeNpm, makeRow, targetText, verdict };

/**
 * Time kinsort and every peer of a case in interleaved rounds (kinsort, peer 1, peer 2, kinsort,
 * …), so on a shared machine each tool sees the same background load rather than whatever load
 * happened to fall on its own block of repeats. `tools` are { run(timing) -> {ms, times, note},
 * maxRepeats? }; a tool stops when it failed, reached its repeats, or used its time budget.
 * @param {InterleavedTool[]} tools
 * @param {{ repeats: number, budgetMs: number }} limits
 * @returns {Promise<Measured[]>}
 */
async function timeInterleaved(tools, { repeats, budgetMs }) {
  const results = tools.map(() => ({
    times: /** @type {number[]} */ ([]),
    note: /** @type {string | undefined} */ (undefined),
    spent: 0,
    done: false,
  }));
  // One untimed warm-up run per tool (common practice for JIT-compiled code; harmless for the
  // others): the median then measures the computation, not the compiler's first pass over it.
  for (let t = 0; t < tools.length; t++) {
    if (tools[t].warmUp === false) continue;
    const once = await tools[t].run({ repeats: 1, budgetMs: 0 });
    if (once.note) results[t].note = once.note;
    if (!once.times.length) results[t].done = true;
  }
  for (let round = 0; round < repeats; round++) {
    for (let t = 0; t < tools.length; t++) {
      const result = results[t];
      if (result.done) continue;
      const once = await tools[t].run({ repeats: 1, budgetMs: 0 });
      if (once.note) result.note = once.note;
      if (!once.times.length) {
        result.done = true;
        continue;
      }
      result.times.push(...once.times);
      result.spent += once.times.reduce((a, b) => a + b, 0);
      if (result.spent >= budgetMs || result.times.length >= (tools[t].maxRepeats ?? repeats)) result.done = true;
    }
    if (results.every((r) => r.done)) break;
  }
  return results.map((r) => ({ ms: r.times.length ? median(r.times) : NaN, times: r.times, note: r.note }));
}

module.exports.timeInterleaved = timeInterleaved;
