/**
 * Reads one weekly series from a CSV file with a header row (default columns `week` and `qty`).
 * A week is an ISO date (YYYY-MM-DD, the first day of the week) or an ISO week (YYYY-Www); weeks
 * must increase, whole weeks apart, and a skipped week becomes a missing observation, as does an
 * empty quantity cell. Anything else is an error naming the file, the line, the field and the value.
 */
import { readFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { dayNumber, isoWeekMonday } from '../../core/series/calendar';

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

/** A decimal number as a CSV cell may hold it: sign, digits, optional fraction and exponent. */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const ISO_WEEK = /^(\d{4})-?W(\d{2})$/;
/** Exact powers of ten 10^0 … 10^15 (every one is a double exactly). */
const POW10 = Array.from({ length: 16 }, (_, k) => 10 ** k);
const DAYS_IN_MONTH = [0, 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** readFileSync's options as an object: a string is first copied into one on every call. */
const UTF8 = { encoding: 'utf8' } as const;
const DASH = 45;
const DOT = 46;
const CR = 13;

/** Day number of YYYY-MM-DD or YYYY-Www, or null when the text is neither or not a real date. */
export function parseWeek(text: string): number | null {
  return weekAt(text, 0, text.length);
}

/** parseWeek on text[a, b) without cutting it out (the common YYYY-MM-DD read from character codes). */
function weekAt(text: string, a: number, b: number): number | null {
  if (b - a === 10 && text.charCodeAt(a + 4) === DASH && text.charCodeAt(a + 7) === DASH) {
    let y = 0;
    let m = 0;
    let d = 0;
    for (let i = 0; i < 10; i++) {
      if (i === 4 || i === 7) continue;
      const c = text.charCodeAt(a + i) - 48;
      if (c < 0 || c > 9) return null;
      if (i < 4) y = 10 * y + c;
      else if (i < 7) m = 10 * m + c;
      else d = 10 * d + c;
    }
    if (m < 1 || m > 12 || d < 1) return null;
    const leap = m === 2 && y % 4 === 0 && (y % 100 !== 0 || y % 400 === 0);
    if (d > DAYS_IN_MONTH[m] + (leap ? 1 : 0)) return null;
    return dayNumber(y, m, d);
  }
  const w = ISO_WEEK.exec(a === 0 && b === text.length ? text : text.slice(a, b));
  return w ? isoWeekMonday(+w[1], +w[2]) : null;
}

/**
 * The number in text[a, b) (non-empty, trimmed) as Number() reads it, or null when it does not
 * match NUMBER. Plain decimals of at most 15 digits are read from the character codes: the digits
 * form an exact integer below 2^53 and one division by an exact power of ten is correctly rounded
 * (IEEE 754), so the result is the same double Number() gives (Clinger 1990, the fast path). Other
 * forms (exponents, longer digit strings) go through the regular expression and Number().
 */
function numberAt(text: string, a: number, b: number): number | null {
  let i = a;
  let negative = false;
  const s = text.charCodeAt(i);
  if (s === 43 || s === DASH) {
    negative = s === DASH;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fraction = 0;
  let dot = false;
  for (; i < b; i++) {
    const c = text.charCodeAt(i);
    if (c === DOT && !dot) {
      dot = true;
      continue;
    }
    const v = c - 48;
    if (v < 0 || v > 9) break;
    mantissa = 10 * mantissa + v;
    digits++;
    if (dot) fraction++;
  }
  if (i === b && digits > 0 && digits <= 15) {
    const x = mantissa / POW10[fraction];
    return negative ? -x : x;
  }
  const cell = text.slice(a, b);
  return NUMBER.test(cell) ? Number(cell) : null;
}

function isBlank(c: number): boolean {
  // ECMAScript WhiteSpace and LineTerminator, the characters String.prototype.trim removes.
  return (
    c === 32 ||
    (c >= 9 && c <= 13) ||
    (c >= 0xa0 &&
      (c === 0xa0 ||
        c === 0x1680 ||
        (c >= 0x2000 && c <= 0x200a) ||
        c === 0x2028 ||
        c === 0x2029 ||
        c === 0x202f ||
        c === 0x205f ||
        c === 0x3000 ||
        c === 0xfeff))
  );
}

/** Every trimmed field of text[start, end). */
function fieldsOf(text: string, start: number, end: number): string[] {
  return text
    .slice(start, end)
    .split(',')
    .map((f) => f.trim());
}

/** The values while a file is read (one file at a time): grown as needed, reused by every file. */
let values = new Float64Array(256);

/** Collects the weekly values row by row, with the checks (and messages) of the file format. */
class WeeklyBuilder {
  count = 0;
  firstWeek = Number.NaN;
  prevWeek = Number.NaN;
  constructor(
    readonly file: string,
    readonly opts: WeeklyCsvOptions,
  ) {}

  /** One record: its week in w[wa, wb) and its quantity in v[va, vb), both trimmed. */
  add(line: number, w: string, wa: number, wb: number, v: string, va: number, vb: number): void {
    const week = weekAt(w, wa, wb);
    if (week === null) {
      throw new CsvInputError(
        `${this.file}: line ${line}: field '${this.opts.dateColumn}': '${w.slice(wa, wb)}' is not a date (YYYY-MM-DD or YYYY-Www)`,
      );
    }
    let qty = Number.NaN;
    if (vb > va) {
      const x = numberAt(v, va, vb);
      if (x === null) {
        throw new CsvInputError(
          `${this.file}: line ${line}: field '${this.opts.valueColumn}': '${v.slice(va, vb)}' is not a number`,
        );
      }
      qty = x;
    }
    if (Number.isNaN(this.firstWeek)) {
      this.firstWeek = week;
    } else {
      const gap = week - this.prevWeek;
      if (gap <= 0 || gap % 7 !== 0) {
        throw new CsvInputError(
          `${this.file}: line ${line}: field '${this.opts.dateColumn}': '${w.slice(wa, wb)}' is not a later week than the row before ` +
            '(weeks must increase by whole weeks)',
        );
      }
      for (let k = 7; k < gap; k += 7) this.push(Number.NaN);
    }
    this.prevWeek = week;
    this.push(qty);
  }

  private push(x: number): void {
    if (this.count === values.length) {
      const grown = new Float64Array(2 * values.length);
      grown.set(values);
      values = grown;
    }
    values[this.count++] = x;
  }

  result(): WeeklySeries {
    return {
      firstWeek: Number.isNaN(this.firstWeek) ? 0 : this.firstWeek,
      values: values.slice(0, this.count),
    };
  }
}

export function readWeeklyCsv(file: string, opts: WeeklyCsvOptions): WeeklySeries {
  let text: string;
  try {
    text = readFileSync(file, UTF8);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new CsvInputError(
      `${file}: cannot read the file (${code === 'ENOENT' ? 'no such file' : (code ?? String(err))})`,
    );
  }
  const columnsOf = (header: string[]): { di: number; vi: number } => {
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
    return { di, vi };
  };
  const empty = (): CsvInputError =>
    new CsvInputError(`${file}: line 1: the file is empty; expected a header row`);
  const out = new WeeklyBuilder(file, opts);

  if (text.indexOf('"') >= 0) {
    // Anything quoted goes to csv-parse; its records are numbered as they come (line = record + 1).
    let records: string[][];
    try {
      records = parse(text, { bom: true, skip_empty_lines: true, trim: true, relax_column_count: true });
    } catch (err) {
      throw new CsvInputError(`${file}: not a readable CSV file (${(err as Error).message})`);
    }
    if (records.length === 0) throw empty();
    const { di, vi } = columnsOf(records[0]);
    for (let r = 1; r < records.length; r++) {
      const w = records[r][di] ?? '';
      const v = records[r][vi] ?? '';
      out.add(r + 1, w, 0, w.length, v, 0, v.length);
    }
    return out.result();
  }

  // Without a quote character RFC 4180 reduces to commas between fields and line breaks between
  // records. One pass over the text by character codes, cutting nothing out but the header: this
  // runs over every line of thousands of files in one `fit` call. Lines of blanks are skipped;
  // fields are trimmed; a BOM is dropped; lines are counted as they are in the file.
  const len = text.length;
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 0;
  let di = -1;
  let vi = -1;
  let last = -1;
  let nextComma = -1;
  while (pos < len) {
    line++;
    let end = text.indexOf('\n', pos);
    if (end < 0) end = len;
    let stop = end;
    if (stop > pos && text.charCodeAt(stop - 1) === CR) stop--;
    let first = pos;
    while (first < stop && isBlank(text.charCodeAt(first))) first++;
    if (first < stop) {
      if (last < 0) {
        ({ di, vi } = columnsOf(fieldsOf(text, pos, stop)));
        last = Math.max(di, vi);
      } else {
        // Bounds of fields di and vi ([len, len) when the row is shorter: an empty cell).
        let wa = len;
        let wb = len;
        let va = len;
        let vb = len;
        let field = 0;
        let a = pos;
        for (;;) {
          // The next comma from a: found natively, and remembered when it lies past this line
          // (or nowhere), so a run of lines without one is not searched again.
          if (nextComma < a) {
            nextComma = text.indexOf(',', a);
            if (nextComma < 0) nextComma = len;
          }
          const i = Math.min(nextComma, stop);
          if (field === di) {
            wa = a;
            wb = i;
          }
          if (field === vi) {
            va = a;
            vb = i;
          }
          if (++field > last || i === stop) break;
          a = i + 1;
        }
        while (wa < wb && isBlank(text.charCodeAt(wa))) wa++;
        while (wb > wa && isBlank(text.charCodeAt(wb - 1))) wb--;
        while (va < vb && isBlank(text.charCodeAt(va))) va++;
        while (vb > va && isBlank(text.charCodeAt(vb - 1))) vb--;
        out.add(line, text, wa, wb, text, va, vb);
      }
    }
    pos = end + 1;
  }
  if (last < 0) throw empty();
  return out.result();
}
