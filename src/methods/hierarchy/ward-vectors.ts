// Ward's method straight from the rows (Müllner 2011, NN_chain_linkage_vector): clusters keep a
// centroid and a size, and the Ward dissimilarity between clusters A and B is
//   sqrt(2·|A||B| / (|A|+|B|)) · ‖cA − cB‖
// (the scale SciPy reports). No n × n array: memory O(n·d). Same chain and tie rules as the
// matrix version (predecessor kept on ties, otherwise the smallest index; x < y keeps name y).
import { RawMerges, createRawMerges } from './merges';
import { MergeTick } from './ticker';

/** Relative slack for abandoning a candidate on a partial sum (far above rounding error). */
const ABANDON_MARGIN = 1 + 1e-9;

/** `centroids` (n × dims, row-major) is overwritten. */
export function wardFromVectors(n: number, dims: number, centroids: Float64Array, tick?: MergeTick): RawMerges {
  const raw = createRawMerges(n);
  const size = new Float64Array(n).fill(1);
  const active = new Int32Array(n);
  for (let i = 0; i < n; i++) active[i] = i;
  let count = n;
  const chain = new Int32Array(n);
  let chainLength = 0;
  const half = dims >> 1;

  // Half the squared Ward dissimilarity: |A||B|/(|A|+|B|) · ‖cA − cB‖².
  const ward = (x: number, i: number): number => {
    const xo = x * dims;
    const io = i * dims;
    let s = 0;
    for (let t = 0; t < dims; t++) {
      const diff = centroids[xo + t] - centroids[io + t];
      s += diff * diff;
    }
    const nx = size[x];
    const ni = size[i];
    return ((nx * ni) / (nx + ni)) * s;
  };

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
        current = ward(x, candidate);
      } else {
        current = Infinity;
      }
      const xo = x * dims;
      const nx = size[x];
      for (let p = 0; p < count; p++) {
        const i = active[p];
        if (i === x) continue;
        const io = i * dims;
        const ni = size[i];
        // Early abandon: after half the coordinates the partial sum already rules most
        // candidates out. The margin keeps rounding from dropping an exact tie; the decision
        // itself uses the same formula as \`ward\`, so equal values compare equal.
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
    raw.height[k] = Math.sqrt(2 * current);
    const nx = size[x];
    const ny = size[y];
    const xo = x * dims;
    const yo = y * dims;
    for (let t = 0; t < dims; t++) centroids[yo + t] = (nx * centroids[xo + t] + ny * centroids[yo + t]) / (nx + ny);
    size[y] = nx + ny;
    size[x] = 0;
    let q = 0;
    while (active[q] !== x) q++;
    active.copyWithin(q, q + 1, count);
    count--;
    if (tick) tick(k + 1);
  }
  return raw;
}
