#!/usr/bin/env node
'use strict';
// kinsort bench: each case on the same data for kinsort and its peers (SciPy, scikit-learn,
// ml-kmeans, ml-hclust), computation only, medians of several repeats, ratios against targets.
//
//   npm run build                           # the bench uses dist/, it builds nothing itself
//   node --expose-gc bench/run.js [--quick] [--json [FILE]] [--only ID,ID] [--no-python]
//                                 [--no-scipy-memory] [--no-scaling]
//
// --json alone writes JSON lines to stdout (and nothing else there); --json FILE writes them to
// FILE and prints the table as usual.
const fs = require('fs');
const path = require('path');
const { MAIN_CASES, HCLUST_CASES, HCLUST_MAX_ROWS, MEMORY_CASE, DATABASE_CASE, SCALING, SEED } = require('./cases');
const { benchDir, prepareDataSet, removeScratch, toNestedRows } = require('./data');
const { timeKinsort, timePython, timeNpm, timeInterleaved, makeRow } = require('./compare');
const { pythonPeerAvailable, startPythonPeer, PYTHON } = require('./python-peer');
const { loadNpmPeers } = require('./npm-peers');
const { runMemoryCase } = require('./memory');
const { runDatabaseCase } = require('./database');
const { runScaling } = require('./scaling');
const { describeMachine } = require('./machine');
const { caseTable, scalingTable, machineText } = require('./report');

const DIST = path.join(__dirname, '..', 'dist');

/** @param {string[]} argv */
function parseArgs(argv) {
  /** @type {{ quick: boolean, json: string | null, only: Set<string> | null, python: boolean, scipyMemory: boolean, scaling: boolean }} */
  const args = { quick: false, json: null, only: null, python: true, scipyMemory: true, scaling: true };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--quick') args.quick = true;
    else if (a === '--no-python') args.python = false;
    else if (a === '--no-scipy-memory') args.scipyMemory = false;
    else if (a === '--no-scaling') args.scaling = false;
    else if (a === '--only') args.only = new Set((argv[++i] ?? '').split(','));
    else if (a === '--json') args.json = argv[i + 1] && !argv[i + 1].startsWith('--') ? argv[++i] : '-';
    else
      throw new Error(`unknown argument ${a}; allowed: --quick, --json [FILE], --only IDS, --no-python, --no-scipy-memory, --no-scaling`);
  }
  return args;
}

function loadKinsort() {
  if (!fs.existsSync(path.join(DIST, 'index.js'))) {
    throw new Error('dist/ is missing: build first with `npm run build`.');
  }
  return require(DIST);
}

async function main() {
  const args = parseArgs(process.argv.slice(2));
  const toStdout = args.json === '-';
  /** @param {string} text */
  const say = (text) => (toStdout ? process.stderr : process.stdout).write(text + '\n');
  /** @param {string} text */
  const progress = (text) => process.stderr.write(`  … ${text}\n`);
  /** @param {string} id */
  const wanted = (id) => !args.only || args.only.has(id);

  const kinsort = loadKinsort();
  /** @param {{ quick: { n: number, d: number }, full: { n: number, d: number } }} c */
  const size = (c) => (args.quick ? c.quick : c.full);
  const hclustMaxRows = args.quick ? HCLUST_MAX_ROWS.quick : HCLUST_MAX_ROWS.full;
  // Repeats: medians of up to 5 (quick: one run, it only proves the harness works); a tool stops
  // repeating once its runs took the budget.
  const timing = args.quick ? { repeats: 1, budgetMs: 5_000 } : { repeats: 5, budgetMs: 20_000 };

  let python = null;
  let pythonMissing = null;
  if (!args.python) pythonMissing = 'turned off with --no-python';
  else if (!pythonPeerAvailable()) pythonMissing = `${PYTHON} with numpy, scipy and sklearn not found`;
  else python = startPythonPeer();
  const npmPeers = await loadNpmPeers();
  const machine = describeMachine({
    mode: args.quick ? 'quick (tiny sizes, CI smoke)' : 'full',
    python: python ? await python.info() : null,
    pythonMissing,
    npmPeers: npmPeers.versions,
  });

  /** @type {import('./report').CaseRow[]} */
  const rows = [];
  /** @type {Record<string, { n: number, ms: number }>} */
  const hclustMeasured = {};
  try {
    // ml-hclust first, at a size it finishes, so the big cases can say how long it would take.
    for (const hc of HCLUST_CASES) {
      if (!wanted(hc.method)) continue;
      const set = prepareDataSet(kinsort, { ...size(hc), seed: SEED, tag: hc.id });
      const nested = toNestedRows(set.data, set.n, set.d);
      progress(`${hc.method} ${set.n} × ${set.d}: kinsort and ml-hclust, interleaved`);
      /** @type {import('./cases').MainCase['kinsort']} */
      const call = (ks, m) => ks.agglomerate(m, { method: hc.method });
      const [mine, theirs] = await timeInterleaved(
        [
          { run: (t) => timeKinsort(kinsort, 'agglomerate', call, set, t) },
          { run: (t) => timeNpm((r) => npmPeers.agglomerate(r, hc.method), nested, t), maxRepeats: 1, warmUp: false },
        ],
        timing,
      );
      hclustMeasured[hc.method] = { n: set.n, ms: theirs.ms };
      // Every ml-hclust method is also a main case of that name.
      const title = /** @type {import('./cases').MainCase} */ (MAIN_CASES.find((c) => c.id === hc.method)).title;
      rows.push(makeRow({ caseId: hc.id, title, set, tool: `ml-hclust agnes ${hc.method}`, kinsort: mine, peer: theirs, ratioMax: 0.01 }));
    }

    for (const c of MAIN_CASES) {
      if (!wanted(c.id)) continue;
      const set = prepareDataSet(kinsort, { ...size(c), seed: SEED, tag: c.id, spread: c.spread });
      const nested = c.peers.some((p) => p.npm || p.hclust) ? toNestedRows(set.data, set.n, set.d) : null;
      progress(`${c.id} ${set.n} × ${set.d}: kinsort, ${c.peers.map((p) => p.tool).join(', ')}, interleaved`);
      // In the closures below the peer's fields are those the if/else chain chose it by, and
      // `nested` was built because a peer has npm or hclust: the casts only say so.
      /** @type {import('./compare').InterleavedTool[]} */
      const tools = [{ run: (t) => timeKinsort(kinsort, c.kinsortFunction, c.kinsort, set, t), warmUp: c.warmUp }];
      for (const peer of c.peers) {
        if (peer.python)
          tools.push({
            run: (t) => timePython(python, /** @type {string} */ (peer.python), set, (args.quick && peer.quickParams) || peer.params, t),
            warmUp: c.warmUp,
          });
        else if (peer.npm)
          tools.push({
            run: (t) =>
              timeNpm((r) => /** @type {NonNullable<typeof peer.npm>} */ (peer.npm)(npmPeers, r), /** @type {number[][]} */ (nested), t),
            maxRepeats: peer.repeats,
          });
        else if (set.n > hclustMaxRows) {
          const note = hclustSkipNote(set.n, hclustMaxRows, hclustMeasured[/** @type {string} */ (peer.hclust)]);
          tools.push({ run: async () => ({ ms: NaN, times: [], note }) });
        } else
          tools.push({
            run: (t) => timeNpm((r) => npmPeers.agglomerate(r, /** @type {string} */ (peer.hclust)), /** @type {number[][]} */ (nested), t),
          });
      }
      const [mine, ...theirs] = await timeInterleaved(tools, timing);
      c.peers.forEach((peer, i) =>
        rows.push(makeRow({ caseId: c.id, title: c.title, set, tool: peer.tool, kinsort: mine, peer: theirs[i], ratioMax: peer.ratioMax })),
      );
    }

    if (wanted(MEMORY_CASE.id)) {
      const set = prepareDataSet(kinsort, { ...size(MEMORY_CASE), seed: SEED, tag: MEMORY_CASE.id });
      progress(`${MEMORY_CASE.id} ${set.n} × ${set.d}: kinsort child, then SciPy in its own process`);
      rows.push(...(await runMemoryCase({ kinsort, distDir: DIST, memoryCase: MEMORY_CASE, set, python, skipPython: !args.scipyMemory })));
    }

    if (wanted(DATABASE_CASE.id)) {
      // Tiny under --quick (it proves the harness); 20 million rows in a full run.
      const dbSize = size(DATABASE_CASE);
      rows.push(
        ...(await runDatabaseCase({
          kinsort,
          distDir: DIST,
          databaseCase: DATABASE_CASE,
          size: dbSize,
          seed: SEED,
          scratch: benchDir(),
          progress,
        })),
      );
    }

    /** @type {Awaited<ReturnType<typeof runScaling>>} */
    let scaling = [];
    if (args.scaling) {
      progress('scaling: n, 2n, 4n');
      const cases = MAIN_CASES.filter((c) => wanted(c.id));
      scaling = await runScaling({
        kinsort,
        cases,
        scaling: SCALING,
        quick: args.quick,
        python,
        seed: SEED,
        timing: { repeats: args.quick ? 1 : 3, budgetMs: 10_000 },
      });
    }

    const lines = [machine, ...rows, ...scaling].map((r) => JSON.stringify(r, finiteOrNull)).join('\n') + '\n';
    if (toStdout) process.stdout.write(lines);
    else if (args.json) fs.writeFileSync(args.json, lines);
    say(machineText(machine));
    say('');
    say(caseTable(rows));
    if (scaling.length) say('\nScaling with n\n' + scalingTable(scaling));
    say('\nTimes are wall-clock medians in ms of the computation only; the machine may be shared, so figures are noisy.');
  } finally {
    if (python) python.close();
    removeScratch();
  }
}

/**
 * @param {number} n
 * @param {number} maxRows
 * @param {{ n: number, ms: number } | undefined} measured
 */
function hclustSkipNote(n, maxRows, measured) {
  const estimate =
    measured && Number.isFinite(measured.ms)
      ? ` (it took ${Math.round(measured.ms)} ms at n = ${measured.n}; cubic growth gives about ${seconds(measured.ms * (n / measured.n) ** 3)} here)`
      : '';
  return `ml-hclust skipped above n = ${maxRows}: it is cubic in n${estimate}`;
}

/** @param {number} ms */
function seconds(ms) {
  return ms >= 10_000 ? `${Math.round(ms / 1000)} s` : `${(ms / 1000).toFixed(1)} s`;
}

// JSON has no NaN: write missing figures as null.
/**
 * @param {string} key
 * @param {unknown} value
 */
function finiteOrNull(key, value) {
  return typeof value === 'number' && !Number.isFinite(value) ? null : value;
}

main().catch((err) => {
  process.stderr.write(`bench: ${err.message}\n`);
  process.exitCode = 1;
});
