import { describe, expect, it } from 'vitest';
import * as fs from 'fs';
import * as path from 'path';
import fc from 'fast-check';
import { profileSegments } from '../../src/segments/profile';
import { quantileSorted } from '../../src/core/quantile';
import { KinsortError } from '../../src/core/errors';

const fixture = JSON.parse(fs.readFileSync(path.join(__dirname, '../reference/fixtures/segment-profile.json'), 'utf8'));

describe('profileSegments against NumPy / SciPy (test/reference/segment-profile.py, data of our own making)', () => {
  const inp = fixture.inputs;
  const profiles = profileSegments({
    assignment: inp.assignment,
    features: inp.features,
    ids: inp.assignment.map((_: number, i: number) => `r${i}`),
    used: { trips: inp.trips, peak: inp.peak, fare: inp.fare },
    keep: { tenure: inp.tenure, zone: inp.zone },
  });

  it('sizes and shares', () => {
    expect(profiles.map((p) => p.size)).toEqual(fixture.expected.map((e: { size: number }) => e.size));
    expect(profiles.reduce((a, p) => a + p.share, 0)).toBeCloseTo(1, 12);
  });

  it('standardised differences, numeric and one-hot shares (NumPy mean, std ddof=1)', () => {
    profiles.forEach((p, s) => {
      const want = fixture.expected[s].differences;
      expect(p.differences.length).toBe(Object.keys(want).length);
      for (const d of p.differences) {
        const key = d.level === undefined ? d.variable : `${d.variable}=${d.level}`;
        expect(d.difference).toBeCloseTo(want[key].difference, 10);
        expect(d.segmentMean).toBeCloseTo(want[key].segmentMean, 10);
        expect(d.overallSd).toBeCloseTo(want[key].overallSd, 10);
      }
      for (let i = 1; i < p.differences.length; i++) {
        expect(Math.abs(p.differences[i - 1].difference)).toBeGreaterThanOrEqual(Math.abs(p.differences[i].difference));
      }
    });
  });

  it('typical member is the exact medoid (SciPy cdist, least summed distance)', () => {
    profiles.forEach((p, s) => {
      expect(p.typical.row).toBe(fixture.expected[s].medoid);
      expect(p.typical.id).toBe(`r${fixture.expected[s].medoid}`);
      expect(p.typical.how).toBe('exact');
    });
  });

  it('kept columns: median and IQR (numpy.percentile, linear) and category shares', () => {
    profiles.forEach((p, s) => {
      const tenure = p.kept.find((k) => k.name === 'tenure')!;
      expect(tenure.kind).toBe('numeric');
      if (tenure.kind !== 'numeric') return;
      expect(tenure.median).toBeCloseTo(fixture.expected[s].tenure.median, 10);
      expect(tenure.q1).toBeCloseTo(fixture.expected[s].tenure.q1, 10);
      expect(tenure.q3).toBeCloseTo(fixture.expected[s].tenure.q3, 10);
      expect(tenure.missing).toBe(fixture.expected[s].tenure.missing);
      const zone = p.kept.find((k) => k.name === 'zone')!;
      if (zone.kind !== 'categorical') throw new Error('zone should be categorical');
      for (const sh of zone.shares) expect(sh.share).toBeCloseTo(fixture.expected[s].zone[sh.level], 12);
    });
  });
});

describe('profileSegments behaviour', () => {
  const features = [[0], [1], [2], [10], [11], [30]];
  it('uses given medoids, names, stability and the top count', () => {
    const p = profileSegments({
      assignment: [0, 0, 0, 1, 1, 1],
      features,
      medoids: [1, 4],
      names: { 2: { title: 'Far', text: 'Far away rows' } },
      stability: { jaccard: [0.9, 0.55], reading: ['stable', 'doubtful'] },
      used: { a: [1, 2, 3, 4, 5, 6], b: [0, 0, 0, 1, 1, 2], c: ['x', 'x', 'y', 'y', 'y', 'y'] },
      top: 2,
    });
    expect(p[0].typical).toEqual({ row: 1, id: undefined, how: 'given', values: { a: 2, b: 0, c: 'x' } });
    expect(p[1].title).toBe('Far');
    expect(p[0].title).toBeUndefined();
    expect(p[1].stability).toEqual({ jaccard: 0.55, reading: 'doubtful' });
    expect(p[0].standout.length).toBe(2);
  });

  it('falls back to the member nearest the centroid above the exact limit', () => {
    const n = 3001;
    const rows = Array.from({ length: n }, (_, i) => [i === 0 ? 1000 : (i % 7) - 3]);
    const p = profileSegments({ assignment: new Array(n).fill(0), features: rows });
    expect(p[0].typical.how).toBe('nearest-centroid');
    // centroid ≈ 0.33; members at 0 are nearest
    expect(rows[p[0].typical.row][0]).toBe(0);
  });

  it('refuses bad input with clear messages', () => {
    expect(() => profileSegments({ assignment: [0, 1], features: [[1], [2], [3]] })).toThrow(/3/);
    expect(() => profileSegments({ assignment: [0, 1], features: [[1], [2]], medoids: [1, 0] })).toThrow(/medoid of segment 1 is row 2/);
    expect(() => profileSegments({ assignment: [0, 1], features: [[1], [2]], used: { a: [1] } })).toThrow(
      /column "a" has 1 values for 2 rows/,
    );
    expect(() => profileSegments({ assignment: [0], features: [[1]], tpo: 3 } as never)).toThrow(KinsortError);
  });

  it('property: share-weighted segment means of a column equal the overall mean', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(
            fc.integer({ min: 0, max: 3 }),
            fc.integer({ min: -1000, max: 1000 }).map((v) => v / 10),
          ),
          {
            minLength: 4,
            maxLength: 40,
          },
        ),
        (pairs) => {
          const values = pairs.map((p) => p[1]);
          if (new Set(values).size < 2) return;
          const p = profileSegments({ assignment: pairs.map((q) => q[0]), features: values.map((v) => [v]), used: { v: values } });
          const weighted = p.reduce((acc, seg) => acc + seg.share * seg.differences[0].segmentMean, 0);
          expect(weighted).toBeCloseTo(p[0].differences[0].overallMean, 6);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('quantileSorted follows the linear rule (R type 7; value worked by hand)', () => {
    // 1,2,3,4: h = 3 × 0.25 = 0.75 → 1 + 0.75 × (2 − 1) = 1.75
    expect(quantileSorted([1, 2, 3, 4], 0.25)).toBe(1.75);
  });
});
