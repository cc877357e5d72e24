// The write-up is for a business reader: its figures carry words, not the code names that the
// definition file uses as keys (withinSS, averageSilhouette, stabilityJaccard).
import { describe, expect, it } from 'vitest';
import { study } from '../../src';

const records = Array.from({ length: 30 }, (_, i) => ({ id: `r${i + 1}`, a: (i % 3) * 4 + (i % 5) * 0.2, b: (i % 2) * 3 + (i % 7) * 0.1 }));

describe('write-up figures in words', () => {
  const seg = study(records, { id: 'id' }).prepare().kmeans({ k: 3, seed: 1 });
  seg.silhouette();
  seg.stability({ resamples: 5, seed: 2 });
  const wu = seg.writeUp({ title: 'T' });

  it('the HTML page names each figure in words', () => {
    const html = wu.html();
    for (const words of ['Within-segment sum of squares', 'Average silhouette', 'Bootstrap stability (Jaccard), segment 1 first']) {
      expect(html).toContain(`<th>${words}</th>`);
    }
    for (const code of ['withinSS', 'averageSilhouette', 'stabilityJaccard']) expect(html).not.toContain(`<th>${code}</th>`);
  });

  it('the Markdown says the same, and the definition keeps its keys', () => {
    const md = wu.markdown();
    expect(md).toContain('- Within-segment sum of squares: ');
    expect(md).toContain('- Average silhouette: ');
    expect(md).not.toMatch(/^- withinSS:/m);
    const evidence = seg.definition().definition.evidence as Record<string, unknown>;
    expect(Object.keys(evidence)).toEqual(expect.arrayContaining(['withinSS', 'averageSilhouette', 'stabilityJaccard']));
  });

  it('k-medoids: the cost is the total distance to the medoids', () => {
    const pam = study(records, { id: 'id' }).prepare().kmedoids({ k: 3 });
    expect(pam.writeUp().html()).toContain('<th>Total distance to the medoids</th>');
  });
});
