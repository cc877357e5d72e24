import { describe, expect, it } from 'vitest';
import { kmeans } from '../../../src/methods/partition';
import { KinsortError } from '../../../src/core/errors';
import { blobs, readFixture, samePartition, squaredDistance } from './partition-helpers';

const iris = readFixture('kmeans_iris.json');

describe('kmeans on Fisher iris (1936) against R stats::kmeans (fixture kmeans_iris.json)', () => {
  it('k = 3, 25 restarts reaches R nstart = 100 within-SS (1e-6 relative) and the same partition', () => {
    const fit = kmeans(iris.rows, { k: 3, restarts: 25, seed: 1 });
    expect(Math.abs(fit.withinSS - iris.k3.withinSS) / iris.k3.withinSS).toBeLessThan(1e-6);
    expect(Math.abs(fit.totalSS - iris.k3.totalSS) / iris.k3.totalSS).toBeLessThan(1e-12);
    expect(Math.abs(fit.betweenSS - iris.k3.betweenSS) / iris.k3.betweenSS).toBeLessThan(1e-6);
    expect(samePartition(fit.assignment, iris.k3.cluster)).toBe(true);
    expect([...fit.sizes].sort()).toEqual([...iris.k3.sizes].sort());
    expect(fit.converged).toBe(true);
  });

  for (const entry of iris.bestByK.table as { k: number; withinSS: number }[]) {
    it(`k = ${entry.k}: best within-SS matches R kmeans nstart = 200`, () => {
      const fit = kmeans(iris.rows, { k: entry.k, restarts: 25, seed: 3 });
      expect(Math.abs(fit.withinSS - entry.withinSS) / entry.withinSS).toBeLessThan(1e-6);
    });
  }
});

describe('kmeans result', () => {
  const rows = blobs(300, 3, 4, 11);
  const fit = kmeans(rows, { k: 4, seed: 5, tolerance: 0 });

  it('has the documented shape', () => {
    expect(fit.kind).toBe('kmeans');
    expect(fit.variant).toBe('lloyd');
    expect(fit.assignment).toBeInstanceOf(Int32Array);
    expect(fit.assignment.length).toBe(300);
    expect(fit.centers.length).toBe(4);
    expect(fit.sizes.reduce((a, b) => a + b, 0)).toBe(300);
    expect(fit.restartsRun).toBe(10);
    expect(fit.restartWithinSS.length).toBe(10);
    expect(Math.min(...fit.restartWithinSS)).toBe(fit.withinSS);
  });

  it('centres are the means of their rows and within-SS is recomputed from them', () => {
    let within = 0;
    for (let c = 0; c < 4; c++) {
      const members = rows.filter((_, i) => fit.assignment[i] === c);
      const mean = members[0].map((_, j) => members.reduce((s, r) => s + r[j], 0) / members.length);
      mean.forEach((v, j) => expect(fit.centers[c][j]).toBeCloseTo(v, 10));
      const w = members.reduce((s, r) => s + squaredDistance(r, mean), 0);
      expect(fit.withinSSBySegment[c]).toBeCloseTo(w, 8);
      within += w;
    }
    expect(fit.withinSS).toBeCloseTo(within, 8);
    expect(fit.withinSS + fit.betweenSS).toBeCloseTo(fit.totalSS, 6);
  });

  it('uses given centres as the start, with one restart', () => {
    const start = [rows[0], rows[1], rows[2], rows[3]];
    const a = kmeans(rows, { k: 4, start });
    const b = kmeans(rows, { k: 4, start, seed: 99 });
    expect(a.restartsRun).toBe(1);
    expect(Array.from(a.assignment)).toEqual(Array.from(b.assignment));
  });

  it('reports progress once per restart', () => {
    const events: number[] = [];
    kmeans(rows, { k: 2, restarts: 3, onProgress: (e) => events.push(e.done) });
    expect(events).toEqual([1, 2, 3]);
  });

  it('random starts also work and are seeded', () => {
    const a = kmeans(rows, { k: 4, start: 'random', seed: 2 });
    const b = kmeans(rows, { k: 4, start: 'random', seed: 2 });
    expect(a.withinSS).toBe(b.withinSS);
  });

  it('k = 1 gives one segment whose centre is the grand mean', () => {
    const one = kmeans(rows, { k: 1 });
    expect(one.withinSS).toBeCloseTo(one.totalSS, 8);
    expect(one.betweenSS).toBeCloseTo(0, 8);
  });

  it('repairs an empty segment: duplicate starting centres still give k non-empty segments', () => {
    const start = [rows[0], rows[0], rows[1], rows[2]];
    const r = kmeans(rows, { k: 4, start, tolerance: 0 });
    expect(r.sizes.every((s) => s > 0)).toBe(true);
  });
});

describe('kmeans empty-segment repair (documented rule, worked by hand)', () => {
  it('gives the empty segment the row farthest from its centre, the lower row on a tie', () => {
    // Start [0], [0], [20]: segment 2 (duplicate centre) gets no row (ties go to the lower
    // segment). Distances to own centre: 0, 1, 10, 9, 10 — rows 3 and 5 tie at 10, row 3 is
    // taken, so segment 2 starts at [10] and ends as {10, 11}; segment 3 ends as {30}.
    const rows = [[0], [1], [10], [11], [30]];
    const fit = kmeans(rows, { k: 3, start: [[0], [0], [20]], tolerance: 0 });
    expect(Array.from(fit.assignment)).toEqual([0, 0, 1, 1, 2]);
    expect(fit.centers).toEqual([[0.5], [10.5], [30]]);
    expect(fit.withinSS).toBeCloseTo(0.5 + 0.5, 12);
  });
});

describe('kmeans refuses bad input', () => {
  const rows = [
    [0, 0],
    [1, 1],
    [2, 2],
    [0, 0],
  ];
  const code = (f: () => unknown) => {
    try {
      f();
    } catch (e) {
      expect(e).toBeInstanceOf(KinsortError);
      return [(e as KinsortError).code, (e as Error).message];
    }
    throw new Error('did not throw');
  };
  it('k < 1, non-integer k, missing k', () => {
    expect(code(() => kmeans(rows, { k: 0 }))).toEqual(['bad-k', expect.stringContaining('got 0')]);
    expect(code(() => kmeans(rows, { k: 1.5 }))).toEqual(['bad-k', expect.stringContaining('got 1.5')]);
    expect(code(() => kmeans(rows, {} as any))[0]).toBe('bad-k');
  });
  it('k above the number of distinct rows', () => {
    const [c, msg] = code(() => kmeans(rows, { k: 4 }));
    expect(c).toBe('bad-k');
    expect(msg).toContain('only 3 distinct');
    expect(code(() => kmeans(rows, { k: 5 }))[1]).toContain('at most 4');
  });
  it('restarts < 1, unknown option with a suggestion', () => {
    expect(code(() => kmeans(rows, { k: 2, restarts: 0 }))[1]).toContain('restarts');
    expect(code(() => kmeans(rows, { k: 2, restart: 3 } as any))[1]).toContain('Did you mean "restarts"');
  });
  it('NaN and Infinity name the row and column', () => {
    const msg = code(() =>
      kmeans(
        [
          [0, 1],
          [2, NaN],
        ],
        { k: 1 },
      ),
    )[1];
    expect(msg).toContain('row 2');
    expect(msg).toContain('column 2');
    expect(
      code(() =>
        kmeans(
          [
            [Infinity, 1],
            [2, 3],
          ],
          { k: 1 },
        ),
      )[0],
    ).toBe('not-finite');
  });
  it('given centres of the wrong shape, or with restarts', () => {
    expect(code(() => kmeans(rows, { k: 2, start: [[0, 0]] }))[1]).toContain('1 × 2');
    expect(code(() => kmeans(rows, { k: 2, start: [[0], [1]] }))[1]).toContain('2 × 1');
    expect(
      code(() =>
        kmeans(rows, {
          k: 2,
          start: [
            [0, 0],
            [1, 1],
          ],
          restarts: 5,
        }),
      )[1],
    ).toContain('restarts');
    expect(code(() => kmeans(rows, { k: 2, start: 'kmeans++' as any }))[0]).toBe('bad-option');
  });
});
