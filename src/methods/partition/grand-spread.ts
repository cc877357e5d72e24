// The grand mean of the rows and the total sum of squares about it (k-means reports it, and
// scales its tolerance by it). Summed block by block, the block totals added in block order.
import { distancesToPoint } from '../../measure/squared-distance';
import { acrossBlocks, forEachBlock, type KmeansMemory } from './kmeans-memory';

export interface GrandSpread {
  grand: Float64Array;
  totalSS: number;
}

export function grandSpread(mem: KmeansMemory): GrandSpread {
  const { n, d, blocks } = mem.layout;
  const { rows, closest, blockValue } = mem;
  forEachBlock(mem, (lo, hi, b) => columnSums(rows, d, lo, hi, mem.grand.subarray(b * d, (b + 1) * d)));
  const grand = new Float64Array(d);
  for (let j = 0; j < d; j++) grand[j] = acrossBlocks(mem.grand, blocks, d, j) / n;
  mem.grand.set(grand);
  forEachBlock(mem, (lo, hi, b) => {
    // `closest` is free scratch before seeding.
    distancesToPoint(rows, d, lo, hi, grand, 0, closest);
    let total = 0;
    for (let i = lo; i < hi; i++) total += closest[i];
    blockValue[b] = total;
  });
  return { grand, totalSS: acrossBlocks(blockValue, blocks, 1, 0) };
}

function columnSums(rows: Float64Array, d: number, lo: number, hi: number, out: Float64Array): void {
  out.fill(0);
  for (let i = lo; i < hi; i++) for (let j = 0; j < d; j++) out[j] += rows[i * d + j];
}
