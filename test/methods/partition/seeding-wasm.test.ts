import { describe, expect, it } from 'vitest';
import { kmeans } from '../../../src/methods/partition/kmeans';
import { setKmeansThreads, setSeedingWasm } from '../../../src/methods/partition/restarts';
import { createSeedingState, defaultTrials, seedPlusPlus } from '../../../src/methods/partition/seeding';
import { createSeedingArena } from '../../../src/methods/partition/seedingWasm';
import { createRandom } from '../../../src/random';

// Data of our own making: blobs plus a block of repeated rows (ties, zero distances).
function blobs(n: number, d: number, seed: number): Float64Array {
  const r = createRandom(seed);
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) data[i * d + j] = (i % 6) * 2.5 * ((j % 3) - 1) + r.normal();
  for (let i = 100; i < 200; i++) data.copyWithin(i * d, 50 * d, 51 * d);
  return data;
}

function sameBits(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

describe('k-means++ sweep as WebAssembly', () => {
  // k = 8: one group of four trials; k = 30: five trials, so a second, padded group; d = 1 and odd n.
  const shapes: [number, number, number][] = [[40_001, 6, 8], [25_000, 9, 30], [200_003, 1, 3]];
  for (const [n, d, k] of shapes) {
    it(`leaves the seeding state bit for bit as the JavaScript sweep does (${n} × ${d}, k = ${k})`, () => {
      const data = blobs(n, d, n + d + k);
      const trials = defaultTrials(k);
      const arena = createSeedingArena(data, n, d, k, 4 * Math.ceil(trials / 4));
      expect(arena).toBeDefined();
      const viaWasm = createSeedingState(n, arena);
      const viaScript = createSeedingState(n);
      const centresWasm = new Float64Array(k * d);
      const centresScript = new Float64Array(k * d);
      for (const seed of [0, 1]) {
        seedPlusPlus(data, n, d, k, createRandom(seed), centresWasm, viaWasm);
        seedPlusPlus(data, n, d, k, createRandom(seed), centresScript, viaScript);
        expect(sameBits(centresWasm, centresScript)).toBe(true);
        expect(sameBits(viaWasm.nearest, viaScript.nearest)).toBe(true);
        expect(sameBits(viaWasm.closest, viaScript.closest)).toBe(true);
        expect(sameBits(viaWasm.secondLower, viaScript.secondLower)).toBe(true);
      }
      // The sweep did run in the arena: its totals slot holds the last trial totals.
      expect(arena!.view[arena!.totalsAt / 8]).toBeGreaterThan(0);
    });
  }

  it('gives the same k-means result either way (40,000 × 7, k = 12, 3 restarts)', () => {
    const n = 40_000;
    const d = 7;
    const data = blobs(n, d, 3);
    const rows = { rows: n, cols: d, data };
    const previousThreads = setKmeansThreads(1);
    const previousWasm = setSeedingWasm(true);
    try {
      const a = kmeans(rows, { k: 12, seed: 9, restarts: 3 });
      setSeedingWasm(false);
      const b = kmeans(rows, { k: 12, seed: 9, restarts: 3 });
      expect(a.restartWithinSS).toEqual(b.restartWithinSS);
      expect(a.iterations).toBe(b.iterations);
      expect(sameBits(a.assignment, b.assignment)).toBe(true);
      expect(a.centers).toEqual(b.centers);
    } finally {
      setKmeansThreads(previousThreads as 1 | 2);
      setSeedingWasm(previousWasm);
    }
  });

  it('is not used for small inputs (the JavaScript sweep is as fast there)', () => {
    expect(createSeedingArena(new Float64Array(1000 * 5), 1000, 5, 4, 4)).toBeUndefined();
  });
});
