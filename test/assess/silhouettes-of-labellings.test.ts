// Several segmentations scored in one pass over the pairs must give, segmentation by segmentation,
// exactly what silhouette() gives for each alone (the same sums in the same order: equal to the bit).
import { describe, expect, it } from 'vitest';
import { silhouette } from '../../src/assess';
import { silhouettesOfLabellings } from '../../src/assess/silhouettes-of-labellings';
import { createMatrix } from '../../src/core/matrix';
import { createRandom } from '../../src/random';

describe('silhouettesOfLabellings', () => {
  // 700 rows: more than one tile in both directions (64 × 256), with a ragged last tile.
  const random = createRandom(7);
  const n = 700;
  const d = 5;
  const data = new Float64Array(n * d);
  for (let i = 0; i < n; i++) for (let j = 0; j < d; j++) data[i * d + j] = (i % 3) * 4 + random.normal();
  const m = createMatrix(n, d, data);

  it('equals silhouette() of each segmentation to the bit, whatever its labels are', () => {
    const byThree = Int32Array.from({ length: n }, (_, i) => i % 3);
    const randomFive = Int32Array.from({ length: n }, () => random.int(5));
    const gapped = Array.from({ length: n }, (_, i) => (i < 20 ? 9 : i % 2 === 0 ? 2 : -1)); // labels -1, 2, 9: compacted
    const all = silhouettesOfLabellings(m, [byThree, randomFive, gapped], 'test');
    for (const [t, labels] of [byThree, randomFive, gapped].entries()) {
      const alone = silhouette(m, labels);
      expect(all[t].average).toBe(alone.average);
      expect(all[t].values).toEqual(alone.values);
      expect(all[t].bySegment).toEqual(alone.bySegment);
      expect(all[t].neighbour).toEqual(alone.neighbour);
      expect(all[t].segmentLabels).toEqual(alone.segmentLabels);
    }
    expect(all[2].segmentLabels).toEqual([-1, 2, 9]);
  });

  it('refuses a segmentation with a single segment, naming the caller', () => {
    expect(() => silhouettesOfLabellings(m, [new Int32Array(n)], 'compareK: silhouette')).toThrow(
      /compareK: silhouette needs at least 2 segments/,
    );
  });
});
