// The nearest-neighbour chain of nn-chain-matrix.ts on a full symmetric n × n array. Twice the
// memory of the condensed layout, but every scan reads one contiguous row: on the condensed
// layout half of each scan strides through memory (one page per value), which dominated the
// time. Same chain, tie and naming rules and the same Lance–Williams arithmetic, so the merges
// are identical to the condensed version's.
import type { RawMerges } from './merges';
import { nnChain } from './nn-chain';
import { MergeTick } from './ticker';
import { lanceWilliams, ReducibleMethod } from './nn-chain-matrix';
import { condensedRowStarts } from './condensed-rows';

/** Largest full matrix used before falling back to the condensed layout (bytes). */
export const FULL_MATRIX_LIMIT_BYTES = 1024 ** 3;

/** Tile edge for the expansion: a tile's mirrored writes stay in cache instead of striding pages. */
const TILE = 64;

/** Expand a condensed array to a full symmetric one (zero diagonal), squaring values when asked. Tests use it to check the layouts agree. */
export function expandCondensed(n: number, condensed: Float64Array, square: boolean): Float64Array {
  const full = new Float64Array(n * n);
  const starts = condensedRowStarts(n);
  for (let i0 = 0; i0 < n; i0 += TILE) {
    const i1 = Math.min(n, i0 + TILE);
    for (let j0 = i0; j0 < n; j0 += TILE) {
      const j1 = Math.min(n, j0 + TILE);
      for (let i = i0; i < i1; i++) {
        const from = starts[i];
        for (let j = j0 > i ? j0 : i + 1; j < j1; j++) {
          const c = condensed[from + j];
          const v = square ? c * c : c;
          full[i * n + j] = v;
          full[j * n + i] = v;
        }
      }
    }
  }
  return full;
}

/**
 * Euclidean distances of all pairs of rows straight into a full symmetric array, over tiles so
 * the mirrored writes stay in cache. Sums squared differences in column order and takes the
 * root, exactly as \`dissimilarity\` does, so both routes see bit-identical values.
 */
export function fullEuclidean(n: number, dims: number, data: Float64Array): Float64Array {
  const full = new Float64Array(n * n);
  for (let i0 = 0; i0 < n; i0 += TILE) {
    const i1 = Math.min(n, i0 + TILE);
    for (let j0 = i0; j0 < n; j0 += TILE) {
      const j1 = Math.min(n, j0 + TILE);
      for (let i = i0; i < i1; i++) {
        const io = i * dims;
        for (let j = j0 > i ? j0 : i + 1; j < j1; j++) {
          const jo = j * dims;
          let s = 0;
          for (let t = 0; t < dims; t++) {
            const diff = data[io + t] - data[jo + t];
            s += diff * diff;
          }
          const v = Math.sqrt(s);
          full[i * n + j] = v;
          full[j * n + i] = v;
        }
      }
    }
  }
  return full;
}

/** `full` is overwritten. For ward it must hold SQUARED distances. */
export function nnChainOnFull(n: number, full: Float64Array, method: ReducibleMethod, tick?: MergeTick): RawMerges {
  return nnChain(
    n,
    {
      nearest({ active, count }, x, predecessor, found) {
        const row = x * n;
        let candidate = predecessor;
        let current = predecessor < 0 ? Infinity : full[row + predecessor];
        for (let p = 0; p < count; p++) {
          const i = active[p];
          if (i === x) continue;
          const d = full[row + i];
          if (d < current) {
            current = d;
            candidate = i;
          }
        }
        found.value = current;
        return candidate;
      },
      merge({ active, count, size }, x, y, value) {
        const nx = size[x];
        const ny = size[y];
        const rx = x * n;
        const ry = y * n;
        for (let p = 0; p < count; p++) {
          const i = active[p];
          if (i === x || i === y) continue;
          const updated = lanceWilliams(method, full[rx + i], full[ry + i], nx, ny, size[i], value);
          full[ry + i] = updated;
          full[i * n + y] = updated;
        }
        return method === 'ward' ? Math.sqrt(value) : value;
      },
    },
    tick,
  );
}
