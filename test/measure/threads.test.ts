import { describe, expect, it } from 'vitest';
import { dissimilarity } from '../../src/measure';
import { setDissimilarityThreads } from '../../src/measure/parallel';
import { createRandom } from '../../src/random';

describe('euclidean with a worker thread', () => {
  it('gives bit-identical results with one or two threads (3,001 rows: odd count, above the worker threshold)', () => {
    const n = 3001;
    const d = 3;
    const r = createRandom(11);
    const data = new Float64Array(n * d);
    for (let k = 0; k < data.length; k++) data[k] = r.normal();
    data.copyWithin(5 * d, 2 * d, 3 * d); // row 6 repeats row 3
    const m = { rows: n, cols: d, data };
    const previous = setDissimilarityThreads(1);
    try {
      const single = dissimilarity(m).condensed;
      expect(single.buffer).toBeInstanceOf(ArrayBuffer);
      setDissimilarityThreads(2);
      const shared = dissimilarity(m).condensed;
      expect(shared.length).toBe(single.length);
      let differing = 0;
      for (let k = 0; k < single.length; k++) if (single[k] !== shared[k]) differing++;
      expect(differing).toBe(0);
      expect(dissimilarity(m).get(2, 5)).toBe(0);
      // Spot check against a direct computation.
      const dx = data[0] - data[(n - 1) * d];
      const dy = data[1] - data[(n - 1) * d + 1];
      const dz = data[2] - data[(n - 1) * d + 2];
      expect(shared[n - 2]).toBeCloseTo(Math.sqrt(dx * dx + dy * dy + dz * dz), 14);
      const squared = dissimilarity(m, { metric: 'sqeuclidean' }).condensed;
      expect(squared[n - 2]).toBeCloseTo(shared[n - 2] ** 2, 12);
    } finally {
      setDissimilarityThreads(previous as 1 | 2);
    }
  });
});
