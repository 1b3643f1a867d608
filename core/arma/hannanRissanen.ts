/**
 * Starting values by the Hannan–Rissanen (1982, Biometrika 69(1)) two-stage regression:
 * (1) a long autoregression of order m (Yule–Walker, so it is always stationary) gives
 *     innovation estimates ê_t; (2) least squares of u_t on u_{t−1..t−p} and ê_{t−1..t−q}.
 * In the ma-minus convention u_t = Σ φ_i u_{t−i} + e_t − Σ θ_j e_{t−j}, so θ_j = −(coefficient
 * of ê_{t−j}). u is the mean-removed series; missing values count as zero deviations.
 */

import { solveNormalEquations } from './leastSquares';
import { sampleAutocovariance } from './sampleAutocovariance';
import { numberArray, scratchBlock } from './typedArrays';

/**
 * Yule–Walker AR(m) coefficients by the Durbin–Levinson recursion (Durbin 1960). Inside a scratch
 * scope (typedArrays.ts) the result is scratch: copy it to keep it past the scope.
 */
export function yuleWalker(gamma: Float64Array, m: number): Float64Array {
  const [phi, prev] = scratchBlock([m, m]);
  let v = gamma[0];
  for (let k = 0; k < m; k++) {
    if (!(v > 0)) break;
    let num = gamma[k + 1];
    for (let j = 0; j < k; j++) num -= phi[j] * gamma[k - j];
    const pk = num / v;
    for (let j = 0; j < k; j++) prev[j] = phi[j];
    for (let j = 0; j < k; j++) phi[j] = prev[j] - pk * prev[k - 1 - j];
    phi[k] = pk;
    v *= 1 - pk * pk;
  }
  return phi;
}

/** The first stage (series with missing values as zero, long-AR innovations) for one order m. */
export interface HannanStage1 {
  m: number;
  x: Float64Array;
  e: Float64Array;
  /** Sample autocovariances of x at lags 0…min(n − 1, m) (the pure-AR start reuses them). */
  gamma: Float64Array;
}

function longArOrder(n: number, p: number, q: number): number {
  return Math.max(p + q + 1, Math.min(Math.floor(n / 4), Math.ceil(10 * Math.log10(n)), 30));
}

function zeroFilled(u: Float64Array): Float64Array {
  const n = u.length;
  const x = new Float64Array(n);
  for (let t = 0; t < n; t++) x[t] = Number.isNaN(u[t]) ? 0 : u[t];
  return x;
}

/** Stage 1 for ARMA(p, q): null when the series is too short or has no variance; scratch, as yuleWalker's. */
export function hannanStage1(u: Float64Array, p: number, q: number): HannanStage1 | null {
  const n = u.length;
  const m = longArOrder(n, p, q);
  if (m >= n - 1) return null;
  const [x, e] = scratchBlock([n, n]);
  for (let t = 0; t < n; t++) x[t] = Number.isNaN(u[t]) ? 0 : u[t];
  const lags = Math.min(n - 1, m);
  const gamma = sampleAutocovariance(x, lags, false, scratchBlock([lags + 1])[0]);
  if (!(gamma[0] > 0)) return null;
  const longAr = yuleWalker(gamma, m);
  for (let t = m; t < n; t++) {
    // Two interleaved partial sums (two independent additions in flight).
    let s0 = x[t];
    let s1 = 0;
    let j = 0;
    for (; j + 1 < m; j += 2) {
      s0 -= longAr[j] * x[t - 1 - j];
      s1 -= longAr[j + 1] * x[t - 2 - j];
    }
    if (j < m) s0 -= longAr[j] * x[t - 1 - j];
    e[t] = s0 + s1;
  }
  return { m, x, e, gamma };
}

/**
 * Hannan–Rissanen estimates of ARMA(p, q); `stage1` (from hannanStage1 on the same u) is reused
 * when its long-AR order is the one this order needs, so several orders share the first stage
 * (and for a pure AR its autocovariances).
 */
export function hannanRissanen(
  u: Float64Array,
  p: number,
  q: number,
  stage1: HannanStage1 | null = null,
): { ar: number[]; ma: number[] } | null {
  const n = u.length;
  if (q === 0) {
    // Pure AR: Yule–Walker directly (the second stage would only repeat the regression).
    const lags = Math.min(n - 1, p);
    const gamma = stage1
      ? stage1.gamma
      : sampleAutocovariance(zeroFilled(u), lags, false, scratchBlock([lags + 1])[0]);
    if (!(gamma[0] > 0)) return null;
    const phi = yuleWalker(gamma, p);
    return { ar: numberArray(phi), ma: [] };
  }
  const m = longArOrder(n, p, q);
  const st = stage1 && stage1.m === m ? stage1 : hannanStage1(u, p, q);
  if (!st) return null;
  const { x, e } = st;
  const k = p + q;
  const start = m + q;
  if (n - start <= k + 1) return null;
  const xtx = new Float64Array(k * k);
  const xty = new Float64Array(k);
  const row = new Float64Array(k);
  for (let t = start; t < n; t++) {
    for (let i = 0; i < p; i++) row[i] = x[t - 1 - i];
    for (let j = 0; j < q; j++) row[p + j] = e[t - 1 - j];
    for (let i = 0; i < k; i++) {
      xty[i] += row[i] * x[t];
      for (let j = 0; j < k; j++) xtx[i * k + j] += row[i] * row[j];
    }
  }
  const b = solveNormalEquations(xtx, xty, k);
  if (!b) return null;
  const ar: number[] = [];
  const ma: number[] = [];
  for (let i = 0; i < p; i++) ar.push(b[i]);
  for (let j = 0; j < q; j++) ma.push(-b[p + j]);
  return { ar, ma };
}
