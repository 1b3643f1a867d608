/**
 * Stationary covariance P of the ARMA state in the Harvey (1989, "Forecasting, structural time
 * series models and the Kalman filter", §3.3) form: α_{t+1} = T α_t + R ε_{t+1}, with T the
 * companion matrix (φ in the first column, ones on the superdiagonal), R = (1, −θ_1, …, −θ_{r−1}),
 * r = max(p, q+1), σ² = 1. P solves the discrete Lyapunov equation P = T P Tᵀ + R Rᵀ. Because T
 * is a companion matrix every entry of P is linear in its first column, so only an r × r system is
 * solved (Gaussian elimination with partial pivoting) rather than the r(r+1)/2 packed unknowns
 * of the general equation. For a pure MA the solution is the finite sum P_ij = Σ_k R_{i+k} R_{j+k}.
 * All arrays are caller-owned workspaces so a likelihood evaluation allocates nothing.
 */

export interface LyapunovWorkspace {
  r: number;
  /** r × r system and right-hand side. */
  a: Float64Array;
  b: Float64Array;
  /** r × r right-hand side Q of the equation. */
  q: Float64Array;
}

export function createLyapunovWorkspace(r: number): LyapunovWorkspace {
  return { r, a: new Float64Array(r * r), b: new Float64Array(r), q: new Float64Array(r * r) };
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
  const Q = ws.q;
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) Q[i * r + j] = R[i] * R[j];
  if (!solveCompanionLyapunov(phi, Q, ws, P)) return false;
  return P[0] > 0 && Number.isFinite(P[0]);
}

/**
 * Solves P = T P Tᵀ + Q for the companion T of phi (length r) and a symmetric r × r Q, into P.
 * False when the system is singular (a unit root).
 */
export function solveCompanionLyapunov(
  phi: Float64Array,
  Q: Float64Array,
  ws: LyapunovWorkspace,
  P: Float64Array,
): boolean {
  const r = ws.r;
  // Unrolling P_ij = (T P Tᵀ)_ij + Q_ij along its diagonal (entries past r are zero):
  //   P_ij = Σ_k [φ_{i+k} φ_{j+k} c_0 + φ_{i+k} c_{j+k+1} + φ_{j+k} c_{i+k+1} + Q_{i+k,j+k}],
  // with c = P's first column, so every entry is linear in c. Taking j = 0 gives an r × r system
  // for c (instead of the r(r+1)/2 unknowns of the packed Lyapunov system); the rest of P then
  // follows from the bottom-right corner up.
  const A = ws.a;
  const b = ws.b;
  for (let i = 0; i < r; i++) {
    const row = i * r;
    for (let j = 0; j < r; j++) A[row + j] = i === j ? 1 : 0;
    let d = 0;
    for (let k = 0; i + k < r; k++) {
      const fik = phi[i + k];
      d += Q[(i + k) * r + k];
      A[row] -= fik * phi[k];
      if (k + 1 < r) A[row + k + 1] -= fik;
      if (i + k + 1 < r) A[row + i + k + 1] -= phi[k];
    }
    b[i] = d;
  }
  if (!solveSmallSystem(A, b, r)) return false;
  // b = c (P's first column). P_ij = φ_i φ_j c_0 + φ_i c_{j+1} + φ_j c_{i+1} + P_{i+1,j+1} + Q_ij.
  const c0 = b[0];
  for (let i = r - 1; i >= 0; i--) {
    for (let j = r - 1; j >= i; j--) {
      let v = phi[i] * phi[j] * c0 + Q[i * r + j];
      if (j + 1 < r) v += phi[i] * b[j + 1] + P[(i + 1) * r + j + 1];
      if (i + 1 < r) v += phi[j] * b[i + 1];
      P[i * r + j] = v;
      P[j * r + i] = v;
    }
  }
  return true;
}

/**
 * Solves S = Tᵀ S T + G (the adjoint of the equation above: for any C, ⟨G, X⟩ = ⟨S, C⟩ when
 * X = T X Tᵀ + C) for the companion T of phi and a symmetric r × r G, into S. Since
 * (Tᵀ S T)_ij = S_{i−1,j−1} for i, j ≥ 1, every entry is S_ij = s_|i−j| + H_ij with s = S's
 * first row and H_ij = Σ_{k<min(i,j)} G_{i−k,j−k}; the first row's equations
 * s_0 = Σ_ab φ_a φ_b S_ab + G_00 and s_j = Σ_a φ_a S_{a,j−1} + G_0j are an r × r system for s.
 */
export function solveCompanionLyapunovAdjoint(
  phi: Float64Array,
  G: Float64Array,
  ws: LyapunovWorkspace,
  S: Float64Array,
): boolean {
  const r = ws.r;
  const A = ws.a;
  const b = ws.b;
  // H into S first (S_ij = H_ij + s_|i−j| afterwards); H_0j = 0.
  for (let i = 0; i < r; i++) {
    for (let j = i; j < r; j++) {
      const h = i === 0 ? 0 : S[(i - 1) * r + j - 1] + G[i * r + j];
      S[i * r + j] = h;
      S[j * r + i] = h;
    }
  }
  A.fill(0, 0, r * r);
  for (let j = 0; j < r; j++) {
    A[j * r + j] = 1;
    let d = G[j];
    if (j === 0) {
      for (let a = 0; a < r; a++) {
        for (let c = 0; c < r; c++) {
          const ff = phi[a] * phi[c];
          A[Math.abs(a - c)] -= ff;
          d += ff * S[a * r + c];
        }
      }
    } else {
      for (let a = 0; a < r; a++) {
        A[j * r + Math.abs(a - j + 1)] -= phi[a];
        d += phi[a] * S[a * r + j - 1];
      }
    }
    b[j] = d;
  }
  if (!solveSmallSystem(A, b, r)) return false;
  for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) S[i * r + j] += b[Math.abs(i - j)];
  return true;
}

/** Gaussian elimination with partial pivoting on the r × r system A x = b; x into b. */
function solveSmallSystem(A: Float64Array, b: Float64Array, r: number): boolean {
  for (let c = 0; c < r; c++) {
    let piv = c;
    let best = Math.abs(A[c * r + c]);
    for (let k = c + 1; k < r; k++) {
      const v = Math.abs(A[k * r + c]);
      if (v > best) {
        best = v;
        piv = k;
      }
    }
    if (!(best > 1e-300)) return false;
    if (piv !== c) {
      for (let j = c; j < r; j++) {
        const t = A[c * r + j];
        A[c * r + j] = A[piv * r + j];
        A[piv * r + j] = t;
      }
      const t = b[c];
      b[c] = b[piv];
      b[piv] = t;
    }
    const inv = 1 / A[c * r + c];
    for (let k = c + 1; k < r; k++) {
      const f = A[k * r + c] * inv;
      if (f === 0) continue;
      for (let j = c + 1; j < r; j++) A[k * r + j] -= f * A[c * r + j];
      b[k] -= f * b[c];
    }
  }
  for (let c = r - 1; c >= 0; c--) {
    let s = b[c];
    for (let j = c + 1; j < r; j++) s -= A[c * r + j] * b[j];
    b[c] = s / A[c * r + c];
  }
  return true;
}
