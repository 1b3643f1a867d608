/**
 * Reading dates from exports. ISO 8601 (YYYY-MM-DD, optionally with a time, also YYYY/MM/DD, and ISO
 * week dates YYYY-Www) is always accepted. Day/month/year and month/day/year (separators / . -, four-
 * digit year) are accepted only once the order is known: given by the user, or proven by the file
 * (a first number above 12 can only be a day, a second number above 12 only a day too).
 */
import { dayNumber, isoWeekMonday, isValidCivilDate } from '../../core/series/calendar';

export type DateOrder = 'dmy' | 'mdy';

export type DateCell =
  | { kind: 'day'; day: number }
  /** Two numbers and a year whose order is not known yet. */
  | { kind: 'pair'; a: number; b: number; year: number }
  | { kind: 'error'; reason: string };

const ISO = /^(\d{4})[-/](\d{2})[-/](\d{2})(?:[T ].*)?$/;
const ISO_WEEK = /^(\d{4})-?W(\d{2})(?:-?([1-7]))?$/i;
const PAIR = /^(\d{1,2})[./-](\d{1,2})[./-](\d{2}|\d{4})(?:[T ,].*)?$/;

function checkYear(y: number): string | null {
  return y < 1900 || y > 2999 ? `the year ${y} is out of range (1900–2999)` : null;
}

export function readDate(text: string): DateCell {
  let m = ISO.exec(text);
  if (m) {
    const y = +m[1];
    const mo = +m[2];
    const d = +m[3];
    const bad = checkYear(y);
    if (bad) return { kind: 'error', reason: bad };
    if (!isValidCivilDate(y, mo, d)) return { kind: 'error', reason: 'is not a real date' };
    return { kind: 'day', day: dayNumber(y, mo, d) };
  }
  m = ISO_WEEK.exec(text);
  if (m) {
    const monday = isoWeekMonday(+m[1], +m[2]);
    if (monday === null) return { kind: 'error', reason: `ISO year ${m[1]} has no week ${m[2]}` };
    return { kind: 'day', day: monday + (m[3] ? +m[3] - 1 : 0) };
  }
  m = PAIR.exec(text);
  if (m) {
    if (m[3].length === 2)
      return { kind: 'error', reason: 'has a two-digit year; write the year with four digits' };
    const y = +m[3];
    const bad = checkYear(y);
    if (bad) return { kind: 'error', reason: bad };
    return { kind: 'pair', a: +m[1], b: +m[2], year: y };
  }
  return { kind: 'error', reason: 'is not a date (expected YYYY-MM-DD, or DD/MM/YYYY / MM/DD/YYYY)' };
}

/** Day number of a pair read in the given order, or null when that is not a real date. */
export function pairDay(cell: { a: number; b: number; year: number }, order: DateOrder): number | null {
  const [d, mo] = order === 'dmy' ? [cell.a, cell.b] : [cell.b, cell.a];
  return isValidCivilDate(cell.year, mo, d) ? dayNumber(cell.year, mo, d) : null;
}

/** What one pair says about the order: only dmy possible, only mdy, both, or neither. */
export function pairEvidence(cell: { a: number; b: number; year: number }): 'dmy' | 'mdy' | 'both' | 'none' {
  const dmy = pairDay(cell, 'dmy') !== null;
  const mdy = pairDay(cell, 'mdy') !== null;
  if (dmy && mdy) return 'both';
  return dmy ? 'dmy' : mdy ? 'mdy' : 'none';
}
