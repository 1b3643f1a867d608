/**
 * Autocorrelation functions.
 * - theoreticalAcf: ρ_k of the ARMA(p,q) model (ma-minus). γ_0..γ_r from the stationary state
 *   covariance (γ_k = (T^k P)_{00}, P solving P = T P Tᵀ + R Rᵀ), then for k > q the difference
 *   equation γ_k = Σ φ_i γ_{k−i} (Box, Jenkins & Reinsel, §3.4), which for a pure MA(q) gives
 *   exactly zero beyond lag q.
 * - sampleAcf: r_k = c_k / c_0 with the usual biased autocovariance (Box & Jenkins 1976, §2.1.4).
 * - samplePacf: the Durbin–Levinson recursion on r_k (Durbin 1960).
 * - acfBand: ±1.96/√n, the approximate 95% band for white noise (Bartlett 1946; common practice).
 */
import { sampleAutocovariance } from './sampleAutocovariance';
import { createLyapunovWorkspace, stationaryCovariance } from './stationaryCovariance';

export function theoreticalAcf(ar: ArrayLike<number>, ma: ArrayLike<number>, lags: number): Float64Array {
  const p = ar.length;
  const q = ma.length;
  const r = Math.max(p, q + 1);
  const phi = new Float64Array(r);
  const R = new Float64Array(r);
  for (let i = 0; i < p; i++) phi[i] = ar[i];
  R[0] = 1;
  for (let j = 0; j < q; j++) R[j + 1] = -ma[j];
  const P = new Float64Array(r * r);
  const out = new Float64Array(lags + 1);
  if (!stationaryCovariance(phi, R, p === 0, createLyapunovWorkspace(r), P)) {
    throw new RangeError('theoreticalAcf: the AR part is not stationary');
  }
  const gamma = new Float64Array(lags + 1);
  // Row 0 of T^k P by repeated left multiplication: (T X)_{0j} = φ_0 X_{0j} + X_{1j}.
  let X = Float64Array.from(P);
  const Y = new Float64Array(r * r);
  const direct = Math.min(lags, q);
  for (let k = 0; k <= direct; k++) {
    gamma[k] = X[0];
    for (let i = 0; i < r; i++) {
      for (let j = 0; j < r; j++) Y[i * r + j] = phi[i] * X[j] + (i + 1 < r ? X[(i + 1) * r + j] : 0);
    }
    X = Float64Array.from(Y);
  }
  for (let k = direct + 1; k <= lags; k++) {
    let g = 0;
    for (let i = 0; i < p; i++) {
      const lag = Math.abs(k - 1 - i);
      g += ar[i] * gamma[lag];
    }
    gamma[k] = g;
  }
  for (let k = 0; k <= lags; k++) out[k] = gamma[k] / gamma[0];
  return out;
}

export function sampleAcf(y: ArrayLike<number>, lags: number): Float64Array {
  const c = sampleAutocovariance(y, lags, true);
  const out = new Float64Array(lags + 1);
  if (!(c[0] > 0)) return out;
  for (let k = 0; k <= lags; k++) out[k] = c[k] / c[0];
  return out;
}

/** Partial autocorrelations at lags 1..lags (index 0 is lag 1). */
export function samplePacf(y: ArrayLike<number>, lags: number): Float64Array {
  const rho = sampleAcf(y, lags);
  const out = new Float64Array(lags);
  const phi = new Float64Array(lags);
  const prev = new Float64Array(lags);
  let v = 1;
  for (let k = 0; k < lags; k++) {
    let num = rho[k + 1];
    for (let j = 0; j < k; j++) num -= phi[j] * rho[k - j];
    const pk = v > 0 ? num / v : 0;
    for (let j = 0; j < k; j++) prev[j] = phi[j];
    for (let j = 0; j < k; j++) phi[j] = prev[j] - pk * prev[k - 1 - j];
    phi[k] = pk;
    v *= 1 - pk * pk;
    out[k] = pk;
  }
  return out;
}

export function acfBand(n: number): number {
  return 1.96 / Math.sqrt(n);
}
