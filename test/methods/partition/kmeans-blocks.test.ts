import { describe, expect, it } from 'vitest';
import { blockOf, blockRange, kmeansLayout } from '../../../src/methods/partition/kmeans-memory';

describe('blocks of rows', () => {
  it('depend on the shape alone and cover every row once, each starting at an even row', () => {
    const small = kmeansLayout(1000, 5, 4);
    expect(small.blocks).toBe(1);
    expect(blockRange(small, 0)).toEqual([0, 1000]);
    for (const n of [40_001, 100_000, 250_003]) {
      const layout = kmeansLayout(n, 10, 8);
      expect(layout.blocks).toBeGreaterThan(1);
      let next = 0;
      for (let b = 0; b < layout.blocks; b++) {
        const [lo, hi] = blockRange(layout, b);
        expect(lo).toBe(next);
        expect(lo % 2).toBe(0);
        expect(hi).toBeGreaterThan(lo);
        expect(blockOf(layout, lo)).toBe(b);
        expect(blockOf(layout, hi - 1)).toBe(b);
        next = hi;
      }
      expect(next).toBe(n);
    }
  });
});
