// Segment names in the silhouette view were cut mid-word with no mark ("Weekday peak commu"), then
// at 15 characters; now they run on two lines, shortened at a word with an ellipsis only past that.
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
  it('show a segment name whole, on two lines when long, shortened at a word only past two lines', () => {
    const records = Array.from({ length: 24 }, (_, i) => ({ id: `r${i}`, a: (i % 2) * 5 + i * 0.01, b: i % 3 }));
    const seg = study(records, { id: 'id' }).prepare().kmeans({ k: 2, seed: 1 });
    seg.name(1, { title: 'Weekday peak commuters' });
    const html = seg.silhouette().html();
    expect(html).toContain('>Weekday peak commuters<');
    seg.name(2, { title: 'Occasional weekend riders from the outer zones who top up by card' });
    const long = seg.silhouette().html();
    expect(long).toContain('>Occasional weekend<');
    expect(long).toContain('>riders from the outer…<');
  });
});
