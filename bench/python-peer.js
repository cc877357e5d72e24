'use strict';
// The SciPy / scikit-learn peer: one long-lived /usr/bin/python3 process (bench/peer.py) per run,
// spoken to in JSON lines. Start-up and imports happen once, outside every timing.
const { spawn, spawnSync } = require('child_process');
const path = require('path');
const readline = require('readline');

const PYTHON = '/usr/bin/python3'; // the Debian interpreter with python3-scipy / python3-sklearn
const PEER_SCRIPT = path.join(__dirname, 'peer.py');

/**
 * The environment the peer runs in: this machine may set OPENBLAS_CORETYPE / OPENBLAS_L2_SIZE,
 * which pin OpenBLAS to a slower kernel; a fair peer lets OpenBLAS pick its own.
 */
function peerEnvironment() {
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  return env;
}

/** Whether /usr/bin/python3 exists and imports numpy, scipy and sklearn. */
function pythonPeerAvailable() {
  const probe = spawnSync(PYTHON, ['-c', 'import numpy, scipy, sklearn'], { env: peerEnvironment() });
  return probe.status === 0;
}

function startPythonPeer() {
  const child = spawn(PYTHON, [PEER_SCRIPT], { env: peerEnvironment(), stdio: ['pipe', 'pipe', 'pipe'] });
  const lines = readline.createInterface({ input: child.stdout });
  /** @type {{ resolve: (reply: any) => void, reject: (err: Error) => void }[]} */
  const waiting = [];
  let stderr = '';
  /** @type {number | null} */
  let exited = null;
  child.stderr.on('data', (chunk) => {
    stderr = (stderr + chunk).slice(-4000);
  });
  lines.on('line', (line) => {
    const next = waiting.shift();
    if (!next) return;
    try {
      const reply = JSON.parse(line);
      if (reply.error) next.reject(new Error(`python peer: ${reply.error}`));
      else next.resolve(reply);
    } catch (err) {
      next.reject(new Error(`python peer sent a line that is not JSON: ${line.slice(0, 200)}`));
    }
  });
  child.on('exit', (code) => {
    exited = code;
    for (const w of waiting.splice(0)) w.reject(new Error(`python peer exited (${code}): ${stderr}`));
  });

  /**
   * @param {object} command
   * @returns {Promise<any>} the peer's JSON reply
   */
  function ask(command) {
    if (exited !== null) return Promise.reject(new Error(`python peer exited (${exited}): ${stderr}`));
    return new Promise((resolve, reject) => {
      waiting.push({ resolve, reject });
      child.stdin.write(JSON.stringify(command) + '\n');
    });
  }

  return {
    info: () => ask({ op: 'info' }),
    /**
     * Time one case on a data set written by data.js; resolves to { times: [ms…] }.
     * @param {string} caseName
     * @param {import('./compare').BenchSet} dataSet
     * @param {object | undefined} params
     * @param {{ repeats: number, budgetMs?: number }} timing
     * @returns {Promise<{ times: number[] }>}
     */
    time: (caseName, dataSet, params, { repeats, budgetMs }) =>
      ask({
        op: 'time',
        case: caseName,
        data: dataSet.dataFile,
        labels: dataSet.labelsFile,
        n: dataSet.n,
        d: dataSet.d,
        params,
        repeats,
        budgetMs,
      }),
    close() {
      if (exited === null) child.stdin.end(JSON.stringify({ op: 'quit' }) + '\n');
    },
  };
}

/**
 * One fresh python process for one case, reporting its peak resident memory (the memory case).
 * @param {string} caseName
 * @param {import('./compare').BenchSet} dataSet
 * @param {object} params
 * @param {{ repeats: number, budgetMs: number, timeoutMs: number }} limits
 * @returns {Promise<{ times: number[], peakMB: number }>}
 */
function timePythonOnce(caseName, dataSet, params, { repeats, budgetMs, timeoutMs }) {
  const command = {
    op: 'time',
    case: caseName,
    data: dataSet.dataFile,
    labels: dataSet.labelsFile,
    n: dataSet.n,
    d: dataSet.d,
    params,
    repeats,
    budgetMs,
  };
  return new Promise((resolve, reject) => {
    const child = spawn(PYTHON, [PEER_SCRIPT, '--once', JSON.stringify(command)], { env: peerEnvironment() });
    let out = '';
    let err = '';
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      child.kill('SIGKILL');
    }, timeoutMs);
    child.stdout.on('data', (c) => (out += c));
    child.stderr.on('data', (c) => (err = (err + c).slice(-4000)));
    child.on('exit', (code, signal) => {
      clearTimeout(timer);
      if (timedOut) return reject(new Error(`python peer (once) stopped by the bench after ${timeoutMs / 1000} s`));
      if (code !== 0) return reject(new Error(`python peer (once) ended with ${signal ?? code}: ${err}`));
      try {
        // No last line: JSON.parse(undefined) throws into the catch below, as before typing.
        const reply = JSON.parse(/** @type {string} */ (out.trim().split('\n').pop()));
        if (reply.error) reject(new Error(reply.error));
        else resolve(reply);
      } catch {
        reject(new Error(`python peer (once) sent no JSON: ${out.slice(0, 200)}`));
      }
    });
  });
}

/** @typedef {ReturnType<typeof startPythonPeer>} PythonPeer */

module.exports = { pythonPeerAvailable, startPythonPeer, timePythonOnce, PYTHON };
