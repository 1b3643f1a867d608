/**
 * Aggregation of dated demand lines to weekly buckets: the week of a line is the week (starting on
 * `weekStartDay`, 1 = Monday as in ISO 8601) that holds its date; quantities of one week are summed.
 * A week is marked stocked out when any of its lines is.
 */
import { formatIsoDate, weekStartOf } from './calendar';

export interface DatedLine {
  /** Day number (days since 1970-01-01). */
  day: number;
  qty: number;
  stockout?: boolean;
}

export interface WeekTotal {
  weekStart: string;
  qty: number;
  stockout: boolean;
}

/** Sum dated lines into weeks, ordered by week. */
export function aggregateToWeeks(lines: readonly DatedLine[], weekStartDay = 1): WeekTotal[] {
  const byWeek = new Map<number, { qty: number; stockout: boolean }>();
  for (const line of lines) {
    const w = weekStartOf(line.day, weekStartDay);
    const cell = byWeek.get(w);
    if (cell) {
      cell.qty += line.qty;
      cell.stockout ||= line.stockout === true;
    } else byWeek.set(w, { qty: line.qty, stockout: line.stockout === true });
  }
  return [...byWeek.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([w, c]) => ({ weekStart: formatIsoDate(w), qty: c.qty, stockout: c.stockout }));
}
