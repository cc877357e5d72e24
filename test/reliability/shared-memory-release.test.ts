import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// The dissimilarity worker threads receive a fresh shared memory with large jobs (each call's
// output); a pooled worker that kept them would grow the process by the whole output on every
// call. k-means keeps one spare WebAssembly memory between calls and must drop it for a call of
// a new size. This runs repeated calls in a child process of the compiled package (the workers
// exist only there) and checks the resident size stays put.
const dist = join(__dirname, '../../dist');
const built = existsSync(join(dist, 'index.js'));

const SCRIPT = `
const ks = require(${JSON.stringify(dist)});
const random = ks.createRandom('release');
const rows = (n, d) => { const a = new Float64Array(n * d); for (let i = 0; i < a.length; i++) a[i] = random.normal() + (i % 7); return ks.createMatrix(n, d, a); };
const rss = () => process.memoryUsage().rss / 2 ** 20;
const m = rows(4000, 10); // 8 million pairs: 64 MB of output per call
let kept;
const after = [];
for (let i = 0; i < 8; i++) { kept = ks.dissimilarity(m, { metric: 'euclidean' }); global.gc(); after.push(rss()); }
for (let i = 0; i < 8; i++) { kept = ks.kmeans(rows(60000 + 1000 * i, 10), { k: 8, seed: i, restarts: 2 }); global.gc(); after.push(rss()); }
console.log(JSON.stringify(after));
`;

describe('memory handed to worker threads and kept for WebAssembly kernels', () => {
  it.skipIf(!built)(
    'is released after each call: repeated dissimilarity and k-means calls do not grow the process',
    () => {
      const out = execFileSync(process.execPath, ['--expose-gc', '-e', SCRIPT], { encoding: 'utf8', timeout: 120_000 });
      const rss: number[] = JSON.parse(out.trim().split('\n').pop()!);
      const dissimilarityGrowth = rss[7] - rss[1];
      const kmeansGrowth = rss[15] - rss[9];
      // Kept, each call would add 64 MB (dissimilarity) and about 17 MB (k-means memory): 384 and 100 MB here.
      expect(dissimilarityGrowth).toBeLessThan(100);
      expect(kmeansGrowth).toBeLessThan(40);
    },
    150_000,
  );
});
