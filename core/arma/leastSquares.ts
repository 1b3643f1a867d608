/**
 * Cholesky factorisation of small symmetric positive-definite matrices (row-major, k × k, only the
 * lower triangle read), and what is built on it: ordinary least squares through the normal
 * equations, for the small regressions of the starting values (a handful of columns, a few hundred
 * rows), and inverses (the GLS covariance, the search's curvature start).
 */

/**
 * The lower Cholesky factor of A into L. False when a squared pivot is not above
 * relTol · max(floor, its diagonal element): the matrix is (numerically) singular for that purpose.
 */
export function choleskyFactor(
  A: ArrayLike<number>,
  k: number,
  L: Float64Array,
  relTol: number,
  floor: number,
): boolean {
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = A[i * k + j];
      for (let m = 0; m < j; m++) s -= L[i * k + m] * L[j * k + m];
      if (i === j) {
        if (!(s > relTol * Math.max(floor, A[i * k + i]))) return false;
        L[i * k + i] = Math.sqrt(s);
      } else L[i * k + j] = s / L[j * k + j];
    }
  }
  return true;
}

/** Solves L Lᵀ x = b for x, in place in b. */
export function choleskySolve(L: Float64Array, k: number, b: Float64Array): void {
  for (let i = 0; i < k; i++) {
    let s = b[i];
    for (let m = 0; m < i; m++) s -= L[i * k + m] * b[m];
    b[i] = s / L[i * k + i];
  }
  for (let i = k - 1; i >= 0; i--) {
    let s = b[i];
    for (let m = i + 1; m < k; m++) s -= L[m * k + i] * b[m];
    b[i] = s / L[i * k + i];
  }
}

/** A⁻¹ into out (k × k, row-major) from A's Cholesky factor L, one column of L Lᵀ x = e_c at a time. */
export function inverseFromCholesky(L: Float64Array, k: number, out: Float64Array): void {
  const col = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    col.fill(0);
    col[c] = 1;
    choleskySolve(L, k, col);
    for (let i = 0; i < k; i++) out[i * k + c] = col[i];
  }
}

/** OLS coefficients from XᵀX and Xᵀy; null when the columns are (numerically) collinear. */
export function solveNormalEquations(xtx: Float64Array, xty: Float64Array, k: number): Float64Array | null {
  const L = new Float64Array(k * k);
  if (!choleskyFactor(xtx, k, L, 1e-12, 1e-300)) return null;
  const b = Float64Array.from(xty);
  choleskySolve(L, k, b);
  return b;
}
