// Ward's method straight from the rows (Müllner 2011, NN_chain_linkage_vector): clusters keep a
// centroid and a size, and the Ward dissimilarity between clusters A and B is
//   sqrt(2·|A||B| / (|A|+|B|)) · ‖cA − cB‖
// (the scale SciPy reports). No n × n array: memory O(n·d). Same chain and tie rules as the
// matrix version (nn-chain.ts).
import type { RawMerges } from './merges';
import { nnChain } from './nn-chain';
import { MergeTick } from './ticker';

/** Relative slack for abandoning a candidate on a partial sum (far above rounding error). */
const ABANDON_MARGIN = 1 + 1e-9;

/** `centroids` (n × dims, row-major) is overwritten. */
export function wardFromVectors(n: number, dims: number, centroids: Float64Array, tick?: MergeTick): RawMerges {
  const half = dims >> 1;
  return nnChain(
    n,
    {
      nearest({ active, count, size }, x, predecessor, found) {
        const xo = x * dims;
        const nx = size[x];
        let candidate = predecessor;
        let current = predecessor < 0 ? Infinity : halfWard(x, predecessor, nx, size[predecessor]);
        for (let p = 0; p < count; p++) {
          const i = active[p];
          if (i === x) continue;
          const io = i * dims;
          const ni = size[i];
          // Early abandon: after half the coordinates the partial sum already rules most
          // candidates out. The margin keeps rounding from dropping an exact tie; the decision
          // itself uses the same formula as `halfWard`, so equal values compare equal.
          let s = 0;
          let t = 0;
          for (; t < half; t++) {
            const diff = centroids[xo + t] - centroids[io + t];
            s += diff * diff;
          }
          if (s * nx * ni > current * (nx + ni) * ABANDON_MARGIN) continue;
          for (; t < dims; t++) {
            const diff = centroids[xo + t] - centroids[io + t];
            s += diff * diff;
          }
          const d = ((nx * ni) / (nx + ni)) * s;
          if (d < current) {
            current = d;
            candidate = i;
          }
        }
        found.value = current;
        return candidate;
      },
      merge({ size }, x, y, value) {
        const nx = size[x];
        const ny = size[y];
        const xo = x * dims;
        const yo = y * dims;
        for (let t = 0; t < dims; t++) centroids[yo + t] = (nx * centroids[xo + t] + ny * centroids[yo + t]) / (nx + ny);
        return Math.sqrt(2 * value);
      },
    },
    tick,
  );

  // Half the squared Ward dissimilarity: |A||B|/(|A|+|B|) · ‖cA − cB‖².
  function halfWard(x: number, i: number, nx: number, ni: number): number {
    const xo = x * dims;
    const io = i * dims;
    let s = 0;
    for (let t = 0; t < dims; t++) {
      const diff = centroids[xo + t] - centroids[io + t];
      s += diff * diff;
    }
    return ((nx * ni) / (nx + ni)) * s;
  }
}
