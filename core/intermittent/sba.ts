/**
 * Syntetos–Boylan Approximation (Syntetos, A. A. & Boylan, J. E. 2005, Int. J. Forecasting 21),
 * the bias-corrected form of Croston's method (Croston 1972, Operational Research Quarterly 23):
 * after each week with demand, the size estimate z and the inter-demand interval estimate p are
 * smoothed with the same constant α,
 *   z ← z + α (y_t − z),  p ← p + α (τ − p)   (τ = weeks since the previous demand),
 * and the forecast per week is f = (1 − α/2) · z / p, flat over the horizon.
 * Uncertainty comes from the method's own errors: the one-step errors e_t = y_t − f_{t−1} after a
 * warm-up give σ₁² = mean(e_t²); the variance of the sum of any window of future weeks is taken from
 * the method's own in-sample errors of sums of that many weeks where there are enough of them, and
 * otherwise from σ₁² times the window length.
 * α is chosen from {0.05, 0.1, 0.2, 0.3} by the smallest in-sample one-step mean squared error
 * (common practice: small constants, 0.05–0.3, as in the papers' own experiments).
 */
export interface SbaState {
  /** 'sba' (this file) or 'tsb' (Teunter, Syntetos & Babai 2011, tsb.ts); both keep this shape. */
  method: 'sba' | 'tsb';
  /** Smoothing constant of the demand sizes. */
  alpha: number;
  /** TSB only: smoothing constant of the demand probability, updated every week. */
  beta?: number;
  size: number;
  /** Mean weeks between demands (for TSB 1 / the demand probability). */
  interval: number;
  /** Forecast per week. */
  forecast: number;
  /** In-sample one-step error variance (mean of squared errors after the warm-up). */
  errorVariance: number;
  /** Number of one-step errors behind errorVariance. */
  errorCount: number;
  /** In-sample forecasts made before each week (NaN until the first demand). */
  fitted: number[];
  /** Squared errors of the method's own in-sample sums over k weeks, k = 1…: mean per k (NaN if none). */
  windowErrorVariance: number[];
}

const ALPHAS = [0.05, 0.1, 0.2, 0.3];
const MAX_WINDOW = 26;

export function fitSba(y: ArrayLike<number>): SbaState {
  let best: SbaState | null = null;
  for (const alpha of ALPHAS) {
    const s = runSba(y, alpha);
    if (!best || s.errorVariance < best.errorVariance) best = s;
  }
  return best!;
}

export function runSba(y: ArrayLike<number>, alpha: number): SbaState {
  const n = y.length;
  const fitted = new Array<number>(n).fill(Number.NaN);
  let z = Number.NaN;
  let p = Number.NaN;
  let since = 0;
  let f = Number.NaN;
  let firstDemand = -1;
  let meanAll = 0;
  let observed = 0;
  for (let t = 0; t < n; t++) {
    if (Number.isFinite(y[t])) {
      meanAll += y[t];
      observed++;
    }
  }
  meanAll = observed > 0 ? meanAll / observed : 0;
  for (let t = 0; t < n; t++) {
    fitted[t] = f;
    const v = y[t];
    if (!Number.isFinite(v)) continue; // a missing week tells nothing about demand
    since++;
    if (v !== 0) {
      if (firstDemand < 0) {
        // Initialise with the first demand and the interval up to it (Croston 1972).
        firstDemand = t;
        z = v;
        p = since;
      } else {
        z += alpha * (v - z);
        p += alpha * (since - p);
      }
      since = 0;
      f = ((1 - alpha / 2) * z) / p;
    }
  }
  if (!Number.isFinite(f)) f = meanAll; // no demand at all: forecast the (zero) mean
  return {
    method: 'sba',
    alpha,
    size: Number.isFinite(z) ? z : 0,
    interval: Number.isFinite(p) ? p : 0,
    forecast: f,
    fitted,
    ...ownErrors(y, fitted, meanAll),
  };
}

/** Observed mean of y (0 when nothing is observed). */
export function observedMean(y: ArrayLike<number>): number {
  let s = 0;
  let m = 0;
  for (let t = 0; t < y.length; t++) {
    if (Number.isFinite(y[t])) {
      s += y[t];
      m++;
    }
  }
  return m > 0 ? s / m : 0;
}

/**
 * A sparse-demand method's uncertainty from its own in-sample errors: one-step errors
 * e_t = y_t − f_{t−1} wherever a forecast exists (after the warm-up) give σ₁² = mean(e_t²); sums of
 * k = 1…26 weeks against k times the forecast made before them give the window variances.
 */
export function ownErrors(
  y: ArrayLike<number>,
  fitted: number[],
  meanAll: number,
): Pick<SbaState, 'errorVariance' | 'errorCount' | 'windowErrorVariance'> {
  const n = y.length;
  let sse = 0;
  let count = 0;
  for (let t = 0; t < n; t++) {
    if (!Number.isFinite(y[t]) || !Number.isFinite(fitted[t])) continue;
    const e = y[t] - fitted[t];
    sse += e * e;
    count++;
  }
  let errorVariance = count > 0 ? sse / count : 0;
  if (!(errorVariance > 0)) errorVariance = fallbackVariance(y, meanAll);
  const windowErrorVariance: number[] = [];
  for (let k = 1; k <= MAX_WINDOW; k++) {
    let s2 = 0;
    let m = 0;
    for (let t = 0; t + k <= n; t++) {
      const origin = fitted[t];
      if (!Number.isFinite(origin)) continue;
      let sum = 0;
      let ok = true;
      for (let j = 0; j < k; j++) {
        if (!Number.isFinite(y[t + j])) {
          ok = false;
          break;
        }
        sum += y[t + j];
      }
      if (!ok) continue;
      const e = sum - k * origin;
      s2 += e * e;
      m++;
    }
    // Overlapping windows: trust the estimate only with several independent stretches.
    windowErrorVariance.push(m >= 4 * k && m >= 8 ? s2 / m : Number.NaN);
  }
  return { errorVariance, errorCount: count, windowErrorVariance };
}

function fallbackVariance(y: ArrayLike<number>, mean: number): number {
  let s = 0;
  let m = 0;
  for (let t = 0; t < y.length; t++) {
    if (!Number.isFinite(y[t])) continue;
    s += (y[t] - mean) ** 2;
    m++;
  }
  const v = m > 1 ? s / (m - 1) : 0;
  // Never return a zero variance: a tiny floor relative to the level keeps intervals finite.
  return v > 0 ? v : Math.max(1e-6, (mean * mean) / 100);
}

/** Variance of the error of the sum of future weeks from..to (inclusive), from the method's own errors. */
export function sbaWindowVariance(state: SbaState, from: number, to: number): number {
  const k = to - from + 1;
  if (k <= 0) return 0;
  const v = k <= state.windowErrorVariance.length ? state.windowErrorVariance[k - 1] : Number.NaN;
  // The sum's error variance can only grow with more weeks; never below k·σ₁².
  const floor = k * state.errorVariance;
  return Number.isFinite(v) ? Math.max(v, floor) : floor;
}
