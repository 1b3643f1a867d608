/**
 * Stationary covariance P of the ARMA state in the Harvey (1989, "Forecasting, structural time
 * series models and the Kalman filter", §3.3) form: α_{t+1} = T α_t + R ε_{t+1}, with T the
 * companion matrix (φ in the first column, ones on the superdiagonal), R = (1, −θ_1, …, −θ_{r−1}),
 * r = max(p, q+1), σ² = 1. P solves the discrete Lyapunov equation P = T P Tᵀ + R Rᵀ; the r(r+1)/2
 * distinct entries are found by Gaussian elimination with partial pivoting. For a pure MA the
 * solution is the finite sum P_ij = Σ_k R_{i+k} R_{j+k}.
 * All arrays are caller-owned workspaces so a likelihood evaluation allocates nothing.
 */

export interface LyapunovWorkspace {
  r: number;
  /** m × m system, m = r(r+1)/2. */
  a: Float64Array;
  b: Float64Array;
  /** Packed index of (i, j), row-major r × r (symmetric). */
  index: Int32Array;
}

export function createLyapunovWorkspace(r: number): LyapunovWorkspace {
  const m = (r * (r + 1)) / 2;
  const index = new Int32Array(r * r);
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) index[i * r + j] = idx(i, j, r);
  return { r, a: new Float64Array(m * m), b: new Float64Array(m), index };
}

function idx(i: number, j: number, r: number): number {
  // Upper triangle (i ≤ j) packed row by row.
  if (i > j) {
    const t = i;
    i = j;
    j = t;
  }
  return i * r - (i * (i - 1)) / 2 + (j - i);
}

/**
 * Writes P (row-major r × r) for transition coefficients phi (length r, zero-padded) and
 * R (length r). Returns false when the system is singular (a unit root) or the result is not a
 * valid covariance.
 */
export function stationaryCovariance(
  phi: Float64Array,
  R: Float64Array,
  pureMa: boolean,
  ws: LyapunovWorkspace,
  P: Float64Array,
): boolean {
  const r = ws.r;
  if (pureMa) {
    for (let i = 0; i < r; i++) {
      for (let j = i; j < r; j++) {
        let s = 0;
        for (let k = 0; j + k < r; k++) s += R[i + k] * R[j + k];
        P[i * r + j] = s;
        P[j * r + i] = s;
      }
    }
    return true;
  }
  const m = (r * (r + 1)) / 2;
  const A = ws.a;
  const b = ws.b;
  const ix = ws.index;
  A.fill(0);
  for (let i = 0; i < r; i++) {
    for (let j = i; j < r; j++) {
      const e = ix[i * r + j];
      const row = e * m;
      A[row + e] += 1;
      // (T P Tᵀ)_ij = φ_i φ_j P_00 + φ_i P_{0,j+1} + φ_j P_{i+1,0} + P_{i+1,j+1}
      A[row] -= phi[i] * phi[j];
      if (j + 1 < r) A[row + ix[j + 1]] -= phi[i];
      if (i + 1 < r) A[row + ix[(i + 1) * r]] -= phi[j];
      if (i + 1 < r && j + 1 < r) A[row + ix[(i + 1) * r + j + 1]] -= 1;
      b[e] = R[i] * R[j];
    }
  }
  // Gaussian elimination with partial pivoting.
  for (let c = 0; c < m; c++) {
    let piv = c;
    let best = Math.abs(A[c * m + c]);
    for (let k = c + 1; k < m; k++) {
      const v = Math.abs(A[k * m + c]);
      if (v > best) {
        best = v;
        piv = k;
      }
    }
    if (!(best > 1e-300)) return false;
    if (piv !== c) {
      for (let j = c; j < m; j++) {
        const t = A[c * m + j];
        A[c * m + j] = A[piv * m + j];
        A[piv * m + j] = t;
      }
      const t = b[c];
      b[c] = b[piv];
      b[piv] = t;
    }
    const inv = 1 / A[c * m + c];
    for (let k = c + 1; k < m; k++) {
      const f = A[k * m + c] * inv;
      if (f === 0) continue;
      for (let j = c + 1; j < m; j++) A[k * m + j] -= f * A[c * m + j];
      b[k] -= f * b[c];
    }
  }
  for (let c = m - 1; c >= 0; c--) {
    let s = b[c];
    for (let j = c + 1; j < m; j++) s -= A[c * m + j] * b[j];
    b[c] = s / A[c * m + c];
  }
  for (let i = 0; i < r; i++) {
    for (let j = i; j < r; j++) {
      const v = b[ix[i * r + j]];
      P[i * r + j] = v;
      P[j * r + i] = v;
    }
  }
  return P[0] > 0 && Number.isFinite(P[0]);
}
