import type { FlagCode } from '../diagnose/flags';
import type { Flag, ForecastTracking } from './types';

/**
 * Smoothed tracking signal (Trigg 1964, "Monitoring a forecasting system", Operational Research
 * Quarterly 15): with forecast errors e_t = actual − forecast,
 *   E_t = α e_t + (1 − α) E_{t−1},   M_t = α |e_t| + (1 − α) M_{t−1},   T_t = E_t / M_t ∈ [−1, 1].
 * Start: E_0 = 0 and M_0 = √(2/π)·se of the first forecast (the mean absolute value of a normal error
 * with that standard error), or |e_1| when no se is known.
 * Limit: for unbiased independent normal errors E_t has variance σ²α/(2 − α) and M_t ≈ σ√(2/π), so
 * T_t has a standard deviation of about √(α/(2 − α)) / √(2/π); the limit is 1.96 times that
 * (0.56 for α = 0.1, which agrees with the 95% control limit Trigg tabulated to our memory).
 */
export const TRACKING_ALPHA = 0.1;
/** Fewer matched weeks than this and no verdict is given (common practice: a quarter of weeks). */
export const TRACKING_MIN_WEEKS = 8;

export function trackingLimit(alpha: number): number {
  return (1.959963985 * Math.sqrt(alpha / (2 - alpha))) / Math.sqrt(2 / Math.PI);
}

export interface TrackedForecast {
  week: string;
  mean: number;
  se: number;
}

/**
 * Match past forecasts with observed weeks (later duplicates of a week are ignored), in date order,
 * and compute the tracking signal. Null when no forecast meets an observation.
 */
export function trackForecasts(
  past: readonly TrackedForecast[],
  weekStart: readonly string[],
  qty: readonly (number | null)[],
  alpha = TRACKING_ALPHA,
): ForecastTracking | null {
  const actual = new Map<string, number>();
  for (let i = 0; i < weekStart.length; i++) {
    const v = qty[i];
    if (typeof v === 'number' && Number.isFinite(v)) actual.set(weekStart[i], v);
  }
  const seen = new Set<string>();
  const rows: { week: string; e: number; se: number }[] = [];
  for (const f of past) {
    if (seen.has(f.week) || !Number.isFinite(f.mean)) continue;
    const a = actual.get(f.week);
    if (a === undefined) continue;
    seen.add(f.week);
    rows.push({ week: f.week, e: a - f.mean, se: f.se });
  }
  if (rows.length === 0) return null;
  rows.sort((x, y) => (x.week < y.week ? -1 : x.week > y.week ? 1 : 0));
  let E = 0;
  let M =
    Number.isFinite(rows[0].se) && rows[0].se > 0 ? Math.sqrt(2 / Math.PI) * rows[0].se : Math.abs(rows[0].e);
  let sum = 0;
  for (const r of rows) {
    E = alpha * r.e + (1 - alpha) * E;
    M = alpha * Math.abs(r.e) + (1 - alpha) * M;
    sum += r.e;
  }
  return {
    count: rows.length,
    bias: sum / rows.length,
    trackingSignal: M > 0 ? E / M : 0,
    limit: trackingLimit(alpha),
    alpha,
  };
}

/** The review flag when the signal is beyond its limit with enough weeks behind it. */
export function forecastBiasFlag(t: ForecastTracking | null): Flag | null {
  if (!t || t.count < TRACKING_MIN_WEEKS || Math.abs(t.trackingSignal) <= t.limit) return null;
  const low = t.trackingSignal > 0;
  return {
    code: 'forecast-bias' satisfies FlagCode,
    severity: 'warning',
    reason:
      `Over the last ${t.count} observed weeks the forecasts ran ${low ? 'below' : 'above'} actual demand ` +
      `by ${Math.abs(t.bias).toPrecision(3)} units a week on average (tracking signal ` +
      `${t.trackingSignal.toFixed(2)}, limit ±${t.limit.toFixed(2)}).`,
    action: low
      ? 'Check for rising demand (new customer, listing); raise the forecast or review the model.'
      : 'Check for falling demand (lost customer, substitution); lower the forecast or review the model.',
  };
}
