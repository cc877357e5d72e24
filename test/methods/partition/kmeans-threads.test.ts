import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../src/random';

// The worker thread runs only from the compiled package (dist/, built by `npm test`), so this
// check uses dist when it is there: restarts shared with the worker must give exactly the result
// of the calling thread alone (each restart depends only on its own random stream).
const dist = process.env.KINSORT_DIST_PARTITION ?? join(__dirname, '../../../dist/methods/partition');
const built = existsSync(join(dist, 'kmeans-worker.js')) && existsSync(join(dist, 'restarts.js'));

describe('k-means restarts on two threads', () => {
  it.skipIf(!built)('give the same kept restart and per-restart within-SS as one thread', () => {
    // eslint-disable-next-line @typescript-eslint/no-var-requires
    const { runRestarts, setKmeansThreads } = require(join(dist, 'restarts.js'));
    const random = createRandom('threads-check');
    const n = 40_000;
    const d = 7;
    const k = 8;
    const data = new Float64Array(n * d);
    for (let i = 0; i < data.length; i++) data[i] = random.normal() + (Math.floor(i / d) % k) * 0.8;
    const plan = { data, n, d, k, start: 'k-means++', seed: 5, maxIterations: 300, tolerance: 0, trace: false };
    setKmeansThreads(1);
    const one = runRestarts(plan, 6, () => undefined);
    setKmeansThreads(2);
    const two = runRestarts(plan, 6, () => undefined);
    expect(one.byWorker).toBe(0);
    expect(two.byWorker).toBeGreaterThan(0);
    expect(two.withinByRestart).toEqual(one.withinByRestart);
    expect(two.kept.restart).toBe(one.kept.restart);
    expect(Array.from(two.kept.assignment)).toEqual(Array.from(one.kept.assignment));
    expect(Array.from(two.kept.centers)).toEqual(Array.from(one.kept.centers));
  });
});
