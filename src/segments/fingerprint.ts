// A fingerprint of the training data: says whether some rows are the rows a definition was fitted
// on, without storing them. Each row (its id and its prepared values, printed as JavaScript prints
// numbers) is hashed on its own; the row hashes are sorted and hashed together, so the fingerprint
// does not depend on row order. SHA-256 from node:crypto (segments/ may use Node helpers).
import { createHash } from 'crypto';
import { Matrix } from '../core/matrix';
import { KinsortError } from '../core/errors';

export const FINGERPRINT_ALGORITHM = 'sha256 of sorted per-row sha256(id, prepared values)';

function rowHash(id: string, data: Float64Array, offset: number, cols: number): string {
  const h = createHash('sha256');
  // JSON keeps ids with commas or newlines unambiguous.
  h.update(JSON.stringify(id));
  for (let j = 0; j < cols; j++) h.update('|' + String(data[offset + j]));
  return h.digest('hex');
}

/** Order-independent fingerprint of ids + prepared rows, as "sha256:<hex>". */
export function fingerprintRows(ids: readonly string[], matrix: Matrix): string {
  if (ids.length !== matrix.rows) {
    throw new KinsortError(`fingerprint: ${ids.length} ids for ${matrix.rows} prepared rows; give one id per row.`, 'bad-input');
  }
  const hashes: string[] = new Array(matrix.rows);
  for (let i = 0; i < matrix.rows; i++) hashes[i] = rowHash(String(ids[i]), matrix.data, i * matrix.cols, matrix.cols);
  hashes.sort();
  const all = createHash('sha256');
  all.update(`${matrix.rows}x${matrix.cols}\n`);
  for (const h of hashes) all.update(h);
  return 'sha256:' + all.digest('hex');
}
