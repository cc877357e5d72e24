// Checks of a definition's stored dense rows (nearest-dense-row rule): shapes, finite values, core
// distances ≥ 0, segments 1..k with exactly each segment's size of rows, and the row limit.
import { KinsortError } from '../core/errors';
import type { DefinitionSegment } from './definition-types';
import { DENSE_ROW_LIMIT, type DenseRows } from './dense-rows';

function fail(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-definition');
}

export function checkDenseRows(raw: unknown, dims: number, segments: readonly DefinitionSegment[], where: string): DenseRows {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw))
    fail(where, 'is missing or not an object; the nearest-dense-row rule needs the stored rows.');
  const d = raw as Record<string, unknown>;
  for (const key of Object.keys(d))
    if (!['values', 'reach', 'segment'].includes(key)) fail(where, `holds the unknown key ${JSON.stringify(key)}.`);
  const { values, reach, segment } = d;
  if (!Array.isArray(values) || !Array.isArray(reach) || !Array.isArray(segment))
    fail(where, 'needs arrays "values", "reach" and "segment".');
  const n = values.length;
  if (reach.length !== n || segment.length !== n)
    fail(where, `has ${n} rows but ${reach.length} reach and ${segment.length} segment values.`);
  if (n > DENSE_ROW_LIMIT) fail(where, `stores ${n} rows; at most ${DENSE_ROW_LIMIT} are allowed.`);
  const counts = new Array<number>(segments.length).fill(0);
  const rows = values.map((row, r) => {
    if (!Array.isArray(row) || row.length !== dims)
      fail(where, `values[${r}] is not an array of ${dims} numbers (one per prepared feature).`);
    row.forEach((x, j) => {
      if (typeof x !== 'number' || !Number.isFinite(x)) fail(where, `values[${r}][${j}] is not a finite number.`);
    });
    const e = reach[r];
    if (typeof e !== 'number' || !Number.isFinite(e) || e < 0) fail(where, `reach[${r}] is ${String(e)}; expected a distance ≥ 0.`);
    const s = segment[r];
    if (typeof s !== 'number' || !Number.isInteger(s) || s < 1 || s > segments.length)
      fail(where, `segment[${r}] is ${String(s)}; expected a segment number 1..${segments.length}.`);
    counts[s - 1]++;
    return row.slice() as number[];
  });
  counts.forEach((c, s) => {
    if (c !== segments[s].size)
      fail(where, `stores ${c} rows of segment ${s + 1}, whose size is ${segments[s].size}; every member is stored.`);
  });
  return { values: rows, reach: reach.slice() as number[], segment: segment.slice() as number[] };
}
