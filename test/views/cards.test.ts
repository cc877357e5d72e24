// Cards in the column's own units: rounding by the spread, shares as percentages, neutral inks,
// the reproduction figure only below 100 %, the caution once on the write-up page.
import { describe, expect, it } from 'vitest';
import { decimalsFor, formatShown, profileSegments } from '../../src/segments/profile';
import { profileCardsView } from '../../src/views/cards';
import { INK, SEGMENT_COLOURS } from '../../src/views/palette';
import { study } from '../../src';

const rows = [
  { id: 'a', trips: 2, peak: 0.1, fare: 'adult' },
  { id: 'b', trips: 3, peak: 0.2, fare: 'adult' },
  { id: 'c', trips: 4, peak: 0.15, fare: 'student' },
  { id: 'd', trips: 20, peak: 0.8, fare: 'student' },
  { id: 'e', trips: 22, peak: 0.9, fare: 'student' },
  { id: 'f', trips: 21, peak: 0.85, fare: 'adult' },
];

function profiles() {
  return profileSegments({
    assignment: [0, 0, 0, 1, 1, 1],
    features: rows.map((r) => [r.trips, r.peak]),
    ids: rows.map((r) => r.id),
    used: { trips: rows.map((r) => r.trips), peak: rows.map((r) => r.peak), fare: rows.map((r) => r.fare) },
  });
}

describe('values in the column units', () => {
  it('rounds to two significant digits of the spread', () => {
    expect(decimalsFor(9.6)).toBe(1); // sd 9.6 → one decimal
    expect(decimalsFor(40)).toBe(0);
    expect(decimalsFor(0.049)).toBe(3);
    expect(formatShown(0.625, { unit: 'percent', decimals: 0 })).toBe('63\u00a0%');
    expect(formatShown(12345.678, { unit: 'number', decimals: 1 })).toBe('12,345.7');
  });

  it('prints a 0..1 column and a level as percentages, a count as a number, both means alike', () => {
    const p = profiles();
    const trips = p[0].differences.find((d) => d.variable === 'trips')!;
    // trips: mean 3 in segment 1, 12 overall, sample sd 9.859 → one decimal.
    expect(trips.shownAs).toEqual({ unit: 'number', decimals: 1 });
    const peak = p[0].differences.find((d) => d.variable === 'peak')!;
    // peak: sd 0.3822 → 38.2 points → no decimal.
    expect(peak.shownAs).toEqual({ unit: 'percent', decimals: 0 });
    const html = profileCardsView(p).fragment();
    expect(html).toContain('3.0 (all rows 12.0)');
    expect(html).toContain('15\u00a0% (all rows 50\u00a0%)');
    expect(html).toMatch(/fare = student<\/div><div class="ks-apart-values">33\u00a0% \(all rows 50\u00a0%\)/);
  });

  it('draws above and below in inks that are no segment colour', () => {
    expect(SEGMENT_COLOURS).not.toContain(INK.above);
    expect(SEGMENT_COLOURS).not.toContain(INK.below);
    const html = profileCardsView(profiles()).fragment();
    expect(html).toContain(`fill="${INK.above}"`);
    expect(html).toContain(`fill="${INK.below}"`);
  });

  it('shows the typical member with its values', () => {
    const html = profileCardsView(profiles()).fragment();
    expect(html).toMatch(/Typical member<\/b>: b .*the medoid/);
    expect(html).toContain('trips 3.0');
  });

  it('shows how well the rule reproduces a segment only below 100 %', () => {
    const p = profiles().map((x, i) => ({ ...x, rule: { name: 'nearest-centre', reproduced: i === 0 ? 39 : 40, size: 40 } }));
    const html = profileCardsView(p).fragment();
    expect(html.match(/rule puts/g)).toHaveLength(1);
    expect(html).toContain('its nearest-centre rule puts 97.5\u00a0% of these rows (39 of 40) back in this segment');
  });
});

describe('the caution', () => {
  it('appears once on the write-up page', () => {
    const seg = study(rows, { id: 'id', use: ['trips', 'peak'] })
      .prepare({})
      .kmeans({ k: 2, seed: 1 });
    const page = seg.writeUp().html();
    expect(page.match(/protected/gi)).toHaveLength(1);
    expect(profileCardsView(profiles(), { caution: false }).fragment()).not.toContain('<p class="ks-caution">');
  });
});
