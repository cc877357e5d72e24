// Where density segments read dissimilarities from: rows with a metric (computed when needed, no
// n × n matrix) or a Dissimilarity given by the caller (read from its condensed array).
import { Matrix } from '../../core/matrix';
import { Dissimilarity } from '../../measure/condensed';
import { MetricName, distanceFunction } from '../../measure/metrics';
import { condensedRowStarts } from '../hierarchy/condensed-rows';

export interface PairSource {
  readonly size: number;
  readonly metric: string;
  /** d(i, j) for i ≠ j. */
  pair(i: number, j: number): number;
  /** out[p] = d(x, targets[p]) for p < count: one call per row keeps the hot loop monomorphic. */
  fill(x: number, targets: Int32Array, count: number, out: Float64Array): void;
}

function fillByPairs(pair: (i: number, j: number) => number): PairSource['fill'] {
  return (x, targets, count, out) => {
    for (let p = 0; p < count; p++) out[p] = pair(x, targets[p]);
  };
}

export function pairsFromRows(rows: Matrix, metric: MetricName, p: number | undefined): PairSource {
  const dims = rows.cols;
  const data = rows.data;
  const kernel = distanceFunction(metric, p);
  const pair = (i: number, j: number) => kernel(data, i * dims, data, j * dims, dims);
  if (metric !== 'euclidean') return { size: rows.rows, metric, pair, fill: fillByPairs(pair) };
  // Euclidean inline: the same sum in column order and square root as the kernel (the same numbers).
  const fill: PairSource['fill'] = (x, targets, count, out) => {
    const xo = x * dims;
    for (let p = 0; p < count; p++) {
      const io = targets[p] * dims;
      let s = 0;
      for (let t = 0; t < dims; t++) {
        const diff = data[xo + t] - data[io + t];
        s += diff * diff;
      }
      out[p] = Math.sqrt(s);
    }
  };
  return { size: rows.rows, metric, pair, fill };
}

export function pairsFromDissimilarity(d: Dissimilarity): PairSource {
  const starts = condensedRowStarts(d.size);
  const values = d.condensed;
  const pair = (i: number, j: number) => (i < j ? values[starts[i] + j] : values[starts[j] + i]);
  return { size: d.size, metric: d.metric, pair, fill: fillByPairs(pair) };
}
