/**
 * Gap filling of a weekly series: from sparse (week, qty) observations to the contiguous
 * `WeeklyHistory` the engine reads, one entry per week from the first to the last week. A week with
 * no observation, or one marked stocked out (its sales understate demand), becomes null, a missing
 * observation the Kalman filter skips (Harvey 1989, Forecasting, Structural Time Series Models and
 * the Kalman Filter, §3.4.7).
 */
import type { WeeklyHistory } from '../plan/types';
import { formatIsoDate, parseIsoDate } from './calendar';

export interface WeekObservation {
  weekStart: string;
  qty: number | null;
  stockout?: boolean;
}

/**
 * Contiguous history. `from`/`to` (week-start ISO dates) widen or narrow the span; by default it runs
 * from the first to the last observation. Observations must fall on week starts 7 days apart.
 */
export function fillWeeklyGaps(
  observations: readonly WeekObservation[],
  span: { from?: string; to?: string } = {},
): WeeklyHistory {
  const days = observations.map((o) => {
    const d = parseIsoDate(o.weekStart);
    if (d === null) throw new Error(`fillWeeklyGaps: '${o.weekStart}' is not a YYYY-MM-DD date`);
    return d;
  });
  let first = Number.POSITIVE_INFINITY;
  let last = Number.NEGATIVE_INFINITY;
  for (const d of days) {
    if (d < first) first = d;
    if (d > last) last = d;
  }
  if (span.from !== undefined) first = parseIsoDate(span.from) ?? first;
  if (span.to !== undefined) last = parseIsoDate(span.to) ?? last;
  if (!Number.isFinite(first) || !Number.isFinite(last) || last < first) return { weekStart: [], qty: [] };
  const n = Math.floor((last - first) / 7) + 1;
  const weekStart = new Array<string>(n);
  const qty = new Array<number | null>(n).fill(null);
  for (let i = 0; i < n; i++) weekStart[i] = formatIsoDate(first + 7 * i);
  for (let k = 0; k < observations.length; k++) {
    const offset = days[k] - first;
    if (offset < 0 || days[k] > last) continue;
    if (offset % 7 !== 0) {
      throw new Error(`fillWeeklyGaps: '${observations[k].weekStart}' is not a week start of this series`);
    }
    const o = observations[k];
    qty[offset / 7] = o.stockout ? null : o.qty;
  }
  return { weekStart, qty };
}
