/**
 * Reading inventory positions: one row per SKU with on hand, on order and backorders (empty on
 * order / backorders = 0) and an optional as-of date. A negative on-hand figure is kept with a
 * warning (some systems post sales before receipts); negative on order or backorders are errors.
 */
import type { InventoryPosition } from '../../core/plan/types';
import { formatIsoDate } from '../../core/series/calendar';
import { type RowContext, uniqueSku } from './context';

export class StockCollector {
  readonly positions = new Map<string, InventoryPosition>();
  private readonly lineOf = new Map<string, number>();

  constructor(private readonly ctx: RowContext) {}

  row(cells: string[], line: number): void {
    const ctx = this.ctx;
    const r = ctx.report;
    const sku = uniqueSku(ctx, this.lineOf, cells, line, 'a stock file');
    if (sku === null) return;
    const onHand = ctx.number(cells, 'on_hand', line);
    if (onHand === null) r.error(line, ctx.header('on_hand'), null, 'the on-hand quantity is empty');
    const onOrder = ctx.number(cells, 'on_order', line, 0);
    const backorders = ctx.number(cells, 'backorders', line, 0);
    const asOf = ctx.has('as_of') ? ctx.date(cells, 'as_of', line) : null;
    for (const [field, v] of [
      ['on_order', onOrder],
      ['backorders', backorders],
    ] as const) {
      if (typeof v === 'number' && v < 0)
        r.error(line, ctx.header(field), ctx.cell(cells, field), 'cannot be negative');
    }
    if (typeof onHand === 'number' && onHand < 0) {
      r.warn(
        'negative-on-hand',
        sku,
        (n, ex) => `${n} items have a negative on-hand quantity, kept as it is (${ex})`,
      );
    }
    if (
      typeof onHand !== 'number' ||
      typeof onOrder !== 'number' ||
      typeof backorders !== 'number' ||
      asOf === undefined
    )
      return;
    if (onOrder < 0 || backorders < 0) return;
    this.positions.set(sku, {
      onHand,
      onOrder,
      backorders,
      asOf: asOf === null ? null : formatIsoDate(asOf),
    });
  }
}
