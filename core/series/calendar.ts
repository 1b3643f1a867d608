/**
 * The weekly calendar on plain day numbers (days since 1970-01-01, proleptic Gregorian, no time zone),
 * so that a week never shifts with the machine's clock settings.
 *
 * A week starts on `weekStartDay` (1 = Monday … 7 = Sunday). With Monday this is the ISO 8601 week
 * (ISO 8601-1:2019, §3.1.1.23 "calendar week"; week 1 is the week that holds the year's first Thursday).
 * Civil-date ↔ day-number conversion after Hinnant, "chrono-Compatible Low-Level Date Algorithms" (2013).
 */

/** Days since 1970-01-01 of a civil date; month 1–12. */
export function dayNumber(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** The civil date of a day number. */
export function civilDate(days: number): { year: number; month: number; day: number } {
  const z = days + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor(
    (doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365,
  );
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

export function daysInMonth(year: number, month: number): number {
  return (
    dayNumber(month === 12 ? year + 1 : year, month === 12 ? 1 : month + 1, 1) - dayNumber(year, month, 1)
  );
}

/** True when year/month/day name a real date. */
export function isValidCivilDate(year: number, month: number, day: number): boolean {
  return (
    Number.isInteger(year) &&
    Number.isInteger(month) &&
    Number.isInteger(day) &&
    month >= 1 &&
    month <= 12 &&
    day >= 1 &&
    day <= daysInMonth(year, month)
  );
}

/** 1 = Monday … 7 = Sunday (ISO 8601 numbering); 1970-01-01 was a Thursday. */
export function weekdayOf(days: number): number {
  return ((((days + 3) % 7) + 7) % 7) + 1;
}

/** Day number of the first day of the week holding `days`, weeks starting on `weekStartDay`. */
export function weekStartOf(days: number, weekStartDay = 1): number {
  const back = (((weekdayOf(days) - weekStartDay) % 7) + 7) % 7;
  return days - back;
}

/** YYYY-MM-DD of a day number. */
export function formatIsoDate(days: number): string {
  const { year, month, day } = civilDate(days);
  return `${String(year).padStart(4, '0')}-${month < 10 ? '0' : ''}${month}-${day < 10 ? '0' : ''}${day}`;
}

/** Day number of a strict YYYY-MM-DD string, or null when it is not a real date. */
export function parseIsoDate(text: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return null;
  const y = +m[1];
  const mo = +m[2];
  const d = +m[3];
  return isValidCivilDate(y, mo, d) ? dayNumber(y, mo, d) : null;
}

/**
 * Day number of the Monday that starts ISO week `week` of ISO year `isoYear` (ISO 8601: week 1
 * holds 4 January), or null when the year has no such week.
 */
export function isoWeekMonday(isoYear: number, week: number): number | null {
  if (!Number.isInteger(week) || week < 1 || week > 53) return null;
  const jan4 = dayNumber(isoYear, 1, 4);
  const monday = weekStartOf(jan4, 1) + (week - 1) * 7;
  return isoWeekOf(monday).year === isoYear ? monday : null;
}

/** ISO 8601 week-numbering year and week of a day (the week of its Thursday). */
export function isoWeekOf(days: number): { year: number; week: number } {
  const thursday = weekStartOf(days, 1) + 3;
  const year = civilDate(thursday).year;
  const week = Math.floor((thursday - dayNumber(year, 1, 1)) / 7) + 1;
  return { year, week };
}

/** Number of whole weeks from week start `a` to week start `b` (both day numbers of week starts). */
export function weeksBetween(a: number, b: number): number {
  return Math.round((b - a) / 7);
}

/** ISO date string `weeks` weeks after the ISO date `isoDate`. */
export function addWeeks(isoDate: string, weeks: number): string {
  const d = parseIsoDate(isoDate);
  if (d === null) throw new Error(`addWeeks: '${isoDate}' is not a YYYY-MM-DD date`);
  return formatIsoDate(d + 7 * weeks);
}
