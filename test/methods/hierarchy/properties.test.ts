// Properties of every tree (fast-check): invariance under row permutation, single linkage = MST
// (Kruskal computed here independently), cuts give exactly k segments numbered by smallest row,
// and height cuts agree with the cophenetic dissimilarity.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { agglomerate, LINKAGE_METHODS } from '../../../src/methods/hierarchy';
import { createRandom } from '../../../src/random';
import { toMatrix } from '../../../src/core/matrix';
import { canonical } from './helpers';

/** Continuous normal data (ties have probability 0). */
function normalRows(seed: number, n: number, d: number): number[][] {
  const r = createRandom(seed);
  return Array.from({ length: n }, () => Array.from({ length: d }, () => r.normal()));
}

/** Small integers: plenty of tied distances. */
function tiedRows(seed: number, n: number, d: number): number[][] {
  const r = createRandom(seed);
  return Array.from({ length: n }, () => Array.from({ length: d }, () => r.int(4)));
}

/**
 * Small integer rows can by chance form a symmetric array with a zero diagonal, which agglomerate
 * refuses as a probable distance matrix; a Matrix says plainly that these are measurements.
 */
function asMeasurements(rows: number[][]) {
  return toMatrix(rows);
}

function euclid(a: number[], b: number[]): number {
  let s = 0;
  for (let t = 0; t < a.length; t++) s += (a[t] - b[t]) ** 2;
  return Math.sqrt(s);
}

function kruskalWeights(rows: number[][]): number[] {
  const n = rows.length;
  const edges: [number, number, number][] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) edges.push([euclid(rows[i], rows[j]), i, j]);
  edges.sort((a, b) => a[0] - b[0]);
  const parent = Array.from({ length: n }, (_, i) => i);
  const find = (x: number): number => (parent[x] === x ? x : (parent[x] = find(parent[x])));
  const out: number[] = [];
  for (const [w, i, j] of edges) {
    const a = find(i);
    const b = find(j);
    if (a !== b) {
      parent[a] = b;
      out.push(w);
    }
  }
  return out;
}

const sortedHeights = (rows: number[][], method: (typeof LINKAGE_METHODS)[number]) =>
  agglomerate(rows, { method })
    .merges.map((m) => m.height)
    .sort((a, b) => a - b);

// Generous per-test timeout: each property takes well under a second alone, but cores are shared.
const PROPERTY_TIMEOUT_MS = 30_000;

const shape = fc.record({ seed: fc.integer({ min: 0, max: 1e6 }), n: fc.integer({ min: 2, max: 25 }), d: fc.integer({ min: 1, max: 4 }) });

describe('hierarchy properties', () => {
  it(
    'permuting the rows leaves the multiset of heights unchanged (data without ties), every method',
    () => {
      fc.assert(
        fc.property(shape, fc.integer({ min: 0, max: 1e6 }), ({ seed, n, d }, shuffleSeed) => {
          const rows = normalRows(seed, n, d);
          const permuted = createRandom(shuffleSeed).shuffle(rows.slice());
          for (const method of LINKAGE_METHODS) {
            const a = sortedHeights(rows, method);
            const b = sortedHeights(permuted, method);
            a.forEach((h, i) => expect(Math.abs(h - b[i])).toBeLessThanOrEqual(1e-9 * Math.max(1, h)));
          }
        }),
        { numRuns: 60 },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );

  it(
    'single-linkage heights equal the minimum spanning tree edge weights (Kruskal), with and without ties',
    () => {
      fc.assert(
        fc.property(shape, fc.boolean(), ({ seed, n, d }, ties) => {
          const rows = ties ? tiedRows(seed, n, d) : normalRows(seed, n, d);
          const expected = kruskalWeights(rows);
          const actual = sortedHeights(rows, 'single');
          actual.forEach((h, i) => expect(h).toBeCloseTo(expected[i], 12));
        }),
        { numRuns: 80 },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );

  it(
    'cut({ k }) gives exactly k segments for every k up to the distinct rows, numbered by smallest row, never splitting identical rows',
    () => {
      fc.assert(
        fc.property(shape, fc.constantFrom(...LINKAGE_METHODS), ({ seed, n, d }, method) => {
          const rows = tiedRows(seed, n, d);
          const tree = agglomerate(asMeasurements(rows), { method });
          const distinct = new Set(rows.map((r) => r.join(','))).size;
          for (let k = 1; k <= n; k++) {
            if (k > distinct) {
              // Issue 14: identical rows are never split across segments; such a k is refused.
              expect(() => tree.cut({ k })).toThrow(`at most ${distinct}`);
              continue;
            }
            const labels = tree.cut({ k });
            expect(new Set(labels).size).toBe(k);
            // Numbered by first appearance in row order: the canonical form is the labelling itself.
            expect(Array.from(labels)).toEqual(canonical(labels));
            for (let i = 0; i < n; i++)
              for (let j = i + 1; j < n; j++) if (rows[i].join() === rows[j].join()) expect(labels[i]).toBe(labels[j]);
          }
        }),
        { numRuns: 80 },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );

  it(
    'cut({ height }) joins two rows exactly when their cophenetic dissimilarity is at most the height (monotone trees)',
    () => {
      fc.assert(
        fc.property(shape, fc.constantFrom('single', 'complete', 'average', 'weighted', 'ward' as const), ({ seed, n, d }, method) => {
          const tree = agglomerate(normalRows(seed, n, d), { method });
          const coph = tree.cophenetic();
          for (const m of tree.merges) {
            for (const h of [m.height, m.height * (1 - 1e-9)]) {
              const labels = tree.cut({ height: h });
              for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) expect(labels[i] === labels[j]).toBe(coph.get(i, j) <= h);
            }
          }
        }),
        { numRuns: 30 },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );

  it(
    'merges: left < right, node n+i made by merge i, sizes add up, order is a permutation with each node contiguous',
    () => {
      fc.assert(
        fc.property(shape, fc.constantFrom(...LINKAGE_METHODS), ({ seed, n, d }, method) => {
          const tree = agglomerate(asMeasurements(tiedRows(seed, n, d)), { method });
          const size = (node: number) => (node < n ? 1 : tree.merges[node - n].size);
          const used = new Set<number>();
          tree.merges.forEach((m, i) => {
            expect(m.left).toBeLessThan(m.right);
            expect(m.right).toBeLessThan(n + i);
            expect(used.has(m.left) || used.has(m.right)).toBe(false);
            used.add(m.left);
            used.add(m.right);
            expect(m.size).toBe(size(m.left) + size(m.right));
          });
          expect([...tree.order].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
        }),
        { numRuns: 80 },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );
});
