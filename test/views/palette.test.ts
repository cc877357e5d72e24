import { describe, expect, it } from 'vitest';
import { SEGMENT_COLOURS, segmentColour, textOn } from '../../src/views/palette';
import { ciede2000, colourDifference, hexToRgb, rgbToLab, simulate } from './colour-vision';

describe('colour science used by the palette check', () => {
  it('CIEDE2000 matches the published test pairs of Sharma, Wu & Dalal (2005) (values from memory)', () => {
    expect(ciede2000([50, 2.6772, -79.7751], [50, 0, -82.7485])).toBeCloseTo(2.0425, 4);
    expect(ciede2000([50, 3.1571, -77.2803], [50, 0, -82.7485])).toBeCloseTo(2.8615, 4);
    expect(ciede2000([50, 2.8361, -74.02], [50, 0, -82.7485])).toBeCloseTo(3.4412, 4);
    expect(ciede2000([50, -1, 2], [50, 0, 0])).toBeCloseTo(2.3669, 4);
  });

  it('sRGB white maps to L* = 100 and greys stay grey under every simulated dichromacy', () => {
    expect(rgbToLab([1, 1, 1])[0]).toBeCloseTo(100, 3);
    for (const kind of ['protanopia', 'deuteranopia', 'tritanopia'] as const) {
      const grey = simulate(hexToRgb('#808080'), kind);
      for (const c of grey) expect(c).toBeCloseTo(0.502, 2);
    }
  });
});

describe('segment palette', () => {
  const pairs: [string, string][] = [];
  SEGMENT_COLOURS.forEach((a, i) => SEGMENT_COLOURS.slice(i + 1).forEach((b) => pairs.push([a, b])));

  for (const vision of [undefined, 'deuteranopia', 'protanopia', 'tritanopia'] as const) {
    it(`every pair differs by CIEDE2000 ≥ 12 ${vision ? `under simulated ${vision} (Machado 2009)` : 'with normal vision'}`, () => {
      const smallest = Math.min(...pairs.map(([a, b]) => colourDifference(a, b, vision)));
      // 12 is well above the ~2–3 units usually called "just noticeable" (common practice).
      expect(smallest).toBeGreaterThanOrEqual(12);
    });
  }

  it('repeats past eight segments and picks readable number ink', () => {
    expect(segmentColour(8)).toBe(segmentColour(0));
    expect(textOn('#1a6699')).toBe('#ffffff');
    expect(textOn('#99cc80')).toBe('#111111');
  });
});
