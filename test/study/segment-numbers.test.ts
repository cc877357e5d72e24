// One numbering for people: `segments` (1..k) matches names, members, profiles and what a definition
// gives the training rows; `assignment` stays the functional core's 0..k-1.
import { describe, expect, it } from 'vitest';
import { study } from '../../src';

const records = Array.from({ length: 60 }, (_, i) => ({ id: `r${i}`, x: (i % 3) * 10 + (i % 7) / 10, y: (i % 3) * 5 - (i % 5) / 10 }));

describe('segment numbers in the fluent layer', () => {
  const seg = study(records, { id: 'id' }).prepare().kmeans({ k: 3, seed: 1, restarts: 3 });

  it('segments[i] is assignment[i] + 1, for every row', () => {
    expect(Array.from(seg.segments)).toEqual(Array.from(seg.assignment, (a) => a + 1));
    expect(Math.min(...seg.segments)).toBe(1);
    expect(Math.max(...seg.segments)).toBe(3);
  });

  it('members(s) and the definition use the same numbers as segments', () => {
    for (let s = 1; s <= seg.k; s++) {
      const ids = seg.ids.filter((_, i) => seg.segments[i] === s);
      expect(seg.members(s)).toEqual(ids);
    }
    const scored = seg.definition().assign(records).rows;
    expect(scored.map((r) => r.segment)).toEqual(Array.from(seg.segments));
  });
});
