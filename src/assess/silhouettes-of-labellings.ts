// Silhouettes of several segmentations of the same rows in one pass over the pairs of rows. The
// distance between two rows does not depend on the segmentation, so a k comparison that scores k
// = 2…10 on the same sampled rows computes each distance once and adds it into the sums of every
// segmentation, instead of streaming all pairs again for each k (the distances are most of the
// cost: 9 segmentations cost about twice one, not nine times; BENCH.md, k-sweep).
//
// Each segmentation's per-row, per-segment sums receive the same additions in the same order as
// in silhouette.ts (same tiles, same pair order), so every result equals silhouette(rows, labels)
// to the bit.
import { compactLabels, requireSegments, type AssignmentInput } from '../core/assignment';
import type { Matrix } from '../core/matrix';
import { silhouetteFromSums, type SilhouetteResult } from './silhouette';

// The tiles of silhouette.ts; the distances of one tile are kept (TILE_I × TILE_J doubles, 128 KB)
// while each segmentation adds them in.
const TILE_I = 64;
const TILE_J = 256;

/** Euclidean silhouette of each assignment in `labellings` (all of the rows of `m`), in order. */
export function silhouettesOfLabellings(m: Matrix, labellings: readonly AssignmentInput[], what: string): SilhouetteResult[] {
  const n = m.rows;
  const compact = labellings.map((labels) => {
    const c = compactLabels(labels, n, what);
    requireSegments(c.k, 2, what);
    return c;
  });
  const sums = compact.map((c) => new Float64Array(n * c.k));
  const tile = new Float64Array(TILE_I * TILE_J);
  for (let i0 = 0; i0 < n; i0 += TILE_I) {
    const i1 = Math.min(n, i0 + TILE_I);
    for (let j0 = i0; j0 < n; j0 += TILE_J) {
      const j1 = Math.min(n, j0 + TILE_J);
      distanceTile(m.data, m.cols, tile, i0, i1, j0, j1);
      for (let t = 0; t < compact.length; t++) addTile(tile, compact[t].labels, compact[t].k, sums[t], i0, i1, j0, j1);
    }
  }
  return compact.map((c, t) => silhouetteFromSums(sums[t], c.labels, c.sizes, c.original));
}

/** Euclidean distances of the pairs (i, j), i < j, of one tile, summed as in silhouette.ts. */
function distanceTile(x: Float64Array, d: number, tile: Float64Array, i0: number, i1: number, j0: number, j1: number): void {
  for (let i = i0; i < i1; i++) {
    const io = i * d;
    const at = (i - i0) * TILE_J - j0;
    const start = j0 > i ? j0 : i + 1;
    for (let j = start; j < j1; j++) {
      const jo = j * d;
      let s = 0;
      let c = 0;
      for (; c + 1 < d; c += 2) {
        const t0 = x[io + c] - x[jo + c];
        const t1 = x[io + c + 1] - x[jo + c + 1];
        s += t0 * t0 + t1 * t1;
      }
      if (c < d) {
        const t = x[io + c] - x[jo + c];
        s += t * t;
      }
      tile[at + j] = Math.sqrt(s);
    }
  }
}

/** One segmentation's sums take the distances of a tile, pair by pair in the order of silhouette.ts. */
function addTile(
  tile: Float64Array,
  labels: Int32Array,
  k: number,
  sums: Float64Array,
  i0: number,
  i1: number,
  j0: number,
  j1: number,
): void {
  for (let i = i0; i < i1; i++) {
    const li = labels[i];
    const rowI = i * k;
    const at = (i - i0) * TILE_J - j0;
    const start = j0 > i ? j0 : i + 1;
    for (let j = start; j < j1; j++) {
      const dist = tile[at + j];
      sums[rowI + labels[j]] += dist;
      sums[j * k + li] += dist;
    }
  }
}
