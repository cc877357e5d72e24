// prepared.density(): the fluent twin of densitySegments on the prepared rows; noise rows are
// kept, counted and shown everywhere a segmentation is read (sizes, segments, segmentOf,
// members, cards, projection, silhouette, rules), and what has no meaning for noise is refused.
import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import { createRandom } from '../../src/random';
import { densitySegments, NOISE } from '../../src/methods/density';

function stations(seed = 5) {
  const r = createRandom(seed);
  const out: { station: string; boardings: number; share: number; zone: string }[] = [];
  const centres = [
    [10, 0.2],
    [30, 0.5],
    [50, 0.8],
  ];
  centres.forEach(([b, s], g) => {
    for (let i = 0; i < 40; i++)
      out.push({ station: `S${g}-${i}`, boardings: b + 2 * r.normal(), share: s + 0.04 * r.normal(), zone: g % 2 ? 'east' : 'west' });
  });
  for (let i = 0; i < 5; i++) out.push({ station: `far-${i}`, boardings: 90 + 15 * i, share: 1.6 - 0.4 * i, zone: 'east' });
  return out;
}

describe('prepared.density', () => {
  const prepared = study(stations(), { id: 'station', use: ['boardings', 'share'], keep: ['zone'] }).prepare({ scale: 'zscore' });
  const seg = prepared.density({ minSize: 10 });
  const fit = densitySegments(prepared.data.matrix, { minSize: 10 });

  it('gives what densitySegments gives on the prepared rows, noise as -1 / 0', () => {
    expect([...seg.assignment]).toEqual([...fit.assignment]);
    expect(seg.k).toBe(3);
    expect(seg.noiseCount).toBe(fit.noiseCount);
    expect(seg.noiseCount).toBeGreaterThanOrEqual(5);
    expect(seg.sizes.reduce((a, b) => a + b, 0) + seg.noiseCount).toBe(seg.ids.length);
    for (let i = 0; i < seg.ids.length; i++) expect(seg.segments[i]).toBe(fit.assignment[i] === NOISE ? 0 : fit.assignment[i] + 1);
    expect(seg.segmentOf('far-4')).toBe(0);
    expect(seg.noiseMembers()).toContain('far-4');
    const members = [1, 2, 3].flatMap((s) => seg.members(s));
    expect(members.length + seg.noiseMembers().length).toBe(seg.ids.length);
    expect(seg.describeMethod()).toMatch(/noise/);
    expect(seg.notes.join(' ')).toMatch(/in no segment/);
  });

  it('shows noise: a noise card, noise rings in the projection', () => {
    const profiles = seg.profiles();
    expect(profiles).toHaveLength(4);
    const noise = profiles[3] as (typeof profiles)[number] & { noise?: boolean };
    expect(noise.noise).toBe(true);
    expect(noise.size).toBe(seg.noiseCount);
    const cards = seg.cards().html();
    expect(cards).toContain('Noise: in no segment');
    expect(cards).toContain('and of the rows in none (noise)');
    const projection = seg.projection();
    expect(projection.html()).toContain('noise (no segment)');
    expect(projection.html()).toContain(`${seg.noiseCount} of ${seg.ids.length} rows are in no segment (noise)`);
  });

  it('silhouette over the segment rows only, stated; rules with noise as a class; refusals', () => {
    const sil = seg.silhouette() as ReturnType<typeof seg.silhouette> & { noiseLeftOut: number };
    expect(sil.noiseLeftOut).toBe(seg.noiseCount);
    expect(sil.values.length).toBe(seg.ids.length - seg.noiseCount);
    const rules = seg.rules();
    expect(JSON.stringify(rules)).toMatch(/Noise: in no segment/);
    expect(() => seg.stability()).toThrow(/density segments are not rerun/);
    expect(() => seg.definition().toSql({ table: 'stations', dialect: 'duckdb' })).toThrow(/in memory only for now/);
    expect(() => seg.relabelByRule()).toThrow(/no nearest-centre rule/);
    expect(() => prepared.density({ minSize: 10, metric: 'gower' })).toThrow(/gower/);
    expect(() => prepared.density({ minSize: 10, minSample: 3 } as never)).toThrow(/minSamples/);
  });
});
