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
}

export function pairsFromRows(rows: Matrix, metric: MetricName, p: number | undefined): PairSource {
  const dims = rows.cols;
  const data = rows.data;
  const kernel = distanceFunction(metric, p);
  return { size: rows.rows, metric, pair: (i, j) => kernel(data, i * dims, data, j * dims, dims) };
}

export function pairsFromDissimilarity(d: Dissimilarity): PairSource {
  const starts = condensedRowStarts(d.size);
  const values = d.condensed;
  return {
    size: d.size,
    metric: d.metric,
    pair: (i, j) => (i < j ? values[starts[i] + j] : values[starts[j] + i]),
  };
}
