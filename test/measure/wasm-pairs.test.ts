import { describe, expect, it } from 'vitest';
import { dissimilarity } from '../../src/measure';
import { squaredDifferencesRows } from '../../src/measure/euclideanKernel';
import { lastDissimilarityShare, setDissimilarityThreads, setDissimilarityWasm } from '../../src/measure/parallel';
import { pairsModule } from '../../src/measure/wasmPairs';
import { createRandom } from '../../src/random';

function rows(n: number, d: number, seed: number, whole: boolean): Float64Array {
  const r = createRandom(seed);
  const data = new Float64Array(n * d);
  for (let k = 0; k < data.length; k++) data[k] = whole ? r.int(3) : r.normal() * 10 ** r.int(4);
  return data;
}

function countDiffering(a: Float64Array, b: Float64Array): number {
  let differing = 0;
  for (let k = 0; k < a.length; k++) if (!Object.is(a[k], b[k])) differing++;
  return differing;
}

describe('euclidean pairs as WebAssembly', () => {
  it('is available here (Node with 128-bit vectors), for private and shared memory', () => {
    expect(pairsModule(false)).toBeInstanceOf(WebAssembly.Module);
    expect(pairsModule(true)).toBeInstanceOf(WebAssembly.Module);
  });

  // Odd and even row counts (the last row pairs with itself; tails of 1–3 rows after the groups
  // of four), one column, odd column counts, repeated rows (exact 0), both metrics.
  const shapes: [number, number][] = [
    [1000, 1],
    [1001, 2],
    [1002, 7],
    [1003, 20],
    [1203, 3],
  ];
  for (const [n, d] of shapes) {
    it(`gives bit for bit the JavaScript loop's numbers (${n} × ${d})`, () => {
      const data = rows(n, d, n * 31 + d, d < 4);
      data.copyWithin(9 * d, 4 * d, 5 * d); // row 10 repeats row 5
      const m = { rows: n, cols: d, data };
      const previousThreads = setDissimilarityThreads(1);
      try {
        for (const metric of ['euclidean', 'sqeuclidean'] as const) {
          const expected = new Float64Array((n * (n - 1)) / 2);
          squaredDifferencesRows(data, n, d, expected, metric === 'euclidean', 0, n);
          const got = dissimilarity(m, { metric });
          expect(lastDissimilarityShare().wasm).toBe(true);
          expect(got.condensed.length).toBe(expected.length);
          expect(countDiffering(got.condensed, expected)).toBe(0);
          expect(got.get(4, 9)).toBe(0);
        }
      } finally {
        setDissimilarityThreads(previousThreads as 1 | 2);
      }
    });
  }

  it('two threads give the same numbers as the JavaScript loop on one (3,001 × 5)', () => {
    const n = 3001;
    const d = 5;
    const data = rows(n, d, 5, false);
    const m = { rows: n, cols: d, data };
    const previousThreads = setDissimilarityThreads(1);
    const previousWasm = setDissimilarityWasm(false);
    try {
      const plain = dissimilarity(m).condensed;
      expect(lastDissimilarityShare().wasm).toBe(false);
      setDissimilarityWasm(true);
      setDissimilarityThreads(2);
      const shared = dissimilarity(m).condensed;
      expect(lastDissimilarityShare().wasm).toBe(true);
      expect(countDiffering(shared, plain)).toBe(0);
    } finally {
      setDissimilarityThreads(previousThreads as 1 | 2);
      setDissimilarityWasm(previousWasm);
    }
  });

  it('keeps only the result when the copies of the rows would outweigh it (1,000 × 300)', () => {
    const n = 1000;
    const d = 300;
    const data = rows(n, d, 8, false);
    const got = dissimilarity({ rows: n, cols: d, data }).condensed;
    expect(got.buffer.byteLength).toBe(got.length * 8);
    const expected = new Float64Array(got.length);
    squaredDifferencesRows(data, n, d, expected, true, 0, n);
    expect(countDiffering(got, expected)).toBe(0);
  });
});
