/**
 * Reads one weekly series from a CSV file with a header row (default columns `week` and `qty`).
 * A week is an ISO date (YYYY-MM-DD, the first day of the week) or an ISO week (YYYY-Www); weeks
 * must increase, whole weeks apart, and a skipped week becomes a missing observation, as does an
 * empty quantity cell. Anything else is an error naming the file, the line, the field and the value.
 */
import { readFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { isoWeekMonday, parseIsoDate } from '../../core/series/calendar';

export interface WeeklyCsvOptions {
  dateColumn: string;
  valueColumn: string;
}

export interface WeeklySeries {
  /** Day number of the first week. */
  firstWeek: number;
  /** One value per week from the first to the last; NaN = missing week. */
  values: Float64Array;
}

export class CsvInputError extends Error {}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function parseWeek(text: string): number | null {
  const iso = parseIsoDate(text);
  if (iso !== null) return iso;
  const m = /^(\d{4})-?W(\d{2})$/.exec(text);
  return m ? isoWeekMonday(+m[1], +m[2]) : null;
}

/** Rows of a CSV text with no quote characters (BOM dropped, empty lines skipped, fields trimmed). */
export function splitPlainCsv(text: string): string[][] {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const rows: string[][] = [];
  for (const line of body.split('\n')) {
    const clean = line.endsWith('\r') ? line.slice(0, -1) : line;
    if (clean.trim() === '') continue;
    rows.push(clean.split(',').map((f) => f.trim()));
  }
  return rows;
}

export function readWeeklyCsv(file: string, opts: WeeklyCsvOptions): WeeklySeries {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new CsvInputError(
      `${file}: cannot read the file (${code === 'ENOENT' ? 'no such file' : (code ?? String(err))})`,
    );
  }
  let rows: string[][];
  if (text.indexOf('"') < 0) {
    // Without a quote character RFC 4180 reduces to commas between fields and line breaks between
    // records; splitting is several times faster than the general parser, which matters when
    // thousands of files are fitted in one call. Anything quoted goes to csv-parse.
    rows = splitPlainCsv(text);
  } else {
    try {
      rows = parse(text, { bom: true, skip_empty_lines: true, trim: true, relax_column_count: true });
    } catch (err) {
      throw new CsvInputError(`${file}: not a readable CSV file (${(err as Error).message})`);
    }
  }
  if (rows.length === 0) throw new CsvInputError(`${file}: line 1: the file is empty; expected a header row`);
  const header = rows[0];
  const di = header.indexOf(opts.dateColumn);
  const vi = header.indexOf(opts.valueColumn);
  for (const [name, idx, flag] of [
    [opts.dateColumn, di, '--date-column'],
    [opts.valueColumn, vi, '--value-column'],
  ] as const) {
    if (idx < 0) {
      throw new CsvInputError(
        `${file}: line 1: no column '${name}' in the header (${header.join(', ')}); name it with ${flag}`,
      );
    }
  }
  const values: number[] = [];
  let firstWeek = Number.NaN;
  let prevWeek = Number.NaN;
  for (let r = 1; r < rows.length; r++) {
    const row = rows[r];
    const line = r + 1;
    const wText = row[di] ?? '';
    const week = parseWeek(wText);
    if (week === null) {
      throw new CsvInputError(
        `${file}: line ${line}: field '${opts.dateColumn}': '${wText}' is not a date (YYYY-MM-DD or YYYY-Www)`,
      );
    }
    const qText = row[vi] ?? '';
    let qty = Number.NaN;
    if (qText !== '') {
      if (!NUMBER.test(qText)) {
        throw new CsvInputError(
          `${file}: line ${line}: field '${opts.valueColumn}': '${qText}' is not a number`,
        );
      }
      qty = Number(qText);
    }
    if (Number.isNaN(firstWeek)) {
      firstWeek = week;
    } else {
      const gap = week - prevWeek;
      if (gap <= 0 || gap % 7 !== 0) {
        throw new CsvInputError(
          `${file}: line ${line}: field '${opts.dateColumn}': '${wText}' is not a later week than the row before ` +
            '(weeks must increase by whole weeks)',
        );
      }
      for (let k = 7; k < gap; k += 7) values.push(Number.NaN);
    }
    prevWeek = week;
    values.push(qty);
  }
  return { firstWeek: Number.isNaN(firstWeek) ? 0 : firstWeek, values: Float64Array.from(values) };
}
