// Shared helpers for the hierarchy tests: fixtures, partitions up to relabelling, leaf sets.
import { readFileSync } from 'fs';
import { join } from 'path';
import type { Tree } from '../../../src/methods/hierarchy';

export function readFixture<T = any>(name: string): T {
  return JSON.parse(readFileSync(join(__dirname, '..', '..', 'reference', 'fixtures', name), 'utf8')) as T;
}

/** Relabel by first appearance, so two partitions compare equal exactly when they are the same up to names. */
export function canonical(labels: ArrayLike<number>): number[] {
  const seen = new Map<number, number>();
  return Array.from(labels, (v) => {
    let c = seen.get(v);
    if (c === undefined) {
      c = seen.size;
      seen.set(v, c);
    }
    return c;
  });
}

/** Each merge as "height|sorted leaves", sorted: comparable when left/right and order are ambiguous. */
export function leafSetsOf(merges: readonly { left: number; right: number; height: number }[], n: number, digits = 9): string[] {
  const members: number[][] = [];
  const leavesOf = (node: number) => (node < n ? [node] : members[node - n]);
  const out: string[] = [];
  merges.forEach((m, i) => {
    members[i] = [...leavesOf(m.left), ...leavesOf(m.right)].sort((a, b) => a - b);
    out.push(`${m.height.toPrecision(digits)}|${members[i].join(',')}`);
  });
  return out.sort();
}

export function mergesFromPairs(pairs: number[][], heights: number[]) {
  return pairs.map(([left, right], i) => ({ left, right, height: heights[i] }));
}

export function heightsOf(tree: Tree): number[] {
  return tree.merges.map((m) => m.height);
}

export function expectClose(actual: readonly number[], expected: readonly number[], relative: number): void {
  if (actual.length !== expected.length) throw new Error(`length ${actual.length} ≠ ${expected.length}`);
  for (let i = 0; i < actual.length; i++) {
    const tol = relative * Math.max(1, Math.abs(expected[i]));
    if (!(Math.abs(actual[i] - expected[i]) <= tol)) {
      throw new Error(`entry ${i}: ${actual[i]} vs expected ${expected[i]} (tolerance ${tol})`);
    }
  }
}
