import { sampleAutocovariance } from '../arma/sampleAutocovariance';
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
  const c = sampleAutocovariance(e, h, false, scratchBlock([h + 1])[0]);
  const c0 = c[0];
  if (!(c0 > 0)) return { statistic: 0, lags: h, df, pValue: 1, n };
  let q = 0;
  for (let k = 1; k <= h; k++) {
    const r = c[k] / c0;
    q += (r * r) / (n - k);
  }
  q *= n * (n + 2);
  return { statistic: q, lags: h, df, pValue: chiSquareUpperTail(q, df), n };
}
