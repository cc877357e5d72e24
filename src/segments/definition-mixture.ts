// Building the highest-posterior rule of a mixture definition: each covariance is factored
// (Σ = L Lᵀ) and stored as W = L⁻¹, one lower-triangle row per feature, beside its weight.
import { KinsortError } from '../core/errors';
import { choleskyLower, invertLower } from '../methods/mixture/cholesky';

export interface MixtureInput {
  /** Mixing weight per segment (they sum to 1). */
  weights: readonly number[];
  /** Full d × d covariance per segment, in the prepared space. */
  covariances: readonly (readonly (readonly number[])[])[];
}

export interface StoredComponent {
  weight: number;
  whitening: number[][];
}

export function storedComponents(input: MixtureInput | undefined, k: number, d: number, where: string): StoredComponent[] {
  if (input === undefined || !Array.isArray(input.weights) || !Array.isArray(input.covariances)) {
    throw new KinsortError(
      `${where}: the highest-posterior rule needs "mixture": { weights, covariances } (one per segment).`,
      'bad-argument',
    );
  }
  if (input.weights.length !== k || input.covariances.length !== k) {
    throw new KinsortError(
      `${where}: ${input.weights.length} weights and ${input.covariances.length} covariances for ${k} segments.`,
      'bad-input',
    );
  }
  const flat = new Float64Array(d * d);
  const lower = new Float64Array(d * d);
  const inverse = new Float64Array(d * d);
  return input.covariances.map((cov, c) => {
    if (!Array.isArray(cov) || cov.length !== d || cov.some((row) => !Array.isArray(row) || row.length !== d)) {
      throw new KinsortError(`${where}: the covariance of segment ${c + 1} is not ${d} × ${d}.`, 'bad-input');
    }
    cov.forEach((row, a) => (row as readonly number[]).forEach((v: number, b: number) => (flat[a * d + b] = v)));
    if (flat.some((v) => !Number.isFinite(v))) {
      throw new KinsortError(`${where}: the covariance of segment ${c + 1} holds a number that is not finite.`, 'bad-input');
    }
    const bad = choleskyLower(flat, 0, d, lower, 0);
    if (bad >= 0) {
      throw new KinsortError(`${where}: the covariance of segment ${c + 1} is not positive definite (pivot ${bad + 1}).`, 'bad-input');
    }
    invertLower(lower, 0, d, inverse, 0);
    const weight = input.weights[c];
    if (!(weight > 0) || !Number.isFinite(weight)) {
      throw new KinsortError(`${where}: the weight of segment ${c + 1} is ${weight}; expected a number above 0.`, 'bad-input');
    }
    return { weight, whitening: Array.from({ length: d }, (_, j) => Array.from(inverse.subarray(j * d, j * d + j + 1))) };
  });
}
