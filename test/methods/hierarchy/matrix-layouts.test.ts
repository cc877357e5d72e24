// The two NN-chain layouts (condensed for very large n, full n × n otherwise) must give the same
// merges bit for bit; agglomerate picks between them by size, so both are checked here directly.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { nnChainOnMatrix } from '../../../src/methods/hierarchy/nn-chain-matrix';
import { expandCondensed, nnChainOnFull } from '../../../src/methods/hierarchy/nn-chain-full';
import { dissimilarity } from '../../../src/measure/dissimilarity';
import { createRandom } from '../../../src/random';

describe('NN-chain: condensed and full layouts agree exactly', () => {
  it('every reducible method, continuous and tied data', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 1e6 }),
        fc.integer({ min: 2, max: 40 }),
        fc.boolean(),
        fc.constantFrom('complete', 'average', 'weighted', 'ward' as const),
        (seed, n, ties, method) => {
          const r = createRandom(seed);
          const rows = Array.from({ length: n }, () => [0, 1, 2].map(() => (ties ? r.int(3) : r.normal())));
          const condensed = dissimilarity(rows).condensed;
          const square = method === 'ward';
          const work = Float64Array.from(condensed, (v) => (square ? v * v : v));
          const a = nnChainOnMatrix(n, work, method);
          const b = nnChainOnFull(n, expandCondensed(n, condensed, square), method);
          expect(Array.from(a.a)).toEqual(Array.from(b.a));
          expect(Array.from(a.b)).toEqual(Array.from(b.b));
          expect(Array.from(a.height)).toEqual(Array.from(b.height));
        },
      ),
      { numRuns: 150 },
    );
  }, 30_000);
});
