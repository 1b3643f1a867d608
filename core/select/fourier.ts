/**
 * Fourier regressors for an annual cycle on weekly data: for k = 1…K the pair
 *   sin(2π k t / m), cos(2π k t / m),  m = 365.25 / 7 weeks per year,
 * with t the week's position in continuous time measured from the calendar date of its first day
 * (days since 2000-01-03 divided by 7). Using the date, not the row number, keeps the phase right for
 * any history start and lets future weeks continue the same cycle (harmonic regression, e.g.
 * Hyndman & Athanasopoulos, Forecasting: Principles and Practice, §12.1 "dynamic harmonic regression").
 */
export const WEEKS_PER_YEAR = 365.25 / 7;
const EPOCH = Date.UTC(2000, 0, 3);
const DAY_MS = 86_400_000;

export function weekTime(isoDate: string): number {
  const ms = Date.parse(`${isoDate.slice(0, 10)}T00:00:00Z`);
  if (!Number.isFinite(ms)) throw new RangeError(`bad week date '${isoDate}' (want YYYY-MM-DD)`);
  return (ms - EPOCH) / DAY_MS / 7;
}

/** Week times for the history and, optionally, `horizon` further weeks 7 days apart. */
export function weekTimes(weekStart: readonly string[], horizon = 0): Float64Array {
  const n = weekStart.length;
  const out = new Float64Array(n + horizon);
  for (let i = 0; i < n; i++) out[i] = weekTime(weekStart[i]);
  const last = n > 0 ? out[n - 1] : 0;
  for (let h = 1; h <= horizon; h++) out[n + h - 1] = last + h;
  return out;
}

/** 2K columns in the order sin_1, cos_1, sin_2, cos_2, …, each of length times.length. */
export function fourierColumns(times: ArrayLike<number>, harmonics: number): Float64Array[] {
  const cols: Float64Array[] = [];
  for (let k = 1; k <= harmonics; k++) {
    const s = new Float64Array(times.length);
    const c = new Float64Array(times.length);
    const w = (2 * Math.PI * k) / WEEKS_PER_YEAR;
    for (let i = 0; i < times.length; i++) {
      s[i] = Math.sin(w * times[i]);
      c[i] = Math.cos(w * times[i]);
    }
    cols.push(s, c);
  }
  return cols;
}

/** Future columns for steps 1…horizon after the last history week. */
export function futureFourierColumns(
  weekStart: readonly string[],
  harmonics: number,
  horizon: number,
): Float64Array[] {
  const last = weekStart.length > 0 ? weekTime(weekStart[weekStart.length - 1]) : 0;
  const t = new Float64Array(horizon);
  for (let h = 1; h <= horizon; h++) t[h - 1] = last + h;
  return fourierColumns(t, harmonics);
}
