/**
 * Helpers of the fit command's record: week labels (made once per calendar week), and the
 * non-finite-to-null copy (JSON has no NaN or Infinity).
 */
import { describe, expect, it } from 'vitest';
import { choiceRecord, finite, weekStartsFrom } from '../../../core/select/choiceRecord';
import { dayNumber, formatIsoDate } from '../../../core/series/calendar';

describe('weekStartsFrom', () => {
  it('equals formatIsoDate week by week across month, year and leap-day boundaries', () => {
    // Starts around leap years (2000 is one, 1900 and 2100 are not: Gregorian rule) and far dates.
    const starts = [
      dayNumber(1899, 12, 25),
      dayNumber(1999, 12, 27),
      dayNumber(2000, 2, 21),
      dayNumber(2023, 1, 2),
      dayNumber(2096, 2, 20),
      0,
      dayNumber(9990, 1, 1),
    ];
    for (const first of starts) {
      const labels = weekStartsFrom(first, 800);
      for (let i = 0; i < 800; i++) expect(labels[i]).toBe(formatIsoDate(first + 7 * i));
    }
    expect(weekStartsFrom(0, 0)).toEqual([]);
  });
  it('returns the same frozen list again for the same weeks, and a new one for other weeks', () => {
    const first = dayNumber(2023, 1, 2);
    const a = weekStartsFrom(first, 156);
    expect(weekStartsFrom(first, 156)).toBe(a);
    expect(Object.isFrozen(a)).toBe(true);
    const shorter = weekStartsFrom(first, 155);
    expect(shorter).not.toBe(a);
    expect(shorter).toEqual(a.slice(0, 155));
    const later = weekStartsFrom(first + 7, 156);
    expect(later[0]).toBe(a[1]);
    expect(later[155]).toBe(formatIsoDate(first + 7 * 156));
  });
});

describe('finite', () => {
  it('copies plain data with NaN and ±Infinity as null, as JSON.stringify would write them', () => {
    const v = {
      a: Number.NaN,
      b: [1, Number.POSITIVE_INFINITY, -0.5],
      c: { d: null, e: 's', f: true },
      g: undefined,
    };
    const viaJson = JSON.parse(
      JSON.stringify(v, (_k, x) => (typeof x === 'number' && !Number.isFinite(x) ? null : x)),
    );
    expect(finite(v)).toEqual(viaJson);
    expect(finite(new Float64Array([1, Number.NaN]))).toEqual([1, null]);
  });
});

describe('choiceRecord', () => {
  it('labels outlier weeks with the calendar dates of the series', () => {
    const n = 120;
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) y[i] = 100 + 5 * Math.sin(i) + (i % 7);
    y[60] = 400; // one spike far beyond |z| > 4
    const first = dayNumber(2023, 1, 2);
    const rec = choiceRecord('x.csv', y, first, {
      order: { p: 1, d: 0, q: 0 },
      includeMean: undefined,
      horizon: 4,
    });
    const diag = rec.diagnostics as { outliers: { week: string }[] };
    expect(diag.outliers.map((o) => o.week)).toContain(formatIsoDate(first + 7 * 60));
  });
});
