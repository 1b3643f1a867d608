/**
 * What every row reader of one import shares: the mapping, the number and date conventions of the
 * file, the report, and cell access by field.
 */
import { type DateOrder, pairDay, readDate } from './dates';
import type { ColumnMapping } from './fields';
import type { DecimalMark } from './numbers';
import { parseNumber } from './numbers';
import type { Report } from './report';

/** Thrown by a row reader when a date needs the day/month order and it is not known yet. */
export class NeedDateOrder extends Error {
  constructor() {
    super('date order needed');
  }
}

export class RowContext {
  private readonly dateCache = new Map<string, number | string>();

  constructor(
    readonly mapping: ColumnMapping,
    readonly report: Report,
    readonly decimal: DecimalMark,
    readonly dateOrder: DateOrder | null,
    readonly weekStartDay: number,
  ) {}

  has(field: string): boolean {
    return this.mapping.columnOf.has(field);
  }

  /** Trimmed cell of a field ('' when the column is absent). */
  cell(cells: string[], field: string): string {
    const i = this.mapping.columnOf.get(field);
    if (i === undefined) return '';
    const v = cells[i];
    return v === undefined ? '' : v.trim();
  }

  header(field: string): string {
    return this.mapping.headers[this.mapping.columnOf.get(field)!];
  }

  /** A number cell; reports and returns null when it is not one. Empty gives `empty`. */
  number(
    cells: string[],
    field: string,
    line: number,
    empty: number | null = null,
  ): number | null | undefined {
    const text = this.cell(cells, field);
    if (text === '') return empty;
    const v = parseNumber(text, this.decimal);
    if (typeof v === 'string') {
      this.report.error(line, this.header(field), text, v);
      return undefined;
    }
    return v;
  }

  /** A date cell as a day number; undefined (reported) when invalid; null when empty. */
  date(cells: string[], field: string, line: number): number | null | undefined {
    const text = this.cell(cells, field);
    if (text === '') return null;
    let v = this.dateCache.get(text);
    if (v === undefined) {
      const d = readDate(text);
      if (d.kind === 'day') v = d.day;
      else if (d.kind === 'error') v = d.reason;
      else if (this.dateOrder === null) throw new NeedDateOrder();
      else {
        v =
          pairDay(d, this.dateOrder) ??
          `is not a real date read as ${this.dateOrder === 'dmy' ? 'day/month/year' : 'month/day/year'}`;
      }
      this.dateCache.set(text, v);
    }
    if (typeof v === 'string') {
      this.report.error(line, this.header(field), text, v);
      return undefined;
    }
    return v;
  }
}

/**
 * The SKU of a row of a file that lists each SKU once (item master, stock): null, with the error
 * reported, when the cell is empty or the SKU appeared on an earlier line.
 */
export function uniqueSku(
  ctx: RowContext,
  seen: Map<string, number>,
  cells: string[],
  line: number,
  fileName: string,
): string | null {
  const sku = ctx.cell(cells, 'sku');
  if (sku === '') {
    ctx.report.error(line, ctx.header('sku'), null, 'the SKU is empty');
    return null;
  }
  const first = seen.get(sku);
  if (first !== undefined) {
    ctx.report.error(
      line,
      ctx.header('sku'),
      sku,
      `appears again (first on line ${first}); ${fileName} lists each SKU once`,
    );
    return null;
  }
  seen.set(sku, line);
  return sku;
}
