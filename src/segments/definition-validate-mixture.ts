// Checks of the highest-posterior rule's figures when a definition is loaded: each segment's
// weight is a finite number > 0, the weights sum to 1, and its whitening W (the inverse Cholesky
// factor of the covariance) is a lower triangle of d rows of finite numbers with a diagonal > 0 —
// which makes Σ⁻¹ = Wᵀ W positive definite. A tampered file is refused naming the key.
import { KinsortError } from '../core/errors';

/** How far the stored weights may sum from 1 (they are written with every digit). */
export const WEIGHT_SUM_SLACK = 1e-9;

function fail(where: string, message: string): never {
  throw new KinsortError(`${where}: ${message}`, 'bad-definition');
}

export function checkMixtureSegment(seg: Record<string, unknown>, dims: number, at: string): { weight: number; whitening: number[][] } {
  const weight = seg.weight;
  if (weight === undefined) fail(at, 'key "weight" is missing; the highest-posterior rule needs each component\'s weight.');
  if (typeof weight !== 'number' || !Number.isFinite(weight) || !(weight > 0) || weight > 1) {
    fail(at, `key "weight" is ${JSON.stringify(weight)?.slice(0, 40)}; expected a number above 0 and at most 1.`);
  }
  const rows = seg.whitening;
  if (!Array.isArray(rows))
    fail(at, 'key "whitening" is missing or not an array; the highest-posterior rule needs each component\'s factor.');
  if (rows.length !== dims) fail(at, `key "whitening" has ${rows.length} rows; expected ${dims} (one per prepared feature).`);
  const whitening = rows.map((row, j) => {
    const where = `${at}.whitening[${j}]`;
    if (!Array.isArray(row)) fail(where, 'is not an array of numbers.');
    if (row.length !== j + 1) fail(where, `has ${row.length} numbers; row ${j + 1} of a lower triangle holds ${j + 1}.`);
    row.forEach((x, l) => {
      if (typeof x !== 'number' || !Number.isFinite(x))
        fail(where, `value ${l + 1} is ${JSON.stringify(x)?.slice(0, 40)}; expected a finite number.`);
    });
    if (!((row[j] as number) > 0)) {
      fail(where, `the diagonal figure is ${row[j]}; it must be above 0 (the covariance must be positive definite).`);
    }
    return (row as number[]).slice();
  });
  return { weight, whitening };
}

export function checkWeightSum(weights: readonly number[], where: string): void {
  const total = weights.reduce((s, w) => s + w, 0);
  if (!(Math.abs(total - 1) <= WEIGHT_SUM_SLACK)) {
    fail(where, `the segments' "weight" keys add up to ${total}; the weights of a mixture add up to 1.`);
  }
}
