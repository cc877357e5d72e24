// A height cut that leaves one-row segments: the badges are coloured and numbered, so the live
// chart's legend must list every segment 1..k, the one-row ones included (it skipped them).
import { describe, expect, it } from 'vitest';
import { study } from '../../src';

function legendNames(html: string): string[] {
  const spec = /<script type="application\/json" class="ks-spec">(.*?)<\/script>/s.exec(html);
  expect(spec).not.toBeNull();
  const text = spec![1].replace(/\\u003c/g, '<').replace(/\\u003e/g, '>').replace(/\\u0026/g, '&');
  const plot = JSON.parse(text) as { data: { name?: string; showlegend?: boolean }[] };
  return plot.data.filter((t) => t.showlegend).map((t) => t.name!);
}

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
    expect(legendNames(tree.dendrogram({ height: 2 }).html()).sort()).toEqual(['1', '2', '3', '4']);
  });
});
