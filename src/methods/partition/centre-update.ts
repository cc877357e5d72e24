// The centre update of k-means: segment sums and counts (kept per block), each centre the mean
// of its rows, and the repair of a segment that has gone empty.
import { squaredDistance } from '../../measure/squared-distance';
import { acrossBlocks, blockOf, forEachBlock, type KmeansMemory } from './kmeans-memory';

/** Centres to the means of their rows, sums from scratch (an empty segment is repaired first). */
export function centresToMeans(mem: KmeansMemory): void {
  sumsFromScratch(mem);
  repairEmpty(mem);
  centresFromSums(mem);
}

/** Every block's segment sums and counts from scratch: as WebAssembly where the memory has it. */
export function sumsFromScratch(mem: KmeansMemory): void {
  forEachBlock(mem, (lo, hi, b) => blockSums(mem, lo, hi, b));
}

/** Segment sums and counts of block b from scratch (kernels/segment-sums.wat, or the JavaScript loop). */
export function blockSums(mem: KmeansMemory, lo: number, hi: number, b: number): void {
  const { d, k, at } = mem.layout;
  const sums = mem.sums.subarray(b * k * d, (b + 1) * k * d);
  const counts = mem.counts.subarray(b * k, (b + 1) * k);
  sums.fill(0);
  counts.fill(0);
  if (mem.segmentSums) {
    mem.segmentSums(
      at.rows + lo * d * 8,
      at.assignment + lo * 4,
      at.sums + b * k * d * 8,
      at.counts + b * k * 8,
      hi - lo,
      d * 8,
      16 * (d >> 1),
    );
    return;
  }
  const { rows, assignment } = mem;
  for (let i = lo; i < hi; i++) {
    const a = assignment[i];
    counts[a]++;
    const ib = i * d;
    const sb = a * d;
    for (let j = 0; j < d; j++) sums[sb + j] += rows[ib + j];
  }
}

/**
 * Centres to the means of their rows from the blocks' sums and counts (added in block order).
 * With `moved`, also how far each centre moved from `mem.previous`; returns the summed squared move.
 */
export function centresFromSums(mem: KmeansMemory, moved?: Float64Array): number {
  const { d, k, blocks } = mem.layout;
  const { sums, counts, centres, previous } = mem;
  let shift = 0;
  for (let c = 0; c < k; c++) {
    const inv = 1 / acrossBlocks(counts, blocks, k, c);
    const cb = c * d;
    let s = 0;
    for (let j = 0; j < d; j++) {
      const v = acrossBlocks(sums, blocks, k * d, cb + j) * inv;
      const diff = v - previous[cb + j];
      s += diff * diff;
      centres[cb + j] = v;
    }
    if (moved) moved[c] = Math.sqrt(s);
    shift += s;
  }
  return shift;
}

/** Rows per segment over all blocks. */
export function segmentSizes(mem: KmeansMemory): number[] {
  const { k, blocks } = mem.layout;
  return Array.from({ length: k }, (_, c) => acrossBlocks(mem.counts, blocks, k, c));
}

/**
 * Give every empty segment one row, deterministically: rows are taken by decreasing distance to
 * their current centre (ties: lower row first), skipping rows whose segment would go empty in
 * turn; the empty centre then sits on that row. The moved row's bounds are reset so it is
 * looked at again. Rare; keeps the blocks' sums and counts in step. (scikit-learn's
 * `_relocate_empty_clusters` also takes the farthest rows; the skipping rule is ours.)
 */
export function repairEmpty(mem: KmeansMemory): number {
  const { n, d, k, blocks } = mem.layout;
  const sizes = segmentSizes(mem);
  let empty = 0;
  for (let c = 0; c < k; c++) if (sizes[c] === 0) empty++;
  if (empty === 0) return 0;
  const { rows, centres, assignment, sums, counts, upper, lower } = mem;
  const rowDistance = new Float64Array(n);
  for (let i = 0; i < n; i++) rowDistance[i] = squaredDistance(rows, i * d, centres, assignment[i] * d, d);
  const sorted = Array.from({ length: n }, (_, i) => i).sort((a, b) => rowDistance[b] - rowDistance[a] || a - b);
  let next = 0;
  for (let c = 0; c < k; c++) {
    if (sizes[c] !== 0) continue;
    while (next < n && sizes[assignment[sorted[next]]] <= 1) next++;
    if (next >= n) break; // cannot happen when k ≤ distinct rows, which the caller checks
    const i = sorted[next++];
    const from = assignment[i];
    const own = blockOf(mem.layout, i);
    const ib = i * d;
    for (let b = 0; b < blocks; b++) {
      // The empty segment's sums restart from this one row (clearing any rounding residue).
      const cb = (b * k + c) * d;
      for (let j = 0; j < d; j++) sums[cb + j] = b === own ? rows[ib + j] : 0;
    }
    const fb = (own * k + from) * d;
    for (let j = 0; j < d; j++) {
      sums[fb + j] -= rows[ib + j];
      centres[c * d + j] = rows[ib + j];
    }
    counts[own * k + from]--;
    counts[own * k + c] = 1;
    sizes[from]--;
    sizes[c] = 1;
    assignment[i] = c;
    // Plain memory for the exact finish has no bound arrays.
    if (upper.length > 0) {
      upper[i] = Infinity;
      lower[i] = 0;
    }
  }
  return empty;
}
