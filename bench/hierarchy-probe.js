// Probe for agglomerate() speed and memory, side by side with SciPy on the same data.
//   npm run build && node bench/hierarchy-probe.js [ward8000|average5000|ward30000 ...] [--peer-all]
// Times only the call (median of repeats), as wall-clock and as CPU time (steadier on a shared machine). The data are written to a temp file and the python twin
// (bench/hierarchy_probe_scipy.py, Debian /usr/bin/python3) times scipy.cluster.hierarchy.linkage on
// exactly those numbers. ward30000 runs in a child process so its peak RSS is its own.
'use strict';
const { execFileSync } = require('child_process');
const { writeFileSync } = require('fs');
const { tmpdir } = require('os');
const { join } = require('path');
const { agglomerate, createMatrix, createRandom } = require('../dist/index');

/** @type {Record<string, { n: number, d: number, method: string, repeats: number, child?: boolean, peerOptional?: boolean }>} */
const CASES = {
  ward8000: { n: 8000, d: 10, method: 'ward', repeats: 3 },
  average5000: { n: 5000, d: 10, method: 'average', repeats: 3 },
  // SciPy needs ~7 GB and minutes here (its pdist alone is 3.6 GB): run it only with --peer-all.
  ward30000: { n: 30000, d: 8, method: 'ward', repeats: 1, child: true, peerOptional: true },
};

/**
 * Gaussian blobs of our own making (seeded), so the tree has real structure.
 * @param {number} n
 * @param {number} d
 * @param {number} seed
 */
function makeData(n, d, seed) {
  const r = createRandom(seed);
  const centres = Array.from({ length: 12 }, () => Array.from({ length: d }, () => r.uniform(-10, 10)));
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    const c = centres[r.int(centres.length)];
    for (let t = 0; t < d; t++) data[i * d + t] = c[t] + 2 * r.normal();
  }
  return data;
}

/** @param {number[]} values */
function median(values) {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/**
 * @param {Float64Array} data
 * @param {number} n
 * @param {number} d
 * @param {string} method
 * @param {number} repeats
 */
function timeOurs(data, n, d, method, repeats) {
  const m = createMatrix(n, d, data);
  const times = [];
  const cpu = [];
  /** @type {import('../src/index').Tree | undefined} */
  let tree;
  for (let r = 0; r < repeats; r++) {
    const c0 = process.cpuUsage();
    const t0 = process.hrtime.bigint();
    // An unknown method name is agglomerate's to reject at run time, as before typing.
    tree = agglomerate(m, { method: /** @type {import('../src/index').LinkageMethod} */ (method) });
    times.push(Number(process.hrtime.bigint() - t0) / 1e9);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1e6);
  }
  return {
    seconds: median(times),
    cpuSeconds: median(cpu),
    top: /** @type {import('../src/index').Tree} */ (tree).merges[n - 2].height, // repeats ≥ 1
    maxRssMB: process.resourceUsage().maxRSS / 1024,
  };
}

if (process.argv[2] === '--child') {
  const [, , , file, n, d, method] = process.argv;
  const data = new Float64Array(require('fs').readFileSync(file).buffer.slice(0));
  const result = timeOurs(data, Number(n), Number(d), method, 1);
  process.stdout.write(JSON.stringify(result));
  process.exit(0);
}

const args = process.argv.slice(2);
const peerAll = args.includes('--peer-all');
const named = args.filter((a) => !a.startsWith('--'));
const chosen = named.length ? named : Object.keys(CASES);
for (const name of chosen) {
  const c = CASES[name];
  if (!c) throw new Error(`unknown case ${name}; cases: ${Object.keys(CASES).join(', ')}`);
  const data = makeData(c.n, c.d, 20261202 + c.n);
  const file = join(tmpdir(), `kinsort-hierarchy-${name}.f64`);
  writeFileSync(file, Buffer.from(data.buffer));
  const ours = c.child
    ? JSON.parse(
        execFileSync(process.execPath, [__filename, '--child', file, String(c.n), String(c.d), c.method], {
          encoding: 'utf8',
          maxBuffer: 1 << 20,
        }),
      )
    : timeOurs(data, c.n, c.d, c.method, c.repeats);
  if (c.peerOptional && !peerAll) {
    console.log(
      `${name.padEnd(12)} wall: kinsort ${ours.seconds.toFixed(3)} s  cpu: kinsort ${ours.cpuSeconds.toFixed(3)} s  ` +
        `kinsort peak RSS ${ours.maxRssMB.toFixed(0)} MB  (SciPy skipped; --peer-all runs it)`,
    );
    continue;
  }
  const peer = JSON.parse(
    execFileSync(
      '/usr/bin/python3',
      [join(__dirname, 'hierarchy_probe_scipy.py'), file, String(c.n), String(c.d), c.method, String(c.repeats)],
      {
        encoding: 'utf8',
      },
    ),
  );
  const ratio = ours.seconds / peer.seconds;
  const cpuRatio = ours.cpuSeconds / peer.cpuSeconds;
  console.log(
    `${name.padEnd(12)} wall: kinsort ${ours.seconds.toFixed(3)} s  SciPy ${peer.seconds.toFixed(3)} s  ratio ${ratio.toFixed(2)}  ` +
      `cpu: kinsort ${ours.cpuSeconds.toFixed(3)} s  SciPy ${peer.cpuSeconds.toFixed(3)} s  ratio ${cpuRatio.toFixed(2)}  ` +
      `kinsort peak RSS ${ours.maxRssMB.toFixed(0)} MB  SciPy peak RSS ${peer.maxRssMB.toFixed(0)} MB  ` +
      `top height kinsort ${ours.top.toFixed(6)} SciPy ${peer.top.toFixed(6)}`,
  );
}
