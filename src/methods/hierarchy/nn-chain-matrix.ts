// Nearest-neighbour chain on a condensed matrix (Müllner 2011, Fig. 4) for the reducible
// linkages, with Lance & Williams (1967) updates in place. Ward runs on squared distances
// (its update is exact there and needs no square roots); heights are returned on the distance
// scale. Ties: a chain never leaves its predecessor for an equal candidate (that is what
// guarantees termination); otherwise the active cluster with the smallest index wins. Merging
// clusters x < y keeps the name y.
import { RawMerges, createRawMerges } from './merges';
import { MergeTick } from './ticker';
import { condensedRowStarts } from './condensed-rows';

export type ReducibleMethod = 'complete' | 'average' | 'weighted' | 'ward';

/** `work` is overwritten (pass a copy). For ward it must hold SQUARED distances. */
export function nnChainOnMatrix(n: number, work: Float64Array, method: ReducibleMethod, tick?: MergeTick): RawMerges {
  const raw = createRawMerges(n);
  const starts = condensedRowStarts(n);
  const size = new Float64Array(n).fill(1);
  // Active clusters in increasing order; removal shifts the tail (O(n) per merge, cheap).
  const active = new Int32Array(n);
  for (let i = 0; i < n; i++) active[i] = i;
  let count = n;
  const chain = new Int32Array(n);
  let chainLength = 0;

  for (let k = 0; k < n - 1; k++) {
    if (chainLength === 0) chain[chainLength++] = active[0];
    let x = 0;
    let y = 0;
    let current = 0;
    for (;;) {
      x = chain[chainLength - 1];
      let candidate = -1;
      if (chainLength > 1) {
        candidate = chain[chainLength - 2];
        current = candidate < x ? work[starts[candidate] + x] : work[starts[x] + candidate];
      } else {
        current = Infinity;
      }
      let p = 0;
      const sx = starts[x];
      for (; p < count; p++) {
        const i = active[p];
        if (i >= x) break;
        const d = work[starts[i] + x];
        if (d < current) {
          current = d;
          candidate = i;
        }
      }
      if (p < count && active[p] === x) p++;
      for (; p < count; p++) {
        const i = active[p];
        const d = work[sx + i];
        if (d < current) {
          current = d;
          candidate = i;
        }
      }
      y = candidate;
      if (chainLength > 1 && y === chain[chainLength - 2]) break;
      chain[chainLength++] = y;
    }
    chainLength -= 2;
    if (x > y) {
      const t = x;
      x = y;
      y = t;
    }
    raw.a[k] = x;
    raw.b[k] = y;
    raw.height[k] = method === 'ward' ? Math.sqrt(current) : current;
    updateRow(method, work, starts, active, count, x, y, current, size[x], size[y], size);
    size[y] += size[x];
    size[x] = 0;
    // Drop x from the active list.
    let q = 0;
    while (active[q] !== x) q++;
    active.copyWithin(q, q + 1, count);
    count--;
    if (tick) tick(k + 1);
  }
  return raw;
}

/**
 * Lance–Williams: new dissimilarities between the merged cluster (named y) and every other.
 * The same arithmetic as SciPy's updates, so tied values stay tied the same way.
 */
function updateRow(
  method: ReducibleMethod,
  work: Float64Array,
  starts: Float64Array,
  active: Int32Array,
  count: number,
  x: number,
  y: number,
  dxy: number,
  nx: number,
  ny: number,
  size: Float64Array,
): void {
  const sx = starts[x];
  const sy = starts[y];
  // Positions of x and y in the sorted active list.
  let px = 0;
  while (active[px] !== x) px++;
  let py = px + 1;
  while (active[py] !== y) py++;
  const total = nx + ny;
  for (let p = 0; p < count; p++) {
    if (p === px || p === py) continue;
    const i = active[p];
    const ix = p < px ? starts[i] + x : sx + i;
    const iy = p < py ? starts[i] + y : sy + i;
    const dxi = work[ix];
    const dyi = work[iy];
    if (method === 'complete') work[iy] = dxi > dyi ? dxi : dyi;
    else if (method === 'average') work[iy] = (nx * dxi + ny * dyi) / total;
    else if (method === 'weighted') work[iy] = 0.5 * (dxi + dyi);
    else {
      const ni = size[i];
      work[iy] = ((nx + ni) * dxi + (ny + ni) * dyi - ni * dxy) / (nx + ny + ni);
    }
  }
}
