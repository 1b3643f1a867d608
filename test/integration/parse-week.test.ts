/**
 * The CSV reader's week cells (app/cli/fit-csv.ts, parseWeek). Check values: the calendar itself,
 * through JavaScript's Date.UTC (day numbers count from 1970-01-01); 2024 is a leap year, 2023 not.
 */
import { describe, expect, it } from 'vitest';
import { parseWeek } from '../../app/cli/fit-csv';

const day = (y: number, m: number, d: number): number => Date.UTC(y, m - 1, d) / 86400000;

describe('parseWeek', () => {
  it('reads real ISO dates', () => {
    expect(parseWeek('2024-02-29')).toBe(day(2024, 2, 29));
    expect(parseWeek('2024-04-30')).toBe(day(2024, 4, 30));
    expect(parseWeek('1999-12-31')).toBe(day(1999, 12, 31));
  });
  it('rejects impossible dates and any non-digit', () => {
    for (const t of ['2023-02-29', '2024-04-31', '2024-13-01', '2024-00-10', '2024-01-00', '2024-01-32']) {
      expect(parseWeek(t)).toBeNull();
    }
    for (const t of ['2024-1a-03', '20x4-01-01', '2024-01-0/', '2024/01/01', ' 024-01-01']) {
      expect(parseWeek(t)).toBeNull();
    }
  });
});
