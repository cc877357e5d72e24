import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { KmeansRun } from '../../../src/methods/partition/restarts';
import { createRandom } from '../../../src/random';

// The worker thread runs only from the compiled package (dist/, built by `npm test`), so this
// check uses dist when it is there: blocks of rows shared with the worker must give exactly the
// result of the calling thread alone (every sum over rows is taken block by block and the block
// totals added in block order, whichever thread ran a block).
const dist = process.env.KINSORT_DIST_PARTITION ?? join(__dirname, '../../../dist/methods/partition');
const built = existsSync(join(dist, 'kmeans-worker.js')) && existsSync(join(dist, 'restarts.js'));

type Run = KmeansRun;

// eslint-disable-next-line @typescript-eslint/no-var-requires
const load = () => require(join(dist, 'restarts.js')) as { runKmeans: (plan: object, onDone: (n: number) => void) => Run; setKmeansThreads: (t: 1 | 2) => number };

/** Data of our own making: k shifted Gaussian groups, with a run of repeated rows. */
function groups(n: number, d: number, k: number, seed: string): Float64Array {
  const random = createRandom(seed);
  const data = new Float64Array(n * d);
  for (let i = 0; i < data.length; i++) data[i] = random.normal() + (Math.floor(i / d) % k) * 0.8;
  for (let i = 1000; i < 1500; i++) data.copyWithin(i * d, 10 * d, 11 * d);
  return data;
}

function onBothTeams(plan: object): { one: Run; two: Run } {
  const { runKmeans, setKmeansThreads } = load();
  const previous = setKmeansThreads(1);
  try {
    const one = runKmeans(plan, () => undefined);
    setKmeansThreads(2);
    // The worker starts on first use and may join late; a run it missed is done by this thread alone.
    let two = runKmeans(plan, () => undefined);
    for (let attempt = 0; attempt < 5 && two.byWorker === 0; attempt++) two = runKmeans(plan, () => undefined);
    return { one, two };
  } finally {
    setKmeansThreads(previous as 1 | 2);
  }
}

function expectSame(one: Run, two: Run): void {
  expect(one.byWorker).toBe(0);
  expect(two.byWorker).toBeGreaterThan(0);
  expect(two.withinByRestart).toEqual(one.withinByRestart);
  expect(two.restart).toBe(one.restart);
  expect(two.iterations).toBe(one.iterations);
  expect(two.converged).toBe(one.converged);
  expect(two.figures).toEqual(one.figures);
  expect(Array.from(two.assignment)).toEqual(Array.from(one.assignment));
  expect(Array.from(two.centres)).toEqual(Array.from(one.centres));
}

describe('k-means on two threads', () => {
  const base = { maxIterations: 300, relativeTolerance: 0, trace: false };

  it.skipIf(!built)('gives the same result as one thread, k-means++ starts (40,001 × 7, k = 8, odd last block)', () => {
    const n = 40_001;
    const d = 7;
    const { one, two } = onBothTeams({ ...base, data: groups(n, d, 8, 'threads-check'), n, d, k: 8, start: 'k-means++', seed: 5, restarts: 6 });
    expectSame(one, two);
  });

  it.skipIf(!built)('gives the same result as one thread from random rows, with a tolerance (30,000 × 9, k = 12)', () => {
    const n = 30_000;
    const d = 9;
    const { one, two } = onBothTeams({ ...base, relativeTolerance: 1e-4, data: groups(n, d, 5, 'random-starts'), n, d, k: 12, start: 'random', seed: 2, restarts: 4 });
    expectSame(one, two);
  });

  it.skipIf(!built)('gives the same result as one thread when a segment goes empty and is repaired (given centres)', () => {
    const n = 30_000;
    const d = 8;
    const k = 10;
    const data = groups(n, d, 3, 'empty-segment');
    // Ten given centres, four of them far from every row: their segments start empty.
    const start = new Float64Array(k * d);
    for (let c = 0; c < k; c++) for (let j = 0; j < d; j++) start[c * d + j] = c < 6 ? data[(c * 997 + 13) * d + j] : 1000 + c;
    const { one, two } = onBothTeams({ ...base, data, n, d, k, start, seed: 0, restarts: 1 });
    expectSame(one, two);
    expect(one.figures.sizes.every((s) => s > 0)).toBe(true);
  });
});
