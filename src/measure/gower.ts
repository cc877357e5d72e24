// Gower's (1971) general dissimilarity for mixed columns: the weighted mean of per-column
// contributions in [0, 1], skipping columns where either value is missing and, for asymmetric
// binary columns, pairs where both values are 0 (a shared absence says nothing).
import { KinsortError } from '../core/errors';
import { MixedColumn, MixedTable } from '../core/mixed';
import { describe } from '../core/options';
import type { Ticker } from '../core/progress';
import { Dissimilarity, guardPairwise, makeDissimilarity } from './condensed';
import { checkWeights } from './metrics';

const SCALED = 0; // numeric and ordinal: |x − y| / range
const MATCH = 1; // symmetric binary and categorical: 0 if equal, else 1
const ABSENCE = 2; // asymmetric binary: like MATCH, but a 0–0 pair does not count

/**
 * Gower dissimilarity of a mixed table. Numeric columns and ordinal codes are divided by their
 * range over the values present; a constant column contributes 0 and still counts in the
 * average (as R's cluster::daisy does). `weights` (one per column) replaces each column's own
 * `weight` (default 1).
 */
export function gowerDissimilarity(table: MixedTable, weights: unknown, where = 'dissimilarity', tick?: Ticker): Dissimilarity {
  const n = table.rows;
  const columns = table.columns;
  if (!Number.isInteger(n) || n < 1) throw new KinsortError(`${where}: the mixed table has no rows.`, 'empty');
  if (!Array.isArray(columns) || columns.length === 0) throw new KinsortError(`${where}: the mixed table has no columns.`, 'empty');
  const p = columns.length;
  const rowLabel = (i: number) => (table.rowLabels?.[i] === undefined ? `row ${i + 1}` : `row ${i + 1} (id "${table.rowLabels[i]}")`);
  const given = checkWeights('gower', weights, p, where, (j) => `column "${columns[j].name}"`);
  const w = given ?? columnWeights(columns, where);

  // Row-major copy of scaled values / codes so the pair loop walks one flat array.
  const values = new Float64Array(n * p);
  const kinds = new Int8Array(p);
  for (let t = 0; t < p; t++) {
    const column = columns[t];
    checkColumn(column, n, where, rowLabel);
    const v = column.values;
    if (column.kind === 'numeric' || column.kind === 'ordinal') {
      kinds[t] = SCALED;
      let min = Infinity;
      let max = -Infinity;
      for (let i = 0; i < n; i++) {
        const x = v[i];
        if (x < min) min = x;
        if (x > max) max = x;
      }
      // A constant (or all-missing) column: every present pair contributes 0.
      const range = max > min ? max - min : 1;
      for (let i = 0; i < n; i++) values[i * p + t] = Number.isNaN(v[i]) ? NaN : (v[i] - min) / range;
    } else {
      kinds[t] = column.kind === 'binary' && column.asymmetric ? ABSENCE : MATCH;
      for (let i = 0; i < n; i++) values[i * p + t] = v[i];
    }
  }

  guardPairwise(n, where);
  const out = new Float64Array((n * (n - 1)) / 2);
  let k = 0;
  for (let i = 0; i < n; i++) {
    const ai = i * p;
    for (let j = i + 1; j < n; j++) {
      const bj = j * p;
      let sum = 0;
      let weight = 0;
      for (let t = 0; t < p; t++) {
        const x = values[ai + t];
        const y = values[bj + t];
        if (x !== x || y !== y) continue; // missing in either row
        const kind = kinds[t];
        if (kind === SCALED) {
          sum += w[t] * Math.abs(x - y);
        } else {
          if (kind === ABSENCE && x === 0 && y === 0) continue;
          if (x !== y) sum += w[t];
        }
        weight += w[t];
      }
      if (!(weight > 0)) {
        throw new KinsortError(
          `${where}: ${rowLabel(i)} and ${rowLabel(j)} share no column with values present in both ` +
            `(missing values, zero weights, or only 0–0 pairs in asymmetric binary columns), so Gower's dissimilarity is undefined; ` +
            `impute or drop one of the rows.`,
          'missing-value',
        );
      }
      out[k++] = sum / weight;
    }
    if (tick) tick(k);
  }
  return makeDissimilarity(n, out, 'gower', table.rowLabels);
}

function columnWeights(columns: readonly MixedColumn[], where: string): Float64Array {
  const w = new Float64Array(columns.length);
  for (let t = 0; t < columns.length; t++) {
    const v = columns[t].weight ?? 1;
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
      throw new KinsortError(
        `${where}: column "${columns[t].name}" has weight ${describe(v)}; weights must be finite numbers ≥ 0.`,
        'bad-option',
      );
    }
    w[t] = v;
  }
  if (!w.some((v) => v > 0)) throw new KinsortError(`${where}: every column weight is 0; at least one column must count.`, 'bad-option');
  return w;
}

/** Values must fit the column's kind; NaN marks a missing value. */
function checkColumn(column: MixedColumn, n: number, where: string, rowLabel: (i: number) => string): void {
  const name = `column "${column.name}"`;
  if (!(column.values instanceof Float64Array) || column.values.length !== n) {
    throw new KinsortError(
      `${where}: ${name} must hold one value per row in a Float64Array (${n} rows); got ${column.values?.length ?? 'none'}.`,
      'bad-input',
    );
  }
  const kinds = ['numeric', 'binary', 'categorical', 'ordinal'];
  if (!kinds.includes(column.kind)) {
    throw new KinsortError(`${where}: ${name} has kind ${describe(column.kind)}; valid kinds: ${kinds.join(', ')}.`, 'bad-input');
  }
  const v = column.values;
  for (let i = 0; i < n; i++) {
    const x = v[i];
    if (Number.isNaN(x)) continue;
    let ok: boolean;
    let allowed: string;
    if (column.kind === 'numeric') {
      ok = Number.isFinite(x);
      allowed = 'a finite number or missing';
    } else if (column.kind === 'binary') {
      ok = x === 0 || x === 1;
      allowed = '0, 1 or missing';
    } else {
      ok = Number.isInteger(x) && x >= 0;
      allowed = 'a level code 0, 1, 2, … or missing';
    }
    if (!ok) {
      throw new KinsortError(`${where}: ${rowLabel(i)}, ${name} (${column.kind}) is ${x}; allowed: ${allowed}.`, 'bad-input');
    }
  }
}
