'use strict';
// Timing helpers shared by every JavaScript tool in the bench: repeat a computation, keep each
// wall time, report the median. Only the computation is inside the timed region.

/**
 * Median of a list of numbers (the mean of the two middle values for an even count).
 * @param {number[]} values
 */
function median(values) {
  if (values.length === 0) return NaN;
  const sorted = values.slice().sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * Run `work()` up to `repeats` times and return every wall time in ms. After the first run, stop
 * early once the runs so far took `budgetMs` in all, so one slow case cannot eat the whole bench.
 * `prepare()` (untimed) is called before each run, e.g. to build fresh inputs.
 * @param {(input: any) => unknown} work
 * @param {Partial<Timing>} [timing]
 * @returns {Promise<number[]>}
 */
async function timeRepeats(work, { repeats, budgetMs = 30_000, prepare } = {}) {
  const times = [];
  let spent = 0;
  // No repeats given: no runs (r < undefined is false), as before typing.
  for (let r = 0; r < /** @type {number} */ (repeats); r++) {
    const input = prepare ? prepare() : undefined;
    if (typeof global.gc === 'function') global.gc(); // only when node runs with --expose-gc
    const start = process.hrtime.bigint();
    const out = await work(input);
    const ms = Number(process.hrtime.bigint() - start) / 1e6;
    keepAlive(out);
    times.push(ms);
    spent += ms;
    if (spent >= budgetMs) break;
  }
  return times;
}

// Hold on to the last result so the engine cannot treat the computation as dead code.
/** @type {unknown} */
let sink = null;
/** @param {unknown} value */
function keepAlive(value) {
  sink = value;
  return sink;
}

/**
 * @typedef {object} Timing
 * @property {number} repeats
 * @property {number} [budgetMs]
 * @property {() => any} [prepare]
 */

module.exports = { median, timeRepeats };
