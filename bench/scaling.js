'use strict';
// Scaling: each main case at n, 2n and 4n, for kinsort and its first python peer. The growth per
// doubling, sqrt(t(4n) / t(n)), is about 2 for work linear in n and about 4 for quadratic work.
const { prepareDataSet } = require('./data');
const { timeKinsort, timePython } = require('./compare');

/** @param {number[]} ms */
function growthPerDoubling(ms) {
  const g = Math.sqrt(ms[2] / ms[0]);
  return Number.isFinite(g) ? g : null;
}

/**
 * @param {object} run
 * @param {import('./data').Kinsort} run.kinsort
 * @param {import('./cases').MainCase[]} run.cases
 * @param {Record<string, { full: number, quick: number }>} run.scaling
 * @param {boolean} run.quick
 * @param {import('./python-peer').PythonPeer | null} run.python
 * @param {number} run.seed
 * @param {import('./timing').Timing} run.timing
 */
async function runScaling({ kinsort, cases, scaling, quick, python, seed, timing }) {
  const rows = [];
  for (const c of cases) {
    const base = scaling[c.id] && (quick ? scaling[c.id].quick : scaling[c.id].full);
    if (!base) continue;
    const d = (quick ? c.quick : c.full).d;
    const sizes = [base, 2 * base, 4 * base];
    const pythonPeer = c.peers.find((p) => p.python);
    const mine = [];
    const theirs = [];
    for (const n of sizes) {
      const set = prepareDataSet(kinsort, { n, d, seed, tag: `scale-${c.id}` });
      mine.push((await timeKinsort(kinsort, c.kinsortFunction, c.kinsort, set, timing)).ms);
      if (pythonPeer)
        theirs.push(
          (await timePython(python, /** @type {string} found by p.python */ (pythonPeer.python), set, pythonPeer.params, timing)).ms,
        );
    }
    rows.push({
      type: 'scaling',
      case: c.id,
      title: c.title,
      d,
      tool: 'kinsort',
      sizes,
      ms: mine,
      growthPerDoubling: growthPerDoubling(mine),
    });
    if (pythonPeer) {
      rows.push({
        type: 'scaling',
        case: c.id,
        title: c.title,
        d,
        tool: pythonPeer.tool,
        sizes,
        ms: theirs,
        growthPerDoubling: growthPerDoubling(theirs),
      });
    }
  }
  return rows;
}

module.exports = { runScaling };
