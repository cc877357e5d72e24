// Correlations between the columns of a matrix: Pearson on the values, Spearman as Pearson on
// ranks (average ranks for ties, the convention of R's cor(method = "spearman")).
import type { Matrix } from '../../core/matrix';
import { KinsortError } from '../../core/errors';

export type CorrelationKind = 'pearson' | 'spearman';

/** Ranks 1..n of one column, ties sharing the average of the ranks they span. */
export function averageRanks(values: Float64Array): Float64Array {
  const n = values.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => values[a] - values[b] || a - b);
  const ranks = new Float64Array(n);
  for (let start = 0; start < n;) {
    let end = start + 1;
    while (end < n && values[order[end]] === values[order[start]]) end++;
    const rank = (start + 1 + end) / 2;
    for (let t = start; t < end; t++) ranks[order[t]] = rank;
    start = end;
  }
  return ranks;
}

/** Column j of a row-major matrix as its own array. */
function column(m: Matrix, j: number): Float64Array {
  const out = new Float64Array(m.rows);
  for (let i = 0; i < m.rows; i++) out[i] = m.data[i * m.cols + j];
  return out;
}

/**
 * p × p row-major correlation matrix of the columns (diagonal exactly 1). Columns are centred
 * first (two passes), which keeps cancellation small. A column without spread has no correlation
 * and is refused by name.
 */
export function correlationMatrix(m: Matrix, kind: CorrelationKind, names: readonly string[], where: string): Float64Array {
  const p = m.cols;
  const n = m.rows;
  const centred: Float64Array[] = [];
  const norms = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const raw = column(m, j);
    const x = kind === 'spearman' ? averageRanks(raw) : raw;
    let mean = 0;
    for (let i = 0; i < n; i++) mean += x[i];
    mean /= n;
    let ss = 0;
    for (let i = 0; i < n; i++) {
      x[i] -= mean;
      ss += x[i] * x[i];
    }
    if (!(ss > 0)) {
      throw new KinsortError(
        `${where}: column "${names[j]}" has the same value in every row, so it has no correlation with anything; leave it out.`,
        'bad-input',
      );
    }
    centred.push(x);
    norms[j] = Math.sqrt(ss);
  }
  const r = new Float64Array(p * p);
  for (let a = 0; a < p; a++) {
    r[a * p + a] = 1;
    for (let b = a + 1; b < p; b++) {
      const x = centred[a];
      const y = centred[b];
      let s = 0;
      for (let i = 0; i < n; i++) s += x[i] * y[i];
      const v = Math.max(-1, Math.min(1, s / (norms[a] * norms[b])));
      r[a * p + b] = v;
      r[b * p + a] = v;
    }
  }
  return r;
}
