// Single linkage through a minimum spanning tree (Prim's algorithm, as Müllner 2011 recommends):
// O(n²) time, and from rows O(n) extra memory since distances are computed as they are needed.
// Ties: among equal candidate distances the remaining row with the smallest index is taken.
import { RawMerges, createRawMerges } from './merges';
import { MergeTick } from './ticker';
import { condensedRowStarts } from './condensed-rows';

/** Prim over a condensed dissimilarity. Heights are the MST edge weights. */
export function singleFromCondensed(n: number, condensed: Float64Array, tick?: MergeTick): RawMerges {
  const starts = condensedRowStarts(n);
  return prim(
    n,
    (x, remaining, count, best, from) => {
      for (let p = 0; p < count; p++) {
        const i = remaining[p];
        const d = i < x ? condensed[starts[i] + x] : condensed[starts[x] + i];
        if (d < best[i]) {
          best[i] = d;
          from[i] = x;
        }
      }
    },
    false,
    tick,
  );
}

/** Prim on rows with Euclidean distances computed on the fly (compared squared). */
export function singleFromRowsEuclidean(n: number, dims: number, data: Float64Array, tick?: MergeTick): RawMerges {
  return prim(
    n,
    (x, remaining, count, best, from) => {
      const xo = x * dims;
      for (let p = 0; p < count; p++) {
        const i = remaining[p];
        const io = i * dims;
        let s = 0;
        for (let t = 0; t < dims; t++) {
          const diff = data[xo + t] - data[io + t];
          s += diff * diff;
        }
        if (s < best[i]) {
          best[i] = s;
          from[i] = x;
        }
      }
    },
    true,
    tick,
  );
}

/** Prim on rows with any pair function (other metrics). */
export function singleFromPairs(n: number, pair: (i: number, j: number) => number, tick?: MergeTick): RawMerges {
  return prim(
    n,
    (x, remaining, count, best, from) => {
      for (let p = 0; p < count; p++) {
        const i = remaining[p];
        const d = pair(x, i);
        if (d < best[i]) {
          best[i] = d;
          from[i] = x;
        }
      }
    },
    false,
    tick,
  );
}

type Relax = (x: number, remaining: Int32Array, count: number, best: Float64Array, from: Int32Array) => void;

function prim(n: number, relax: Relax, squared: boolean, tick: MergeTick | undefined): RawMerges {
  const raw = createRawMerges(n);
  const best = new Float64Array(n).fill(Infinity);
  const from = new Int32Array(n);
  // Rows not yet in the tree, kept in increasing order so ties go to the smallest index.
  const remaining = new Int32Array(n - 1);
  for (let i = 1; i < n; i++) remaining[i - 1] = i;
  let count = n - 1;
  let x = 0;
  for (let k = 0; k < n - 1; k++) {
    relax(x, remaining, count, best, from);
    let position = 0;
    let min = Infinity;
    for (let p = 0; p < count; p++) {
      const b = best[remaining[p]];
      if (b < min) {
        min = b;
        position = p;
      }
    }
    const y = remaining[position];
    remaining.copyWithin(position, position + 1, count);
    count--;
    raw.a[k] = from[y];
    raw.b[k] = y;
    raw.height[k] = squared ? Math.sqrt(min) : min;
    x = y;
    if (tick) tick(k + 1);
  }
  return raw;
}
