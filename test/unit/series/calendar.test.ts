import { describe, expect, it } from 'vitest';
import { aggregateToWeeks } from '../../../core/series/aggregate';
import {
  addWeeks,
  civilDate,
  dayNumber,
  formatIsoDate,
  isoWeekMonday,
  isoWeekOf,
  parseIsoDate,
  weekdayOf,
  weekStartOf,
} from '../../../core/series/calendar';
import { fillWeeklyGaps } from '../../../core/series/gaps';

describe('day numbers', () => {
  it('match Unix epoch days', () => {
    // Unix time: 1970-01-01 is day 0; 2000-01-01T00:00Z = 946684800 s = day 10957 (POSIX time definition).
    expect(dayNumber(1970, 1, 1)).toBe(0);
    expect(dayNumber(2000, 1, 1)).toBe(10957);
    // 2026-11-30T00:00Z = 1796083200 s (Date.UTC) = day 20787.
    expect(dayNumber(2026, 11, 30)).toBe(Date.UTC(2026, 10, 30) / 86400000);
    expect(dayNumber(1969, 12, 31)).toBe(-1);
  });
  it('round-trips through civil dates, leap days included', () => {
    for (let d = -30000; d < 60000; d += 37) {
      const c = civilDate(d);
      expect(dayNumber(c.year, c.month, c.day)).toBe(d);
    }
    expect(parseIsoDate('2024-02-29')).toBe(dayNumber(2024, 2, 29));
    expect(parseIsoDate('2023-02-29')).toBeNull(); // 2023 is not a leap year (Gregorian rule)
    expect(parseIsoDate('1900-02-29')).toBeNull(); // century rule: 1900 not a leap year
    expect(parseIsoDate('2000-02-29')).not.toBeNull(); // 400-year rule
  });
  it('knows the weekday', () => {
    // 1970-01-01 was a Thursday; 2026-11-30 is a Monday (calendar of 2026).
    expect(weekdayOf(0)).toBe(4);
    expect(weekdayOf(parseIsoDate('2026-11-30')!)).toBe(1);
    expect(weekdayOf(parseIsoDate('2026-11-29')!)).toBe(7);
  });
});

describe('ISO 8601 weeks', () => {
  // Examples of ISO week-numbering years at their edges (ISO 8601-1:2019 rule: week 1 holds the
  // year's first Thursday); the same examples are printed in the ISO week date article of Wikipedia.
  it.each([
    ['2005-01-01', 2004, 53],
    ['2005-01-02', 2004, 53],
    ['2007-01-01', 2007, 1],
    ['2007-12-30', 2007, 52],
    ['2008-12-29', 2009, 1],
    ['2010-01-03', 2009, 53],
    ['2010-01-04', 2010, 1],
    ['2020-12-31', 2020, 53],
    ['2026-11-23', 2026, 48],
  ])('%s is in %i-W%i', (date, year, week) => {
    expect(isoWeekOf(parseIsoDate(date)!)).toEqual({ year, week });
  });
  it('finds the Monday of a week, and refuses a week that does not exist', () => {
    expect(formatIsoDate(isoWeekMonday(2009, 1)!)).toBe('2008-12-29');
    expect(formatIsoDate(isoWeekMonday(2009, 53)!)).toBe('2009-12-28');
    expect(isoWeekMonday(2010, 53)).toBeNull(); // 2010 has 52 ISO weeks
  });
  it('starts weeks on the configured day', () => {
    const wed = parseIsoDate('2026-11-25')!;
    expect(formatIsoDate(weekStartOf(wed, 1))).toBe('2026-11-23'); // Monday start
    expect(formatIsoDate(weekStartOf(wed, 7))).toBe('2026-11-22'); // Sunday start
    expect(formatIsoDate(weekStartOf(wed, 3))).toBe('2026-11-25'); // Wednesday start: itself
    expect(formatIsoDate(weekStartOf(parseIsoDate('2026-11-22')!, 1))).toBe('2026-11-16');
    expect(addWeeks('2026-11-23', -156 + 1)).toBe('2023-12-04');
  });
});

describe('aggregation and gaps', () => {
  it('sums dated lines into weeks and carries stockout marks', () => {
    const d = (s: string) => parseIsoDate(s)!;
    const weeks = aggregateToWeeks([
      { day: d('2026-11-24'), qty: 3 },
      { day: d('2026-11-29'), qty: 2, stockout: true }, // Sunday: same Monday-week
      { day: d('2026-11-30'), qty: 5 },
      { day: d('2026-11-16'), qty: -1 },
    ]);
    expect(weeks).toEqual([
      { weekStart: '2026-11-16', qty: -1, stockout: false },
      { weekStart: '2026-11-23', qty: 5, stockout: true },
      { weekStart: '2026-11-30', qty: 5, stockout: false },
    ]);
    // With Sunday-start weeks the Sunday line opens a new week.
    expect(aggregateToWeeks([{ day: d('2026-11-29'), qty: 2 }], 7)[0].weekStart).toBe('2026-11-29');
  });
  it('fills gaps and stockouts with null over the requested span', () => {
    const h = fillWeeklyGaps(
      [
        { weekStart: '2026-11-02', qty: 4 },
        { weekStart: '2026-11-16', qty: 1, stockout: true },
        { weekStart: '2026-11-23', qty: 0 },
      ],
      { to: '2026-12-07' },
    );
    expect(h.weekStart).toEqual([
      '2026-11-02',
      '2026-11-09',
      '2026-11-16',
      '2026-11-23',
      '2026-11-30',
      '2026-12-07',
    ]);
    expect(h.qty).toEqual([4, null, null, 0, null, null]);
    expect(fillWeeklyGaps([])).toEqual({ weekStart: [], qty: [] });
    expect(() =>
      fillWeeklyGaps([
        { weekStart: '2026-11-02', qty: 1 },
        { weekStart: '2026-11-05', qty: 1 },
      ]),
    ).toThrow(/not a week start/);
  });
});
