/**
 * A weekly history as it travels to a worker: the first week's start and the quantities. The run's
 * histories are contiguous weekly series by construction (getWeeklyHistoriesById, gap filling), so the
 * week-start strings are implied and need not be copied for every item; the worker spells them out
 * again with the shared calendar (core/series), one cached array per first week and length.
 */
import type { WeeklyHistory } from '../../core/plan/types';
import { formatIsoDate, parseIsoDate } from '../../core/series/calendar';

export interface CompactHistory {
  /** Start of the first week (YYYY-MM-DD); null for an empty history. */
  firstWeek: string | null;
  qty: (number | null)[];
}

export function compactHistory(h: WeeklyHistory): CompactHistory {
  return { firstWeek: h.weekStart.length > 0 ? h.weekStart[0] : null, qty: h.qty };
}

const calendars = new Map<string, string[]>();

/** The week starts of `weeks` consecutive weeks from `first`. Shared; do not modify. */
function weekStarts(first: string, weeks: number): string[] {
  let cal = calendars.get(first);
  if (!cal || cal.length < weeks) {
    const day = parseIsoDate(first);
    if (day === null) throw new Error(`compact history: '${first}' is not a YYYY-MM-DD date`);
    cal = new Array<string>(Math.max(weeks, cal?.length ?? 0));
    for (let i = 0; i < cal.length; i++) cal[i] = formatIsoDate(day + 7 * i);
    if (calendars.size > 64) calendars.clear();
    calendars.set(first, cal);
  }
  return cal.length === weeks ? cal : cal.slice(0, weeks);
}

export function expandHistory(c: CompactHistory): WeeklyHistory {
  if (c.firstWeek === null || c.qty.length === 0) return { weekStart: [], qty: [] };
  return { weekStart: weekStarts(c.firstWeek, c.qty.length).slice(), qty: c.qty };
}
