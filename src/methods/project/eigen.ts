// Eigen-decomposition of a symmetric matrix by cyclic Jacobi rotations: simple, and accurate to
// full precision for the small d × d covariance matrices PCA needs (d up to a few hundred).

export interface SymmetricEigen {
  /** Eigenvalues, largest first. */
  readonly values: Float64Array;
  /** d × d row-major; column c is the unit eigenvector of values[c]. */
  readonly vectors: Float64Array;
}

const MAX_SWEEPS = 100;

/** `matrix` is d × d row-major and symmetric (only read; a copy is rotated). */
export function symmetricEigen(matrix: Float64Array, d: number): SymmetricEigen {
  const a = Float64Array.from(matrix);
  const v = new Float64Array(d * d);
  for (let i = 0; i < d; i++) v[i * d + i] = 1;
  let total = 0;
  for (let k = 0; k < a.length; k++) total += a[k] * a[k];
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let off = 0;
    for (let p = 0; p < d; p++) for (let q = p + 1; q < d; q++) off += a[p * d + q] * a[p * d + q];
    // Off-diagonal mass negligible next to the whole: the diagonal holds the eigenvalues.
    if (off <= 1e-32 * total || off === 0) break;
    for (let p = 0; p < d; p++) {
      for (let q = p + 1; q < d; q++) {
        const apq = a[p * d + q];
        if (apq === 0) continue;
        const app = a[p * d + p];
        const aqq = a[q * d + q];
        // Rotation J (c at pp, qq; s at pq; −s at qp) with (JᵀAJ)[p][q] = 0 (Golub & Van Loan, sym.schur2).
        const tau = (aqq - app) / (2 * apq);
        const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        for (let k = 0; k < d; k++) {
          // A ← A J (columns p and q)
          const akp = a[k * d + p];
          const akq = a[k * d + q];
          a[k * d + p] = c * akp - s * akq;
          a[k * d + q] = s * akp + c * akq;
        }
        for (let k = 0; k < d; k++) {
          // A ← Jᵀ A (rows p and q)
          const apk = a[p * d + k];
          const aqk = a[q * d + k];
          a[p * d + k] = c * apk - s * aqk;
          a[q * d + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < d; k++) {
          const vkp = v[k * d + p];
          const vkq = v[k * d + q];
          v[k * d + p] = c * vkp - s * vkq;
          v[k * d + q] = s * vkp + c * vkq;
        }
        a[p * d + q] = 0;
        a[q * d + p] = 0;
      }
    }
  }
  // Sort by eigenvalue, largest first (stable on ties: original column order).
  const order = Array.from({ length: d }, (_, i) => i).sort((x, y) => a[y * d + y] - a[x * d + x] || x - y);
  const values = new Float64Array(d);
  const vectors = new Float64Array(d * d);
  for (let c = 0; c < d; c++) {
    const src = order[c];
    values[c] = a[src * d + src];
    for (let k = 0; k < d; k++) vectors[k * d + c] = v[k * d + src];
  }
  return { values, vectors };
}
