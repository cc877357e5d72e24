// Progress: every route reports merges done, in order, ending at n-1, about a hundred times at most.
import { describe, expect, it } from 'vitest';
import { agglomerate, LINKAGE_METHODS } from '../../../src/methods/hierarchy';
import { dissimilarity } from '../../../src/measure/dissimilarity';
import { createRandom } from '../../../src/random';
import type { ProgressEvent } from '../../../src/core/progress';

describe('agglomerate progress', () => {
  const r = createRandom(5);
  const rows = Array.from({ length: 450 }, () => [r.normal(), r.normal()]);
  const d = dissimilarity(rows);

  for (const method of LINKAGE_METHODS) {
    it(`${method}: from rows and from a dissimilarity`, () => {
      for (const input of [rows, d]) {
        const events: ProgressEvent[] = [];
        agglomerate(input, { method, onProgress: (e) => events.push(e) });
        expect(events.length).toBeGreaterThan(10);
        expect(events.length).toBeLessThanOrEqual(102);
        expect(events.every((e) => e.total === 449 && e.task === 'agglomerating')).toBe(true);
        expect(events.map((e) => e.done)).toEqual([...events.map((e) => e.done)].sort((a, b) => a - b));
        expect(events[events.length - 1].done).toBe(449);
      }
    });
  }

  it('refuses a progress option that is not a function', () => {
    expect(() => agglomerate(rows, { method: 'ward', onProgress: 'yes' as any })).toThrow(/onProgress must be a function/);
  });

  it('takes the one spelling every long call uses: the old "progress" is refused, pointing to onProgress', () => {
    expect(() => agglomerate(rows, { method: 'ward', progress: () => {} } as any)).toThrow(/unknown option "progress".*onProgress/);
  });
});
