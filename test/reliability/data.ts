// Data of our own making for the reliability suite: seeded groups of rows without ties.
import { createRandom } from '../../src/random';

/** n rows in d columns around `groups` centres, values with many decimals (no tied distances). */
export function groupedRows(n: number, d: number, groups: number, seed: number): number[][] {
  const rnd = createRandom(seed);
  const centres = Array.from({ length: groups }, () => Array.from({ length: d }, () => rnd.uniform(-10, 10)));
  return Array.from({ length: n }, (_, i) => centres[i % groups].map((c) => c + rnd.normal()));
}

/** A seeded permutation of 0..n-1. */
export function permutation(n: number, seed: number): number[] {
  const p = Array.from({ length: n }, (_, i) => i);
  createRandom(seed).shuffle(p);
  return p;
}
