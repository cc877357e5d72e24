// The figures reported with a k-means result: sizes, within-SS (in total and per segment),
// between-SS and total SS, all from scratch.
import { segmentSizes, sumsFromScratch } from './centre-update';
import type { GrandSpread } from './grand-spread';
import type { KmeansMemory } from './kmeans-memory';
import { withinOn } from './within-ss';

export interface PartitionFigures {
  sizes: number[];
  withinSS: number;
  withinSSBySegment: number[];
  betweenSS: number;
  totalSS: number;
}

/** Sizes and sums of squares of `mem.assignment`, whose centres (`mem.centres`) are the means of their rows. */
export function partitionFigures(mem: KmeansMemory, spread: GrandSpread): PartitionFigures {
  const { d, k } = mem.layout;
  const { grand, totalSS } = spread;
  sumsFromScratch(mem);
  const sizes = segmentSizes(mem);
  const bySegment = new Array<number>(k);
  const withinSS = withinOn(mem, bySegment);
  let betweenSS = 0;
  for (let c = 0; c < k; c++) {
    let s = 0;
    for (let j = 0; j < d; j++) {
      const diff = mem.centres[c * d + j] - grand[j];
      s += diff * diff;
    }
    betweenSS += sizes[c] * s;
  }
  return { sizes, withinSS, withinSSBySegment: bySegment, betweenSS, totalSS };
}
