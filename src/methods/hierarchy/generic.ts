// Müllner's (2011, Fig. 3) generic algorithm for the linkages that are not reducible (centroid,
// median): a priority queue of lower bounds on each cluster's distance to its nearest neighbour
// among the clusters with larger names, refreshed lazily. It works over any "space" that gives
// squared dissimilarities between current clusters and can merge two of them, so the same loop
// serves a condensed matrix and raw vectors (no n × n memory). Merges come out in their true
// order; heights may go down (inversions), which the tree reports.
import { IndexedMinHeap } from './heap';
import { RawMerges, createRawMerges } from './merges';
import { MergeTick } from './ticker';
import { condensedRowStarts } from './condensed-rows';

export type GenericMethod = 'centroid' | 'median';

export interface ClusterSpace {
  /** Squared dissimilarity between current clusters i and j. */
  distance(i: number, j: number): number;
  /** Merge x into y (x < y); afterwards y names the union. Called before sizes change. */
  merge(x: number, y: number, dxy: number, nx: number, ny: number, active: Int32Array, count: number): void;
}

export function genericLinkage(n: number, space: ClusterSpace, tick?: MergeTick): RawMerges {
  const raw = createRawMerges(n);
  const size = new Float64Array(n).fill(1);
  const active = new Int32Array(n);
  for (let i = 0; i < n; i++) active[i] = i;
  let count = n;
  const neighbour = new Int32Array(n).fill(-1);
  const bound = new Float64Array(n).fill(Infinity);

  /** Nearest active cluster with a larger name than the one at active position p. */
  const nearestAbove = (p: number): number => {
    const x = active[p];
    let best = -1;
    let min = Infinity;
    for (let q = p + 1; q < count; q++) {
      const i = active[q];
      const d = space.distance(x, i);
      if (d < min) {
        min = d;
        best = i;
      }
    }
    neighbour[x] = best;
    return min;
  };

  for (let p = 0; p < n - 1; p++) bound[active[p]] = nearestAbove(p);
  const heap = new IndexedMinHeap(bound);

  for (let k = 0; k < n - 1; k++) {
    let x = heap.top();
    let y = neighbour[x];
    let dxy = heap.keyOf(x);
    // Refresh stale bounds until the top one is exact; at most one refresh per active cluster.
    for (let guard = 0; guard < count; guard++) {
      if (y >= 0 && dxy === space.distance(x, y)) break;
      const d = nearestAbove(positionOf(active, count, x));
      heap.change(x, d);
      x = heap.top();
      y = neighbour[x];
      dxy = heap.keyOf(x);
    }
    heap.removeTop();
    raw.a[k] = x;
    raw.b[k] = y;
    raw.height[k] = Math.sqrt(dxy > 0 ? dxy : 0);
    space.merge(x, y, dxy, size[x], size[y], active, count);
    size[y] += size[x];
    size[x] = 0;
    const px = positionOf(active, count, x);
    active.copyWithin(px, px + 1, count);
    count--;

    // Clusters that pointed at x now guess y; bounds that the new cluster undercuts drop to it.
    let py = -1;
    for (let q = 0; q < count; q++) {
      const z = active[q];
      if (z >= y) {
        py = q;
        break;
      }
      if (neighbour[z] === x) neighbour[z] = y;
      const d = space.distance(z, y);
      if (d < heap.keyOf(z)) {
        heap.change(z, d);
        neighbour[z] = y;
      }
    }
    heap.change(y, nearestAbove(py));
    if (tick) tick(k + 1);
  }
  return raw;
}

function positionOf(active: Int32Array, count: number, x: number): number {
  // Binary search: active is sorted.
  let lo = 0;
  let hi = count - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (active[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** A condensed matrix of SQUARED Euclidean distances, updated by Lance & Williams. */
export function matrixSpace(n: number, work: Float64Array, method: GenericMethod): ClusterSpace {
  const starts = condensedRowStarts(n);
  const sizes = new Float64Array(n).fill(1);
  const at = (i: number, j: number) => (i < j ? starts[i] + j : starts[j] + i);
  return {
    distance: (i, j) => work[at(i, j)],
    merge(x, y, dxy, nx, ny, active, count) {
      const total = nx + ny;
      for (let q = 0; q < count; q++) {
        const i = active[q];
        if (i === x || i === y) continue;
        const dxi = work[at(i, x)];
        const dyi = work[at(i, y)];
        work[at(i, y)] =
          method === 'centroid' ? (nx * dxi + ny * dyi) / total - (nx * ny * dxy) / (total * total) : 0.5 * dxi + 0.5 * dyi - 0.25 * dxy;
      }
      sizes[y] = total;
    },
  };
}

/**
 * Raw vectors: each cluster keeps a representative point (its centroid, or for median the
 * midpoint of its two parts' points), so memory stays O(n·d). `points` is overwritten.
 */
export function vectorSpace(dims: number, points: Float64Array, method: GenericMethod): ClusterSpace {
  return {
    distance(i, j) {
      const io = i * dims;
      const jo = j * dims;
      let s = 0;
      for (let t = 0; t < dims; t++) {
        const diff = points[io + t] - points[jo + t];
        s += diff * diff;
      }
      return s;
    },
    merge(x, y, _dxy, nx, ny) {
      const wx = method === 'centroid' ? nx / (nx + ny) : 0.5;
      const wy = 1 - wx;
      const xo = x * dims;
      const yo = y * dims;
      for (let t = 0; t < dims; t++) points[yo + t] = wx * points[xo + t] + wy * points[yo + t];
    },
  };
}
