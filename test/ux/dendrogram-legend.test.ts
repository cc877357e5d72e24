// A height cut that leaves one-row segments: every segment 1..k, the one-row ones included, gets a
// numbered tab beside its leaves and an entry in the legend.
import { describe, expect, it } from 'vitest';
import { study } from '../../src';

describe('dendrogram legend', () => {
  it('lists every segment of a height cut, one-row segments included', () => {
    // Two tight groups and two far-off single rows: a cut below the singles' joins leaves them alone.
    const records = [
      ...Array.from({ length: 6 }, (_, i) => ({ id: `a${i}`, x: i * 0.1, y: 0 })),
      ...Array.from({ length: 6 }, (_, i) => ({ id: `b${i}`, x: 10 + i * 0.1, y: 0 })),
      { id: 'lone1', x: 30, y: 0 },
      { id: 'lone2', x: -25, y: 0 },
    ];
    const tree = study(records, { id: 'id' }).prepare({ scale: 'none' }).agglomerate({ method: 'single' });
    const cut = tree.cut({ height: 2 });
    expect(cut.k).toBe(4);
    expect(cut.sizes.filter((n) => n === 1)).toHaveLength(2);
    const svg = tree.dendrogram({ height: 2 }).svg();
    for (const s of [1, 2, 3, 4]) {
      expect(svg).toMatch(new RegExp(`font-weight="700" fill="#[0-9a-f]{6}">${s}</text>`));
      expect(svg).toContain(`>segment ${s}</text>`);
    }
    expect(svg).toContain('>lone1</text>');
  });
});
