// Cholesky factors of small symmetric matrices (d × d, flat row-major) and the inverse of a lower
// triangular factor. Mixture log-densities use W = L⁻¹ (Σ = L Lᵀ): the quadratic form
// (x − μ)ᵀ Σ⁻¹ (x − μ) is |W (x − μ)|², and ln |Σ|^(-1/2) is the sum of ln W_jj.

/**
 * Lower factor L of the symmetric matrix `a` (only its lower triangle is read) into `out`; the
 * upper triangle of `out` is set to 0. Returns the first pivot (0-based) that is not positive,
 * or -1 when the matrix is positive definite.
 */
export function choleskyLower(a: Float64Array, aAt: number, d: number, out: Float64Array, outAt: number): number {
  for (let j = 0; j < d; j++) {
    for (let i = 0; i < d; i++) {
      if (i < j) {
        out[outAt + i * d + j] = 0;
        continue;
      }
      let s = a[aAt + i * d + j];
      for (let l = 0; l < j; l++) s -= out[outAt + i * d + l] * out[outAt + j * d + l];
      if (i === j) {
        if (!(s > 0)) return j;
        out[outAt + j * d + j] = Math.sqrt(s);
      } else {
        out[outAt + i * d + j] = s / out[outAt + j * d + j];
      }
    }
  }
  return -1;
}

/** Inverse of the lower triangular `l` (positive diagonal) into `out`, also lower triangular. */
export function invertLower(l: Float64Array, lAt: number, d: number, out: Float64Array, outAt: number): void {
  for (let j = 0; j < d; j++) {
    for (let i = 0; i < d; i++) {
      if (i < j) {
        out[outAt + i * d + j] = 0;
        continue;
      }
      if (i === j) {
        out[outAt + i * d + i] = 1 / l[lAt + i * d + i];
        continue;
      }
      // Row i of L times column j of the inverse is 0 below the diagonal.
      let s = 0;
      for (let m = j; m < i; m++) s += l[lAt + i * d + m] * out[outAt + m * d + j];
      out[outAt + i * d + j] = -s / l[lAt + i * d + i];
    }
  }
}
