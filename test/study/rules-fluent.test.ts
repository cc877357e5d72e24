// seg.rules() through the fluent layer: any segmentation (k-means or a cut of a tree) gives rules,
// kept columns may be named, unknown columns and uncut trees are refused with the next step.
import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import { createRandom } from '../../src/random';

function riders(n: number) {
  const r = createRandom(4);
  const zones = ['north', 'south', "o'clock"];
  return Array.from({ length: n }, (_, i) => ({
    rider: `R${i}`,
    trips: 3 + 8 * (i % 2) + r.normal(),
    peak: 0.3 + 0.3 * (i % 2) + 0.05 * r.normal(),
    zone: zones[i % 3],
  }));
}

describe('seg.rules() in the fluent layer', () => {
  const prepared = study(riders(120), { id: 'rider', use: ['trips', 'peak'], keep: ['zone'] }).prepare();

  it('a cut of a hierarchy gives rules too; two clear segments are told apart by one threshold', () => {
    const seg = prepared.agglomerate({ method: 'ward' }).cut({ k: 2 });
    const rules = seg.rules({ depth: 2 });
    expect(rules.agreement.overall).toBe(1);
    expect(rules.rules).toHaveLength(2);
    expect(rules.rules[0].conditions).toHaveLength(1);
  });

  it('kept columns may be named; unknown columns are refused with the ones available', () => {
    const seg = prepared.kmeans({ k: 2, seed: 1 });
    expect(seg.rules({ columns: ['zone', 'trips'] }).columns.map((c) => c.kind)).toEqual(['categorical', 'numeric']);
    expect(() => seg.rules({ columns: ['trip'] })).toThrow(/no column "trip" among the used and kept columns \(.*trips/);
    expect(() => seg.rules({ deep: 2 } as never)).toThrow(/unknown option "deep"/);
  });

  it('asked of an uncut tree, says to cut first', () => {
    const tree = prepared.agglomerate({ method: 'average' });
    expect(() => (tree as unknown as { rules(): void }).rules()).toThrow(/Cut it first.*tree.cut\(\{ k: 4 \}\).rules/);
  });
});
