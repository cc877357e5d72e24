// Same input and seed → identical results, run twice, for every method; byte-identical definition
// files; and where a method promises it, permuted rows give permuted results. Data of our own
// making (test/reliability/data.ts, fixed seeds).
import { describe, expect, it } from 'vitest';
import {
  agglomerate,
  bootstrapStability,
  compareK,
  gapStatistic,
  kmeans,
  kmeansMiniBatch,
  kmedoids,
  prepareTable,
  readTable,
  study,
} from '../../src';
import { LINKAGE_METHODS } from '../../src/internal';
import { groupedRows, permutation } from './data';

const rows = groupedRows(60, 3, 3, 21);

/** Plain JSON of a result, typed arrays as lists, functions left out. */
function snapshot(value: unknown): string {
  return JSON.stringify(value, (_k, v) =>
    ArrayBuffer.isView(v) ? Array.from(v as unknown as ArrayLike<number>) : typeof v === 'function' ? undefined : v,
  );
}

describe('the same seed twice gives identical results', () => {
  it('kmeans, kmeansMiniBatch and kmedoids', () => {
    expect(snapshot(kmeans(rows, { k: 3, seed: 5, restarts: 4 }))).toBe(snapshot(kmeans(rows, { k: 3, seed: 5, restarts: 4 })));
    expect(snapshot(kmeansMiniBatch(rows, { k: 3, seed: 5 }))).toBe(snapshot(kmeansMiniBatch(rows, { k: 3, seed: 5 })));
    expect(snapshot(kmedoids(rows, { k: 3, seed: 5 }))).toBe(snapshot(kmedoids(rows, { k: 3, seed: 5 })));
  });
  it('a different seed is actually used (random starts differ on at least one of several seeds)', () => {
    const runs = new Set([1, 2, 3, 4, 5, 6].map((seed) => snapshot(kmeans(rows, { k: 7, seed, restarts: 1, start: 'random' }).centers)));
    expect(runs.size).toBeGreaterThan(1);
  });
  it.each(LINKAGE_METHODS.map((m) => [m]))('agglomerate with %s linkage: merges, order, cuts', (method) => {
    const a = agglomerate(rows, { method });
    const b = agglomerate(rows, { method });
    expect(snapshot(a.merges)).toBe(snapshot(b.merges));
    expect(snapshot(a.cut({ k: 4 }))).toBe(snapshot(b.cut({ k: 4 })));
  });
  it('gapStatistic, bootstrapStability and compareK', () => {
    const gap = () => snapshot(gapStatistic(rows, { kFrom: 1, kTo: 4, references: 4, seed: 9, restarts: 2 }));
    expect(gap()).toBe(gap());
    const stab = () => snapshot(bootstrapStability(rows, { k: 3, resamples: 6, seed: 9, restarts: 2 }));
    expect(stab()).toBe(stab());
    const ck = () => snapshot(compareK(rows, { from: 2, to: 4, seed: 9, restarts: 2, references: 3 }));
    expect(ck()).toBe(ck());
  });
});

describe('definition files are byte-identical across runs', () => {
  const records = rows.map((r, i) => ({ id: `m${i}`, a: r[0], b: r[1], c: r[2], kind: i % 3 === 0 ? 'x' : 'y' }));
  it('k-means, k-medoids and a hierarchy cut, fitted twice from scratch', () => {
    const fit = () => {
      const s = study(records, { id: 'id' }).prepare({ scale: 'robust' });
      return [
        s.kmeans({ k: 3, seed: 4, restarts: 3 }).name(1, { title: 'First' }).definition().toJSON(),
        s.kmedoids({ k: 3, seed: 4 }).definition().toJSON(),
        s.agglomerate({ method: 'average' }).cut({ k: 3 }).definition().toJSON(),
      ];
    };
    const a = fit();
    const b = fit();
    expect(a).toEqual(b);
    expect(new Set(a).size).toBe(3);
  });
});

describe('permuted input gives permuted output where the method promises it', () => {
  const p = permutation(rows.length, 77);
  const permuted = p.map((i) => rows[i]);
  it.each(LINKAGE_METHODS.map((m) => [m]))('%s linkage: same multiset of heights (no ties in the data)', (method) => {
    const h = (t: ReturnType<typeof agglomerate>) => t.merges.map((m) => m.height).sort((x, y) => x - y);
    const a = h(agglomerate(rows, { method }));
    const b = h(agglomerate(permuted, { method }));
    for (let i = 0; i < a.length; i++) expect(b[i]).toBeCloseTo(a[i], 9);
  });
  it('kmeans with given centres: the permuted assignment, identical centres', () => {
    const start = [rows[0], rows[1], rows[2]];
    const a = kmeans(rows, { k: 3, start });
    const b = kmeans(permuted, { k: 3, start });
    expect(Array.from(b.assignment)).toEqual(p.map((i) => a.assignment[i]));
    for (let s = 0; s < 3; s++) for (let j = 0; j < 3; j++) expect(b.centers[s][j]).toBeCloseTo(a.centers[s][j], 10);
  });
  it('preparation: permuted records give the permuted matrix and ids, and the same stored preparation', () => {
    const recs = rows.map((r, i) => ({ id: `m${i}`, a: r[0], b: r[1] }));
    const a = prepareTable(readTable(recs), { id: 'id', scale: 'robust' });
    const b = prepareTable(readTable(p.map((i) => recs[i])), { id: 'id', scale: 'robust' });
    expect(b.ids).toEqual(p.map((i) => a.ids[i]));
    for (let r = 0; r < p.length; r++) for (let j = 0; j < 2; j++) expect(b.matrix.data[r * 2 + j]).toBe(a.matrix.data[p[r] * 2 + j]);
    expect(JSON.stringify(b.preparation)).toBe(JSON.stringify(a.preparation));
  });
});
