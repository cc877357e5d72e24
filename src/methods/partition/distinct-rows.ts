// Counting distinct rows, so k-means and k-medoids can refuse a k that no partition can fill.
// Rows are hashed by the bits of their values; the count stops as soon as `enough` are found,
// so the usual case (plenty of distinct rows) costs only a few rows' work.
import type { Matrix } from '../../core/matrix';

/** Number of distinct rows, counted up to `enough` (the count never exceeds it). */
export function countDistinctRows(m: Matrix, enough: number): number {
  const { rows, cols, data } = m;
  const bits = new Float64Array(1);
  const words = new Uint32Array(bits.buffer);
  const buckets = new Map<number, number[]>();
  let distinct = 0;
  for (let i = 0; i < rows && distinct < enough; i++) {
    const base = i * cols;
    let h = 0x811c9dc5;
    for (let j = 0; j < cols; j++) {
      // +0 folds -0 into 0: they are the same value.
      bits[0] = data[base + j] + 0;
      h = Math.imul(h ^ words[0], 0x01000193);
      h = Math.imul(h ^ words[1], 0x01000193);
    }
    const bucket = buckets.get(h);
    if (bucket === undefined) {
      buckets.set(h, [i]);
      distinct++;
      continue;
    }
    let seen = false;
    for (const other of bucket) {
      if (sameRow(data, base, other * cols, cols)) {
        seen = true;
        break;
      }
    }
    if (!seen) {
      bucket.push(i);
      distinct++;
    }
  }
  return distinct;
}

function sameRow(data: Float64Array, a: number, b: number, cols: number): boolean {
  for (let j = 0; j < cols; j++) if (data[a + j] !== data[b + j]) return false;
  return true;
}
