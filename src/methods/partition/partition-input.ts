// Checks shared by k-means and k-medoids: the rows and k.
import { KinsortError } from '../../core/errors';
import { toMatrix, type Matrix, type RowsInput } from '../../core/matrix';
import { describe } from '../../core/options';
import { countDistinctRows } from './distinct-rows';

/** The rows as a validated matrix (ragged rows and NaN / Infinity are refused, naming row and column). */
export function partitionRows(rows: RowsInput, where: string): Matrix {
  const m = toMatrix(rows, { what: `${where}: rows` });
  if (m.cols === 0) throw new KinsortError(`${where}: the rows have no columns; at least one is needed.`, 'bad-input');
  return m;
}

/** k must be a whole number from 1 to the number of distinct rows. */
export function checkSegmentCount(k: unknown, m: Matrix, where: string): number {
  if (k === undefined) {
    throw new KinsortError(`${where}: the option k (number of segments) is required, e.g. { k: 3 }.`, 'bad-k');
  }
  if (typeof k !== 'number' || !Number.isInteger(k) || k < 1) {
    throw new KinsortError(`${where}: k must be a whole number ≥ 1; got ${describe(k)}.`, 'bad-k');
  }
  if (k > m.rows) {
    throw new KinsortError(`${where}: k = ${k} but there are only ${m.rows} rows; k can be at most ${m.rows}.`, 'bad-k');
  }
  const distinct = countDistinctRows(m, k);
  if (distinct < k) {
    throw new KinsortError(
      `${where}: k = ${k} but the ${m.rows} rows hold only ${distinct} distinct value combinations; ` +
        `k can be at most ${distinct} (each segment needs a row of its own).`,
      'bad-k',
    );
  }
  return k;
}
