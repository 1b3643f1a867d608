import { scratchBlock } from '../arma/typedArrays';
import { chiSquareUpperTail } from './chiSquare';

/**
 * Ljung–Box portmanteau statistic Q = n(n+2) Σ_{k=1..h} r_k² / (n−k)
 * (Ljung, G. M. & Box, G. E. P. 1978, Biometrika 65(2)), r_k the lag-k sample autocorrelation of the
 * residuals about their mean, missing residuals (NaN) dropped. Degrees of freedom h − fittedParams
 * (p + q for an ARMA(p,q)), at least 1; p-value from the chi-square upper tail.
 * Lag rule (stated, common practice): h = min(10, ⌊n/5⌋) for non-seasonal data, min(2m, ⌊n/5⌋) with
 * period m otherwise (Hyndman & Athanasopoulos, Forecasting: Principles and Practice, §5.4).
 */
export interface LjungBoxResult {
  statistic: number;
  lags: number;
  df: number;
  pValue: number;
  n: number;
}

export function ljungBoxLags(n: number, period = 0): number {
  const base = period > 1 ? Math.round(2 * period) : 10;
  return Math.max(1, Math.min(base, Math.floor(n / 5)));
}

export function ljungBox(residuals: ArrayLike<number>, lags: number, fittedParams: number): LjungBoxResult {
  let n = 0;
  let sum = 0;
  for (let i = 0; i < residuals.length; i++) {
    if (Number.isFinite(residuals[i])) {
      n++;
      sum += residuals[i];
    }
  }
  const h = Math.max(1, Math.min(lags, n - 1));
  const df = Math.max(1, h - fittedParams);
  if (n < 3) return { statistic: 0, lags: h, df, pValue: 1, n };
  const mean = sum / n;
  // Scratch inside a scope (diagnoseChoice); a plain array outside one.
  const [e] = scratchBlock([n]);
  let j = 0;
  for (let i = 0; i < residuals.length; i++) if (Number.isFinite(residuals[i])) e[j++] = residuals[i] - mean;
  let c0 = 0;
  for (let t = 0; t < n; t++) c0 += e[t] * e[t];
  if (!(c0 > 0)) return { statistic: 0, lags: h, df, pValue: 1, n };
  let q = 0;
  for (let k = 1; k <= h; k++) {
    // Two interleaved partial sums (two independent additions in flight).
    let c1 = 0;
    let c2 = 0;
    let t = k;
    for (; t + 1 < n; t += 2) {
      c1 += e[t] * e[t - k];
      c2 += e[t + 1] * e[t + 1 - k];
    }
    if (t < n) c1 += e[t] * e[t - k];
    const r = (c1 + c2) / c0;
    q += (r * r) / (n - k);
  }
  q *= n * (n + 2);
  return { statistic: q, lags: h, df, pValue: chiSquareUpperTail(q, df), n };
}
