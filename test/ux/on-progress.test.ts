// One spelling for progress: every long-running public call takes `onProgress` with the same
// ProgressCallback type, tells work done in order up to the total, and gives the same result as
// without it. Data: seeded rows of our own (the package's generator).
import { describe, expect, it } from 'vitest';
import {
  agglomerate,
  bootstrapStability,
  compareK,
  createRandom,
  dissimilarity,
  gapStatistic,
  kmeans,
  kmeansMiniBatch,
  kmedoids,
  silhouette,
  study,
  variableTree,
  type ProgressCallback,
  type ProgressEvent,
} from '../../src';
import { setDissimilarityThreads } from '../../src/internal';

function rows(n: number, d: number, seed: string): number[][] {
  const r = createRandom(seed);
  return Array.from({ length: n }, (_, i) => Array.from({ length: d }, (_, j) => r.normal() + ((i % 3) * 4 + j) * 0.5));
}

function recorder(): { events: ProgressEvent[]; onProgress: ProgressCallback } {
  const events: ProgressEvent[] = [];
  return { events, onProgress: (e) => events.push(e) };
}

/** Events of `task` count up, never past their total, and reach it. */
function countsUp(events: readonly ProgressEvent[], task: string): void {
  const mine = events.filter((e) => e.task === task);
  expect(mine.length, `events of ${task}`).toBeGreaterThan(0);
  const done = mine.map((e) => e.done);
  expect(done).toEqual([...done].sort((a, b) => a - b));
  expect(mine.every((e) => e.done <= e.total)).toBe(true);
  expect(mine[mine.length - 1].done).toBe(mine[mine.length - 1].total);
}

describe('onProgress on every long-running call', () => {
  const small = rows(120, 4, 'progress small');

  it('dissimilarity: pairs told row by row, and the euclidean kernel in parts on one or two threads, the result unchanged to the bit', () => {
    const manhattan = recorder();
    const d1 = dissimilarity(small, { metric: 'manhattan', onProgress: manhattan.onProgress });
    countsUp(manhattan.events, 'dissimilarity');
    expect(manhattan.events[manhattan.events.length - 1].total).toBe((120 * 119) / 2);
    expect(Array.from(d1.condensed)).toEqual(Array.from(dissimilarity(small, { metric: 'manhattan' }).condensed));

    // 3,200 rows: the WebAssembly kernel, shared with the worker thread when two are allowed.
    const big = rows(3200, 3, 'progress big');
    for (const threads of [1, 2] as const) {
      const before = setDissimilarityThreads(threads);
      try {
        const told = recorder();
        const withProgress = dissimilarity(big, { onProgress: told.onProgress });
        countsUp(told.events, 'dissimilarity');
        expect(told.events.length).toBeGreaterThan(5);
        const plain = dissimilarity(big);
        const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
        expect(Buffer.compare(bytes(withProgress.condensed), bytes(plain.condensed))).toBe(0);
      } finally {
        setDissimilarityThreads(before === 2 ? 2 : 1);
      }
    }
  });

  it('silhouette, from rows and from a dissimilarity, in pairs, with the same values', () => {
    const fit = kmeans(small, { k: 3, seed: 1 });
    for (const input of [small, dissimilarity(small)]) {
      const told = recorder();
      const s = silhouette(input, fit.assignment, { onProgress: told.onProgress });
      countsUp(told.events, 'silhouette');
      expect(told.events[told.events.length - 1].total).toBe((120 * 119) / 2);
      expect(s.average).toBe(silhouette(input, fit.assignment).average);
    }
  });

  it('variableTree: the correlations, then the tree', () => {
    const told = recorder();
    variableTree(small, { names: ['a', 'b', 'c', 'd'], onProgress: told.onProgress });
    expect(told.events.map((e) => [e.task, e.done, e.total])).toEqual([
      ['variable tree', 0, 2],
      ['variable tree', 1, 2],
      ['variable tree', 2, 2],
    ]);
  });

  it('the methods and the k evidence all take it by the same name', () => {
    const calls: [string, (onProgress: ProgressCallback) => unknown][] = [
      ['kmeans', (onProgress) => kmeans(small, { k: 3, seed: 1, restarts: 2, onProgress })],
      ['kmeansMiniBatch', (onProgress) => kmeansMiniBatch(small, { k: 3, seed: 1, batchSize: 40, onProgress })],
      ['kmedoids', (onProgress) => kmedoids(dissimilarity(small), { k: 3, seed: 1, onProgress })],
      ['agglomerate', (onProgress) => agglomerate(small, { method: 'average', onProgress })],
      ['gapStatistic', (onProgress) => gapStatistic(small, { kFrom: 1, kTo: 3, references: 2, seed: 1, onProgress })],
      ['compareK', (onProgress) => compareK(small, { from: 2, to: 3, seed: 1, references: 2, restarts: 1, onProgress })],
      ['bootstrapStability', (onProgress) => bootstrapStability(small, { k: 3, resamples: 3, seed: 1, onProgress })],
    ];
    for (const [name, call] of calls) {
      const told = recorder();
      call(told.onProgress);
      expect(told.events.length, name).toBeGreaterThan(0);
      expect(() => call('yes' as unknown as ProgressCallback), name).toThrow(/onProgress|progress/);
    }
  });

  it('the fluent layer: dissimilarity, silhouette, variableTree and assign pass it on', () => {
    const records = small.map((r, i) => ({ id: `p${i + 1}`, a: r[0], b: r[1], c: r[2], d: r[3] }));
    const prepared = study(records, { id: 'id' }).prepare({ scale: 'zscore' });
    const seen = recorder();
    prepared.dissimilarity({ metric: 'manhattan', onProgress: seen.onProgress });
    prepared.variableTree({ onProgress: seen.onProgress });
    const seg = prepared.kmeans({ k: 3, seed: 2, restarts: 2 });
    seg.silhouette({ onProgress: seen.onProgress });
    const scored = seg.assign(records.slice(0, 50), { onProgress: seen.onProgress });
    expect(scored.rows.every((r) => r.segment !== null)).toBe(true);
    for (const task of ['dissimilarity', 'variable tree', 'silhouette', 'assigning']) countsUp(seen.events, task);
    expect(seen.events.filter((e) => e.task === 'assigning').pop()!.total).toBe(50);
  });
});
