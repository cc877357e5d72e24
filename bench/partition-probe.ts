// A quick timing probe for k-means on 100,000 × 10, k = 8, 5 restarts, beside scikit-learn on the
// same data in the same run. Not the benchmark suite (that is `npm run bench`); just a probe.
// Build and run:
//   npx tsc --outDir /tmp/kinsort-probe --rootDir . --module commonjs --target es2022 --esModuleInterop \
//     --skipLibCheck --types node bench/partition-probe.ts && node /tmp/kinsort-probe/bench/partition-probe.js
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createMatrix } from '../src/core/matrix';
import { kmeans } from '../src/methods/partition/kmeans';
import { createRandom } from '../src/random';

const n = Number(process.env.PROBE_N ?? 100_000);
const d = 10;
const k = 8;
const restarts = 5;
const repeats = Number(process.env.PROBE_REPEATS ?? 3);

// Data of our own making: 8 Gaussian blobs in 10 dimensions, seeded.
const random = createRandom('partition-probe');
const means = Array.from({ length: k }, () => Array.from({ length: d }, () => random.uniform(-5, 5)));
const data = new Float64Array(n * d);
for (let i = 0; i < n; i++) {
  const m = means[random.int(k)];
  for (let j = 0; j < d; j++) data[i * d + j] = m[j] + 1.5 * random.normal();
}
const matrix = createMatrix(n, d, data);
const file = join(tmpdir(), `kinsort-probe-${process.pid}.f64`);
writeFileSync(file, Buffer.from(data.buffer));

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const ours: number[] = [];
let within = 0;
let iterations = 0;
for (let r = 0; r < repeats; r++) {
  const t0 = process.hrtime.bigint();
  const fit = kmeans(matrix, { k, restarts, seed: r });
  ours.push(Number(process.hrtime.bigint() - t0) / 1e6);
  within = fit.withinSS;
  iterations = fit.iterations;
}

const python = `
import sys, time, numpy as np
from sklearn.cluster import KMeans
x = np.fromfile(sys.argv[1], dtype=np.float64).reshape(-1, ${d})
for algorithm in ("lloyd", "elkan"):
    times = []
    for r in range(${repeats}):
        t0 = time.perf_counter()
        fit = KMeans(n_clusters=${k}, n_init=${restarts}, algorithm=algorithm, random_state=r).fit(x)
        times.append((time.perf_counter() - t0) * 1000)
    print(algorithm, sorted(times)[len(times) // 2], fit.inertia_, fit.n_iter_)
`;
const peer = execFileSync('/usr/bin/python3', ['-c', python, file], { encoding: 'utf8' });
const oursMs = median(ours);
console.log(`kinsort kmeans  ${n} × ${d}, k = ${k}, ${restarts} restarts: median ${oursMs.toFixed(0)} ms (within-SS ${within.toFixed(2)}, iterations ${iterations})`);
for (const line of peer.trim().split('\n')) {
  const [algorithm, ms, inertia, iters] = line.split(' ');
  console.log(`scikit-learn ${algorithm.padEnd(6)} median ${Number(ms).toFixed(0)} ms (within-SS ${Number(inertia).toFixed(2)}, iterations ${iters})  ratio kinsort/sklearn ${(oursMs / Number(ms)).toFixed(2)}`);
}
