// Segment names too long for the silhouette's label box were cut mid-word with no mark
// ("Weekday peak commu"); now cut at a word with an ellipsis, in the live chart and the still.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { study } from '../../src';
import { shortName } from '../../src/views/common';

describe('shortName', () => {
  it('cuts at a word and marks the cut', () => {
    expect(shortName('Weekday peak commuters', 18)).toBe('Weekday peak…');
    expect(shortName('Students', 18)).toBe('Students');
    expect(shortName('Supercalifragilistic', 10)).toBe('Supercali…');
  });

  it('never exceeds its room, and keeps a short name whole', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 60 }), fc.integer({ min: 4, max: 40 }), (name, max) => {
        const out = shortName(name, max);
        expect(out.length).toBeLessThanOrEqual(max);
        if (name.length <= max) expect(out).toBe(name);
        else expect(out.endsWith('…')).toBe(true);
      }),
    );
  });
});

describe('silhouette labels', () => {
  it('show a long segment name shortened with an ellipsis, not cut mid-word', () => {
    const records = Array.from({ length: 24 }, (_, i) => ({ id: `r${i}`, a: (i % 2) * 5 + i * 0.01, b: i % 3 }));
    const seg = study(records, { id: 'id' }).prepare().kmeans({ k: 2, seed: 1 });
    seg.name(1, { title: 'Weekday peak commuters' });
    const html = seg.silhouette().html();
    expect(html).toContain('Weekday peak…');
    expect(html).not.toContain('Weekday peak commu<');
    expect(html).not.toMatch(/Weekday peak commu(?!ters)/);
  });
});
