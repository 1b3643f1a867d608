/**
 * Ordinary least squares through the normal equations and a Cholesky factor, for the small
 * regressions of the starting values (a handful of columns, a few hundred rows). Returns null
 * when the columns are (numerically) collinear.
 */
export function solveNormalEquations(xtx: Float64Array, xty: Float64Array, k: number): Float64Array | null {
  const L = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j <= i; j++) {
      let s = xtx[i * k + j];
      for (let m = 0; m < j; m++) s -= L[i * k + m] * L[j * k + m];
      if (i === j) {
        if (!(s > 1e-12 * Math.max(1e-300, xtx[i * k + i]))) return null;
        L[i * k + i] = Math.sqrt(s);
      } else L[i * k + j] = s / L[j * k + j];
    }
  }
  const b = new Float64Array(k);
  for (let i = 0; i < k; i++) {
    let s = xty[i];
    for (let m = 0; m < i; m++) s -= L[i * k + m] * b[m];
    b[i] = s / L[i * k + i];
  }
  for (let i = k - 1; i >= 0; i--) {
    let s = b[i];
    for (let m = i + 1; m < k; m++) s -= L[m * k + i] * b[m];
    b[i] = s / L[i * k + i];
  }
  return b;
}
