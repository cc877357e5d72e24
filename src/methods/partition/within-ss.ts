// The within-segment sum of squares of an assignment about given centres: per segment, summed
// block by block in row order and the block parts added in block order.
import { fourDistances, squaredDistance } from '../../measure/squared-distance';
import { forEachBlock, acrossBlocks, type KmeansMemory } from './kmeans-memory';

const quad = new Float64Array(4);

/** Within-SS of `mem.assignment` about `mem.centres`, summed segment by segment and then over segments. */
export function withinOn(mem: KmeansMemory, bySegment?: number[]): number {
  const { d, k, blocks } = mem.layout;
  forEachBlock(mem, (lo, hi, b) => withinParts(mem.rows, d, lo, hi, mem.assignment, mem.centres, mem.parts.subarray(b * k, (b + 1) * k)));
  let total = 0;
  for (let c = 0; c < k; c++) {
    const part = acrossBlocks(mem.parts, blocks, k, c);
    if (bySegment) bySegment[c] = part;
    total += part;
  }
  return total;
}

/** Within-SS of rows [lo, hi) per segment, into `parts` (cleared first). */
function withinParts(
  rows: Float64Array,
  d: number,
  lo: number,
  hi: number,
  assignment: Int32Array,
  centres: Float64Array,
  parts: Float64Array,
): void {
  parts.fill(0);
  let i = lo;
  // Four rows at a time (fourDistances); added to the parts in row order.
  for (; i + 3 < hi; i += 4) {
    const b0 = i * d;
    const a0 = assignment[i];
    const a1 = assignment[i + 1];
    const a2 = assignment[i + 2];
    const a3 = assignment[i + 3];
    fourDistances(rows, b0, b0 + d, b0 + 2 * d, b0 + 3 * d, centres, a0 * d, a1 * d, a2 * d, a3 * d, d, quad);
    parts[a0] += quad[0];
    parts[a1] += quad[1];
    parts[a2] += quad[2];
    parts[a3] += quad[3];
  }
  for (; i < hi; i++) {
    const a = assignment[i];
    parts[a] += squaredDistance(rows, i * d, centres, a * d, d);
  }
}
