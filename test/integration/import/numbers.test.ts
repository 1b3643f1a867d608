import { describe, expect, it } from 'vitest';
import { pairDay, pairEvidence, readDate } from '../../../app/import/dates';
import { normaliseHeader } from '../../../app/import/fields';
import { parseFlag, parseNumber } from '../../../app/import/numbers';
import { dayNumber } from '../../../core/series/calendar';

describe('numbers as exports write them', () => {
  it.each([
    ['12', '.', 12],
    ['-3.25', '.', -3.25],
    ['1,234', '.', 1234],
    ['1,234,567.5', '.', 1234567.5],
    ['1.234,5', ',', 1234.5],
    ['1.234.567,89', ',', 1234567.89],
    ['12,5', ',', 12.5],
    ['1\u00a0234,5', ',', 1234.5], // non-breaking space as thousands separator (common practice in French exports)
    ["1'234.5", '.', 1234.5], // apostrophe (common practice in Swiss exports)
    ['(12)', '.', -12], // accounting negative
    ['12-', '.', -12], // trailing minus
    ['+7', '.', 7],
  ] as const)('%s with decimal %s is %d', (text, mark, value) => {
    expect(parseNumber(text, mark)).toBe(value);
  });
  it.each([
    ['12,5', '.', 'a decimal comma?'],
    ['12.5', ',', 'a decimal point?'],
    ['1,23,4', '.', 'badly placed thousands separator'],
    ['1.2.3', '.', 'more than one decimal mark'],
    ['abc', '.', 'is not a number'],
    ['12kg', '.', 'is not a number'],
  ] as const)('%s with decimal %s is refused (%s)', (text, mark, why) => {
    expect(parseNumber(text, mark)).toContain(why);
  });
  it('reads yes/no marks', () => {
    expect(['1', 'YES', 'y', 'True', 'x'].map(parseFlag)).toEqual([true, true, true, true, true]);
    expect(['0', 'no', 'N', 'false', ''].map(parseFlag)).toEqual([false, false, false, false, false]);
    expect(parseFlag('maybe')).toBeNull();
  });
});

describe('dates and headers', () => {
  it('reads ISO dates, ISO week dates and day/month pairs', () => {
    expect(readDate('2026-11-23')).toEqual({ kind: 'day', day: dayNumber(2026, 11, 23) });
    expect(readDate('2026/11/23')).toEqual({ kind: 'day', day: dayNumber(2026, 11, 23) });
    // ISO 8601 week date 2026-W48-1 is Monday 23 November 2026 (calendar of 2026).
    expect(readDate('2026-W48')).toEqual({ kind: 'day', day: dayNumber(2026, 11, 23) });
    expect(readDate('2026W483')).toEqual({ kind: 'day', day: dayNumber(2026, 11, 25) });
    const pair = readDate('03.11.2026');
    expect(pair).toEqual({ kind: 'pair', a: 3, b: 11, year: 2026 });
    if (pair.kind !== 'pair') throw new Error('pair expected');
    expect(pairDay(pair, 'dmy')).toBe(dayNumber(2026, 11, 3));
    expect(pairDay(pair, 'mdy')).toBe(dayNumber(2026, 3, 11));
    expect(pairEvidence({ a: 13, b: 1, year: 2026 })).toBe('dmy');
    expect(pairEvidence({ a: 1, b: 13, year: 2026 })).toBe('mdy');
    expect(pairEvidence({ a: 31, b: 31, year: 2026 })).toBe('none');
    expect(readDate('23 Nov 2026').kind).toBe('error');
  });
  it('normalises header names', () => {
    expect(normaliseHeader('  Lead Time (weeks) ')).toBe('lead_time_weeks');
    expect(normaliseHeader('Item #')).toBe('item_no');
    expect(normaliseHeader('ITEM-CODE')).toBe('item_code');
  });
});
