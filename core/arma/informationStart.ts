/**
 * A curvature start for the search: the inverse of the expected Hessian of the concentrated
 * objective ½ log σ̂² + ½ Σ log F / n at u, in the unconstrained coordinates u of
 * partialAutocorrelations.ts. That Hessian is Jᵀ I J, with J = ∂(φ, θ)/∂u and I the large-sample
 * information of the ARMA(p,q) per observation (Box, Jenkins & Reinsel, "Time Series Analysis",
 * ch. 7; the chapter from memory; test/unit/arma/search-start.test.ts checks the result against the
 * numerical Hessian of the objective). In the ma-minus convention ∂e_t/∂φ_i = −x_{t−i} with
 * x = e/φ(B), and ∂e_t/∂θ_j = w_{t−j} with w = e/θ(B), so with the ψ-weights α of 1/φ(B) and β of
 * 1/θ(B):
 *   I_φφ[i][k] = Σ_m α_m α_{m+|i−k|},  I_θθ[j][l] = Σ_m β_m β_{m+|j−l|},
 *   I_φθ[i][j] = −Σ_m α_m β_{m+i−j} (terms with a negative index are zero).
 * The sums run to at most M = 400 terms: for roots of modulus 1.02 or more (a single coefficient
 * with |π| ≤ 0.98, as every start has) the cut-off tail is below 1e-6 of the sum; nearer the unit
 * circle the start is a rougher curvature, which BFGS corrects as it goes. They stop earlier, at
 * 64, 128 or 256 terms, once the weights have died out below 2^−60 (significantWeights). For
 * p, q ≤ 1 the sums are geometric series, summed in closed form (firstOrderInformation).
 */

import { choleskyFactor, inverseFromCholesky } from './leastSquares';
import { unconstrainedJacobian, unconstrainedToCoefficients } from './partialAutocorrelations';
import { psiWeights } from './psi';
import { scratchBlock } from './typedArrays';

const M = 400;
/** Below this a ψ-weight (ψ_0 = 1) no longer moves a sum of at least 1 in double precision: 2^−60. */
const NEGLIGIBLE = 2 ** -60;

/**
 * ψ-weights of 1/c(B) into out (M + m long, zero-filled) and the number of terms the sums need:
 * 64, 128, 256 or M — the first length whose last max(1, degree) weights are all negligible (from
 * there on the weights of a stationary polynomial stay negligible; the rest of out stays zero).
 * Each longer try continues the sequence. Most starts have roots well outside the unit circle,
 * whose weights die out long before M.
 */
function significantWeights(coef: Float64Array, m: number, out: Float64Array): number {
  const k = Math.max(coef.length, 1);
  let done = 0;
  for (let terms = 64; terms < M; terms *= 2) {
    psiWeights(coef, [], terms + m, 0, out, done);
    done = terms + m;
    let negligible = true;
    for (let i = done - k; i < done; i++) if (Math.abs(out[i]) > NEGLIGIBLE) negligible = false;
    if (negligible) return terms;
  }
  psiWeights(coef, [], M + m, 0, out, done);
  return M;
}

/**
 * Writes the inverse of Jᵀ I J at u (p AR then q MA coordinates) into out (m × m, row-major,
 * m = p + q) and returns true; false when that Hessian is (nearly) singular, as near a common
 * AR/MA factor, or not finite.
 */
export function inverseInformationStart(p: number, q: number, u: Float64Array, out: Float64Array): boolean {
  const m = p + q;
  if (m === 0) return false;
  const k = Math.max(p, q, 1);
  const work = new Float64Array(k * (k + 2));
  const ar = new Float64Array(p);
  const ma = new Float64Array(q);
  unconstrainedToCoefficients(u, 0, p, ar, 0, work);
  unconstrainedToCoefficients(u, p, q, ma, 0, work);
  const info = new Float64Array(m * m);
  if (p <= 1 && q <= 1) firstOrderInformation(ar, ma, info);
  else generalInformation(p, q, ar, ma, info);
  // J is block diagonal: the AR block and the MA block of the partial-autocorrelation map.
  const J = new Float64Array(m * m);
  const block = new Float64Array(k * k);
  for (const [offset, size] of [
    [0, p],
    [p, q],
  ]) {
    if (size === 0) continue;
    unconstrainedJacobian(u, offset, size, block, work);
    for (let i = 0; i < size; i++)
      for (let l = 0; l < size; l++) J[(offset + i) * m + offset + l] = block[i * size + l];
  }
  // H = Jᵀ I J.
  const IJ = new Float64Array(m * m);
  for (let i = 0; i < m; i++)
    for (let l = 0; l < m; l++) {
      let s = 0;
      for (let r = 0; r < m; r++) s += info[i * m + r] * J[r * m + l];
      IJ[i * m + l] = s;
    }
  const H = new Float64Array(m * m);
  for (let a = 0; a < m; a++)
    for (let b = 0; b < m; b++) {
      let s = 0;
      for (let i = 0; i < m; i++) s += J[i * m + a] * IJ[i * m + b];
      H[a * m + b] = s;
    }
  // Near a common AR/MA factor the Hessian is singular: decline when a squared pivot falls below
  // 1e-3 of its diagonal element.
  const L = new Float64Array(m * m);
  if (!choleskyFactor(H, m, L, 1e-3, 0)) return false;
  inverseFromCholesky(L, m, out);
  for (let i = 0; i < m * m; i++) if (!Number.isFinite(out[i])) return false;
  return true;
}

/**
 * I for p, q ≤ 1 in closed form (the sums of geometric series): with α_m = φ^m and β_m = θ^m,
 * I_φφ = 1/(1 − φ²), I_θθ = 1/(1 − θ²), I_φθ = −1/(1 − φθ).
 */
function firstOrderInformation(ar: Float64Array, ma: Float64Array, info: Float64Array): void {
  const m = ar.length + ma.length;
  const phi = ar.length ? ar[0] : 0;
  const theta = ma.length ? ma[0] : 0;
  if (ar.length) info[0] = 1 / (1 - phi * phi);
  if (ma.length) info[m * m - 1] = 1 / (1 - theta * theta);
  if (m === 2) {
    info[1] = -1 / (1 - phi * theta);
    info[2] = info[1];
  }
}

/** I from the ψ-weights of 1/φ(B) and of 1/θ(B) (θ(B) has the AR polynomial's form). */
function generalInformation(
  p: number,
  q: number,
  ar: Float64Array,
  ma: Float64Array,
  info: Float64Array,
): void {
  const m = p + q;
  const [alpha, beta] = scratchBlock([M + m, M + m]);
  const terms = Math.max(significantWeights(ar, m, alpha), significantWeights(ma, m, beta));
  const cross = (a: Float64Array, b: Float64Array, lag: number): number => {
    // Σ_m a_m b_{m+lag} for lag ≥ 0.
    let s = 0;
    for (let i = 0; i < terms; i++) s += a[i] * b[i + lag];
    return s;
  };
  // The two diagonal blocks: autocovariances of x (offset 0, size p) and of w (offset p, size q).
  for (const [offset, size, w] of [
    [0, p, alpha],
    [p, q, beta],
  ] as const) {
    // Toeplitz: one sum per lag.
    const byLag = new Float64Array(size);
    for (let lag = 0; lag < size; lag++) byLag[lag] = cross(w, w, lag);
    for (let i = 0; i < size; i++)
      for (let j = 0; j < size; j++) info[(offset + i) * m + offset + j] = byLag[Math.abs(i - j)];
  }
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < q; j++) {
      // −E[x_{t−1−i} w_{t−1−j}] / σ²: Σ α_s β_{s+i−j} for i ≥ j, Σ β_s α_{s+j−i} otherwise.
      const v = -(i >= j ? cross(alpha, beta, i - j) : cross(beta, alpha, j - i));
      info[i * m + p + j] = v;
      info[(p + j) * m + i] = v;
    }
  }
}
