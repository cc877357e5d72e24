// The evidence-for-k view: panels in the order of the recommendation rule, each marking its own
// pick, the recommended k shaded the same way in every panel, stability drawn per segment, and a
// grid with no empty cell.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/fixtures/gap_clusgap.json';
import { compareK } from '../../src/assess';
import { kEvidenceView } from '../../src/views';
import { panelRows } from '../../src/views/k-evidence-panels';

const count = (text: string, pattern: RegExp) => (text.match(pattern) ?? []).length;

describe('kEvidenceView', () => {
  const blobs = compareK(fixture.gap.blobs.rows, { from: 2, to: 7, seed: 1 });

  it("draws six panels, the rule's three first, each with its own pick ringed and the recommended k shaded", () => {
    const view = kEvidenceView(blobs);
    const svg = view.svg();
    expect(view.title).toBe(blobs.headline);
    const titles = [...svg.matchAll(/font-weight="650" fill="#[0-9a-f]{6}">([^<]+)<\/text>/g)].map((m) => m[1]);
    expect(titles).toEqual([
      'Stability',
      'Gap statistic',
      'Within-segment SS',
      'Average silhouette',
      'Calinski–Harabasz',
      'Davies–Bouldin',
    ]);
    expect(count(svg, /◯ k = 4</g)).toBe(6); // every criterion picks 4 on these blobs
    expect(count(svg, /r="7.5" fill="none"/g)).toBe(6); // one ring per panel
    expect(count(svg, /fill-opacity="0.1"/g)).toBe(6); // the same band in every panel
    // Stability per segment: one dot per segment per k (2 + 3 + … + 7 = 27), the 0.75 line labelled.
    expect(count(svg, /r="2.2"/g)).toBe(27);
    expect(svg).toContain('stable ≥ 0.75');
    // The live chart marks the same things.
    const html = view.html();
    expect(html).toContain('circle-open');
    expect(html).toContain('weakest Jaccard');
  });

  it('on structureless rows shades no k and says why', () => {
    const noise = compareK(fixture.gap.noise.rows, { from: 2, to: 6, seed: 1 });
    const view = kEvidenceView(noise);
    expect(view.title).toMatch(/^No clustering structure/);
    expect(view.caption).toMatch(/No k is shaded: the rows show no clustering structure/);
    expect(count(view.svg(), /fill-opacity="0.1"/g)).toBe(0);
  });

  it('fills every row of the grid: five panels sit three and two, four sit two and two', () => {
    expect(panelRows(6)).toEqual([3, 3]);
    expect(panelRows(5)).toEqual([3, 2]);
    expect(panelRows(4)).toEqual([2, 2]);
    expect(panelRows(7)).toEqual([3, 2, 2]);
    const withoutGap = compareK(fixture.gap.blobs.rows, { from: 2, to: 6, seed: 1, gap: false });
    const svg = kEvidenceView(withoutGap).svg();
    expect(count(svg, /<g transform="translate\(/g)).toBe(5);
    expect(svg).toContain('translate(450 214)'); // second row: two panels of half the width
  });
});
