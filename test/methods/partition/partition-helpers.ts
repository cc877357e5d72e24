// Helpers for the partition tests: comparing partitions up to relabelling, reading fixtures.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

export function readFixture<T = any>(name: string): T {
  return JSON.parse(readFileSync(join(__dirname, '../../reference/fixtures', name), 'utf8')) as T;
}

/** True when two labelings define the same partition (a one-to-one relabelling maps one to the other). */
export function samePartition(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  const forward = new Map<number, number>();
  const backward = new Map<number, number>();
  for (let i = 0; i < a.length; i++) {
    const f = forward.get(a[i]);
    const g = backward.get(b[i]);
    if (f === undefined && g === undefined) {
      forward.set(a[i], b[i]);
      backward.set(b[i], a[i]);
    } else if (f !== b[i] || g !== a[i]) {
      return false;
    }
  }
  return true;
}

export function squaredDistance(a: readonly number[], b: readonly number[]): number {
  let s = 0;
  for (let j = 0; j < a.length; j++) s += (a[j] - b[j]) ** 2;
  return s;
}

/** Gaussian blobs of our own making, from a tiny seeded generator independent of the package. */
export function blobs(n: number, d: number, centres: number, seed: number, spread = 1): number[][] {
  let s = seed >>> 0;
  const uniform = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
  const means = Array.from({ length: centres }, () => Array.from({ length: d }, () => uniform() * 20 - 10));
  return Array.from({ length: n }, (_, i) => {
    const m = means[i % centres];
    return m.map((v) => v + spread * Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform()));
  });
}
