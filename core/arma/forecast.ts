/**
 * Forecasts from a fitted ARIMA model by propagating the Kalman state beyond the sample:
 * the ARMA state a_{n+1|n}, P_{n+1|n} from the last filter pass, augmented with the last d levels
 * (y_t = w_t + Σ c_k y_{t−k}) and a running sum of the forecasts. The h-step error variance is
 * σ² Z P_h Zᵀ (Harvey 1989, §3.5); once P_{n+1|n} has reached its steady state R Rᵀ this equals
 * σ² Σ_{j<h} ψ*_j² with ψ* the integrated ψ-weights (Box, Jenkins & Reinsel, ch. 5; see psi.ts),
 * and otherwise it is the exact finite-sample value base R's predict.Arima also reports. The
 * running sum gives the lead-time demand over L weeks with every covariance between horizons.
 */
import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { integrationWeights } from './difference';
import { float64Block, scratchBlock, withScratch } from './typedArrays';
import type { ArmaFit } from './types';

interface Propagation {
  mean: Float64Array;
  se: Float64Array;
  sumMean: Float64Array;
  sumVariance: Float64Array;
}

function futureDeterministic(fit: ArmaFit, horizon: number, futureXreg?: Float64Array[]): Float64Array {
  const [det] = scratchBlock([horizon]);
  const mu = fit.mean ?? 0;
  det.fill(mu);
  const d = fit.order.d;
  const c = integrationWeights(d);
  fit.xregCoef.forEach((b, i) => {
    const col = futureXreg?.[i];
    if (!col || col.length < horizon) {
      throw new RangeError(`forecast needs ${horizon} future values of regressor ${i}`);
    }
    const tail = fit.forecastState.xregTail[i] ?? [];
    // Difference the future regressor values with the last d in-sample values.
    const hist = [...tail].reverse();
    const all = [...hist, ...Array.from(col.subarray(0, horizon))];
    for (let h = 0; h < horizon; h++) {
      let v = all[d + h];
      for (let k = 0; k < d; k++) v -= c[k] * all[d + h - 1 - k];
      det[h] += b * v;
    }
  });
  return det;
}

/** The forecast rows are allocated as usual; the state, the transition and the like are scratch. */
function propagate(fit: ArmaFit, horizon: number, futureXreg?: Float64Array[]): Propagation {
  return withScratch(() => propagateScratched(fit, horizon, futureXreg));
}

function propagateScratched(fit: ArmaFit, horizon: number, futureXreg?: Float64Array[]): Propagation {
  const H = Math.max(0, Math.floor(horizon));
  let ar = fit.ar;
  let ma = fit.ma;
  let d = fit.order.d;
  let state = fit.forecastState.state;
  let cov0 = fit.forecastState.covariance;
  let levels = fit.forecastState.lastLevels;
  let det: Float64Array;
  if (fit.fallback) {
    ar = [];
    ma = [];
    state = [0];
    cov0 = [1];
    if (fit.fallback === 'mean') {
      d = 0;
      levels = [];
      [det] = scratchBlock([H]);
      det.fill(fit.forecastState.level);
    } else {
      d = 1;
      levels = [fit.forecastState.level];
      [det] = scratchBlock([H]);
    }
  } else det = futureDeterministic(fit, H, futureXreg);
  const r = Math.max(ar.length, ma.length + 1);
  const phi = new Float64Array(r);
  const R = new Float64Array(r);
  for (let i = 0; i < ar.length; i++) phi[i] = ar[i];
  R[0] = 1;
  for (let j = 0; j < ma.length; j++) R[j + 1] = -ma[j];
  const c = integrationWeights(d);
  const D = r + d + 1;
  const S = r + d;
  const [m, P, G, GP, next] = scratchBlock([D, D * D, D * D, D * D, D]);
  // Through typed copies: the stored arrays hold small integers (fallbacks) or doubles.
  const st = Float64Array.from(state);
  const lv = Float64Array.from(levels);
  const c0 = Float64Array.from(cov0);
  for (let i = 0; i < r; i++) m[i] = i < st.length ? st[i] : 0;
  for (let j = 0; j < d; j++) m[r + j] = j < lv.length ? lv[j] : 0;
  for (let i = 0; i < r; i++)
    for (let j = 0; j < r; j++) P[i * D + j] = i * r + j < c0.length ? c0[i * r + j] : 0;
  // G maps (α, y_{t−1..t−d}, S) at time t to time t + 1 (y_t = α_0 + Σ c_k y_{t−k} + deterministic).
  for (let i = 0; i < r; i++) {
    G[i * D] = phi[i];
    if (i + 1 < r) G[i * D + i + 1] = 1;
  }
  if (d > 0) {
    G[r * D] = 1;
    for (let k = 0; k < d; k++) G[r * D + r + k] = c[k];
    for (let j = 1; j < d; j++) G[(r + j) * D + r + j - 1] = 1;
  }
  G[S * D] = 1;
  for (let k = 0; k < d; k++) G[S * D + r + k] = c[k];
  G[S * D + S] = 1;

  const [mean, se, sumMean, sumVariance] = float64Block([H, H, H, H]);
  const out: Propagation = { mean, se, sumMean, sumVariance };
  const s2 = Math.max(0, fit.sigma2);
  for (let h = 0; h < H; h++) {
    // Forecast of y_{n+h}: Z = (1, 0…, c_1…c_d, 0).
    let yMean = m[0] + det[h];
    for (let k = 0; k < d; k++) yMean += c[k] * m[r + k];
    let v = P[0];
    for (let k = 0; k < d; k++) {
      v += 2 * c[k] * P[r + k];
      for (let l = 0; l < d; l++) v += c[k] * c[l] * P[(r + k) * D + r + l];
    }
    out.mean[h] = yMean;
    out.se[h] = Math.sqrt(Math.max(0, s2 * v));
    // Mean transition (the deterministic part enters the levels and the sum through y).
    for (let i = 0; i < D; i++) {
      let acc = 0;
      for (let j = 0; j < D; j++) acc += G[i * D + j] * m[j];
      next[i] = acc;
    }
    if (d > 0) next[r] += det[h];
    next[S] += det[h];
    m.set(next);
    // P ← G P Gᵀ + R Rᵀ on the ARMA block.
    for (let i = 0; i < D; i++) {
      for (let j = 0; j < D; j++) {
        let acc = 0;
        for (let l = 0; l < D; l++) acc += G[i * D + l] * P[l * D + j];
        GP[i * D + j] = acc;
      }
    }
    for (let i = 0; i < D; i++) {
      for (let j = 0; j < D; j++) {
        let acc = 0;
        for (let l = 0; l < D; l++) acc += GP[i * D + l] * G[j * D + l];
        P[i * D + j] = acc + (i < r && j < r ? R[i] * R[j] : 0);
      }
    }
    out.sumMean[h] = m[S];
    out.sumVariance[h] = Math.max(0, s2 * P[S * D + S]);
  }
  return out;
}

/** h-step forecast means and standard errors on the original scale, h = 1..horizon. */
export function forecastArma(
  fit: ArmaFit,
  horizon: number,
  futureXreg?: Float64Array[],
): { mean: Float64Array; se: Float64Array } {
  const p = propagate(fit, horizon, futureXreg);
  return { mean: p.mean, se: p.se };
}

/**
 * Mean and variance of the SUM of the next L weeks (lead-time demand), all covariances between
 * horizons included: Var(Σ_{h≤L} y_{n+h} | data). For a model in its steady state this equals
 * leadTimeSumVariance(ψ*, σ², L) of leadTimeSum.ts.
 */
export function leadTimeMoments(
  fit: ArmaFit,
  L: number,
  futureXreg?: Float64Array[],
): { mean: number; variance: number } {
  if (!(L >= 1)) return { mean: 0, variance: 0 };
  const p = propagate(fit, L, futureXreg);
  return { mean: p.sumMean[L - 1], variance: p.sumVariance[L - 1] };
}

const Z80 = quantile(0.9, 0, 1);
const Z95 = quantile(0.975, 0, 1);

/** Central 80% and 95% normal intervals mean ± z·se. */
export function forecastIntervals(
  mean: ArrayLike<number>,
  se: ArrayLike<number>,
): { lower80: Float64Array; upper80: Float64Array; lower95: Float64Array; upper95: Float64Array } {
  const n = mean.length;
  const [lower80, upper80, lower95, upper95] = float64Block([n, n, n, n]);
  const out = { lower80, upper80, lower95, upper95 };
  for (let h = 0; h < n; h++) {
    out.lower80[h] = mean[h] - Z80 * se[h];
    out.upper80[h] = mean[h] + Z80 * se[h];
    out.lower95[h] = mean[h] - Z95 * se[h];
    out.upper95[h] = mean[h] + Z95 * se[h];
  }
  return out;
}
