// Density definitions (rule nearest-dense-row): built from prepared.density(), saved and loaded
// back, assign gives every training member its segment, new rows far from every dense region are
// noise (segment 0, far), and tampered files are refused naming the key.
import { describe, expect, it } from 'vitest';
import { study } from '../../src/study';
import { loadDefinition } from '../../src/study/definition-handle';
import { createRandom } from '../../src/random';
import { DENSE_ROW_LIMIT } from '../../src/segments/dense-rows';

function stations(seed = 5) {
  const r = createRandom(seed);
  const out: { station: string; boardings: number; share: number; zone: string }[] = [];
  [
    [10, 0.2],
    [30, 0.5],
    [50, 0.8],
  ].forEach(([b, s], g) => {
    for (let i = 0; i < 40; i++)
      out.push({ station: `S${g}-${i}`, boardings: b + 2 * r.normal(), share: s + 0.04 * r.normal(), zone: g % 2 ? 'east' : 'west' });
  });
  for (let i = 0; i < 5; i++) out.push({ station: `far-${i}`, boardings: 90 + 15 * i, share: 1.6 - 0.4 * i, zone: 'east' });
  return out;
}

describe('density definition', () => {
  const records = stations();
  const seg = study(records, { id: 'station', use: ['boardings', 'share'], keep: ['zone'] })
    .prepare({ scale: 'zscore' })
    .density({ minSize: 10 });
  const def = seg.definition();

  it('stores every member with its core distance; counts the noise rows', () => {
    const d = def.definition;
    expect(d.rule).toBe('nearest-dense-row');
    expect(d.method.name).toBe('density');
    expect(d.denseRows!.values.length).toBe(seg.ids.length - seg.noiseCount);
    expect(d.training.noiseRows).toBe(seg.noiseCount);
    expect(d.segments.map((s) => s.size)).toEqual([...seg.sizes]);
  });

  it('assign: members keep their segment; the rule result on noise rows is counted in reproducedRows', () => {
    const out = def.assign(records);
    let same = 0;
    out.rows.forEach((row, i) => {
      if (seg.segments[i] > 0) expect(row.segment).toBe(seg.segments[i]);
      if (row.segment === seg.segments[i]) same++;
    });
    expect(same).toBe(def.definition.training.reproducedRows);
    // A row far from every dense region is noise.
    const fresh = def.assign([{ station: 'new', boardings: 400, share: -3, zone: 'west' }]);
    expect(fresh.rows[0]).toMatchObject({ segment: 0, far: true });
    const inside = def.assign([{ station: 'inside', boardings: 30, share: 0.5, zone: 'west' }]);
    expect(inside.rows[0].segment).toBe(seg.segmentOf('S1-0'));
    expect(inside.rows[0].far).toBe(false);
  });

  it('loads back unchanged, and refuses tampering naming the key', () => {
    const text = def.toJSON();
    const again = loadDefinition(text);
    expect(again.assign(records).rows).toEqual(def.assign(records).rows);
    const raw = JSON.parse(text);
    const bad1 = structuredClone(raw);
    bad1.denseRows.reach[0] = -1;
    expect(() => loadDefinition(JSON.stringify(bad1))).toThrow(/reach\[0\]/);
    const bad2 = structuredClone(raw);
    bad2.denseRows.segment.pop();
    expect(() => loadDefinition(JSON.stringify(bad2))).toThrow(/denseRows/);
    const bad3 = structuredClone(raw);
    bad3.rule = 'nearest-center';
    expect(() => loadDefinition(JSON.stringify(bad3))).toThrow(/nearest-dense-row/);
    const bad4 = structuredClone(raw);
    bad4.training.noiseRows += 1;
    expect(() => loadDefinition(JSON.stringify(bad4))).toThrow(/add up to/);
    expect(DENSE_ROW_LIMIT).toBe(20_000);
  });

  it('drift counts noise as far, in no segment', () => {
    const drift = def.assign(records).drift();
    const shares = drift.segments.reduce((s, x) => s + x.newShare, 0);
    expect(shares).toBeLessThanOrEqual(1);
  });
});
