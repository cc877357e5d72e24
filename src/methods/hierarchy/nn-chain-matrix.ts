// Nearest-neighbour chain on a condensed matrix (Müllner 2011, Fig. 4) for the reducible
// linkages, with Lance & Williams (1967) updates in place. Ward runs on squared distances
// (its update is exact there and needs no square roots); heights are returned on the distance
// scale. Chain, tie and naming rules: nn-chain.ts.
import type { RawMerges } from './merges';
import { nnChain } from './nn-chain';
import { MergeTick } from './ticker';
import { condensedRowStarts } from './condensed-rows';

export type ReducibleMethod = 'complete' | 'average' | 'weighted' | 'ward';

/** `work` is overwritten (pass a copy). For ward it must hold SQUARED distances. */
export function nnChainOnMatrix(n: number, work: Float64Array, method: ReducibleMethod, tick?: MergeTick): RawMerges {
  const starts = condensedRowStarts(n);
  return nnChain(
    n,
    {
      nearest({ active, count }, x, predecessor, found) {
        let candidate = predecessor;
        let current = predecessor < 0 ? Infinity : predecessor < x ? work[starts[predecessor] + x] : work[starts[x] + predecessor];
        // Rows before x are read down column x; rows after it along row x.
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
        found.value = current;
        return candidate;
      },
      merge({ active, count, size }, x, y, value) {
        updateRow(method, work, starts, active, count, x, y, value, size[x], size[y], size);
        return method === 'ward' ? Math.sqrt(value) : value;
      },
    },
    tick,
  );
}

/** New dissimilarities between the merged cluster (named y) and every other. */
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
  for (let p = 0; p < count; p++) {
    if (p === px || p === py) continue;
    const i = active[p];
    const ix = p < px ? starts[i] + x : sx + i;
    const iy = p < py ? starts[i] + y : sy + i;
    work[iy] = lanceWilliams(method, work[ix], work[iy], nx, ny, size[i], dxy);
  }
}

/**
 * The Lance–Williams update for one other cluster i: its new dissimilarity to the union of x and
 * y (sizes nx, ny; ni for i; dxy between x and y). The same arithmetic as SciPy's updates, so
 * tied values stay tied the same way.
 */
export function lanceWilliams(method: ReducibleMethod, dxi: number, dyi: number, nx: number, ny: number, ni: number, dxy: number): number {
  if (method === 'complete') return dxi > dyi ? dxi : dyi;
  if (method === 'average') return (nx * dxi + ny * dyi) / (nx + ny);
  if (method === 'weighted') return 0.5 * (dxi + dyi);
  return ((nx + ni) * dxi + (ny + ni) * dyi - ni * dxy) / (nx + ny + ni);
}
