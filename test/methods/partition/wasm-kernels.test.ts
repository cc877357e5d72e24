import { describe, expect, it } from 'vitest';
import { kmeans } from '../../../src/methods/partition/kmeans';
import { releaseKmeansMemory, takeKmeansMemory, type KmeansMemory } from '../../../src/methods/partition/kmeans-memory';
import { runHamerly } from '../../../src/methods/partition/hamerly';
import { sumsFromScratch } from '../../../src/methods/partition/centre-update';
import { setSeedingWasm } from '../../../src/methods/partition/restarts';
import { seedPlusPlusOn } from '../../../src/methods/partition/seeding';
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

/** Seeds on a fresh memory with the sweep as WebAssembly or JavaScript; counts the WebAssembly calls. */
function seedOnce(data: Float64Array, n: number, d: number, k: number, seed: number, wasm: boolean): { mem: KmeansMemory; calls: number } {
  const taken = takeKmeansMemory(data, n, d, k);
  expect(taken.sweep).toBeDefined();
  let calls = 0;
  const counted: KmeansMemory = { ...taken, sweep: (...args) => (calls++, taken.sweep!(...args)) };
  const previous = setSeedingWasm(wasm);
  try {
    seedPlusPlusOn(counted, createRandom(seed));
  } finally {
    setSeedingWasm(previous);
  }
  const copy = {
    ...taken,
    centres: taken.centres.slice(),
    nearest: taken.nearest.slice(),
    closest: taken.closest.slice(),
    secondLower: taken.secondLower.slice(),
  };
  releaseKmeansMemory(taken);
  return { mem: copy, calls };
}

describe('k-means++ trial sweep and take step as WebAssembly', () => {
  // k = 8: one group of four trials; k = 30: five trials, so a second, padded group; d = 1 and
  // odd n; 50,001 × 5 with k = 10 cuts the rows in blocks, the last of odd length; 1,001 × 3 is small.
  const shapes: [number, number, number][] = [
    [40_001, 6, 8],
    [25_000, 9, 30],
    [200_003, 1, 3],
    [50_001, 5, 10],
    [1_001, 3, 5],
  ];
  for (const [n, d, k] of shapes) {
    it(`leaves the seeding state bit for bit as the JavaScript sweep does (${n} × ${d}, k = ${k})`, () => {
      const data = blobs(n, d, n + d + k);
      for (const seed of [0, 1]) {
        const viaWasm = seedOnce(data, n, d, k, seed, true);
        const viaScript = seedOnce(data, n, d, k, seed, false);
        expect(viaWasm.calls).toBeGreaterThan(0);
        expect(viaScript.calls).toBe(0);
        expect(sameBits(viaWasm.mem.centres, viaScript.mem.centres)).toBe(true);
        expect(sameBits(viaWasm.mem.nearest, viaScript.mem.nearest)).toBe(true);
        expect(sameBits(viaWasm.mem.closest, viaScript.mem.closest)).toBe(true);
        expect(sameBits(viaWasm.mem.secondLower, viaScript.mem.secondLower)).toBe(true);
      }
    });
  }

  it('gives the same k-means result either way (40,000 × 7, k = 12, 3 restarts)', () => {
    const n = 40_000;
    const d = 7;
    const data = blobs(n, d, 3);
    const rows = { rows: n, cols: d, data };
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
      setSeedingWasm(previousWasm);
    }
  });

  it('runs on shared memory for small inputs too, while plain memory works on the rows themselves (no copy)', () => {
    const data = new Float64Array(1000 * 5);
    const shared = takeKmeansMemory(data, 1000, 5, 4);
    expect(shared.wasm).toBeDefined();
    expect(shared.sweep).toBeDefined();
    expect(shared.layout.blocks).toBe(1);
    releaseKmeansMemory(shared);
    const plain = takeKmeansMemory(data, 1000, 5, 4, 'plain');
    expect(plain.wasm).toBeUndefined();
    expect(plain.rows).toBe(data);
  });
});

describe('segment sums as WebAssembly', () => {
  // Odd and even column counts, one column, and a block structure with an odd last block.
  const shapes: [number, number, number][] = [
    [40_001, 7, 9],
    [30_000, 10, 8],
    [250_001, 1, 12],
  ];
  for (const [n, d, k] of shapes) {
    it(`give bit for bit the sums and counts of the JavaScript loop (${n} × ${d}, k = ${k})`, () => {
      const data = blobs(n, d, n + d);
      const shared = takeKmeansMemory(data, n, d, k);
      const plain = takeKmeansMemory(data, n, d, k, 'plain');
      expect(shared.segmentSums).toBeDefined();
      expect(plain.segmentSums).toBeUndefined();
      const random = createRandom(`sums-${n}`);
      for (let i = 0; i < n; i++) shared.assignment[i] = plain.assignment[i] = random.int(k);
      sumsFromScratch(shared);
      sumsFromScratch(plain);
      expect(sameBits(shared.sums, plain.sums)).toBe(true);
      expect(sameBits(shared.counts, plain.counts)).toBe(true);
      releaseKmeansMemory(shared);
    });
  }
});

describe('Hamerly sweeps (bound pass and full scans) as WebAssembly', () => {
  // k = 13 pads to 16 centres (three at infinity); k = 4 has no padding; d odd and even.
  const shapes: [number, number, number][] = [
    [40_001, 7, 13],
    [30_000, 10, 4],
    [999, 2, 6],
  ];
  for (const [n, d, k] of shapes) {
    it(`give bit for bit the iterations of the JavaScript scan (${n} × ${d}, k = ${k}, from given centres)`, () => {
      const data = blobs(n, d, n + k);
      const shared = takeKmeansMemory(data, n, d, k);
      const plain = takeKmeansMemory(data, n, d, k, 'plain');
      expect(shared.pairScan).toBeDefined();
      expect(plain.pairScan).toBeUndefined();
      for (const mem of [shared, plain]) {
        for (let c = 0; c < k; c++) mem.centres.set(data.subarray(((c * 3001) % n) * d, (((c * 3001) % n) + 1) * d), c * d);
      }
      const runShared = runHamerly(shared, 40, 0, false, 'centres');
      const runPlain = runHamerly(plain, 40, 0, false, 'centres');
      expect(runShared).toEqual(runPlain);
      expect(runShared.iterations).toBeGreaterThan(3);
      expect(sameBits(shared.assignment, plain.assignment)).toBe(true);
      expect(sameBits(shared.centres, plain.centres)).toBe(true);
      expect(sameBits(shared.upper, plain.upper)).toBe(true);
      expect(sameBits(shared.lower, plain.lower)).toBe(true);
      releaseKmeansMemory(shared);
    });
  }
});
