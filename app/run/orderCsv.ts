/**
 * The order list as CSV (RFC 4180: comma-separated, CRLF line ends, a field quoted when it holds a
 * comma, a double quote, a line break or leading/trailing space, a quote inside doubled). Columns,
 * in this order: supplier, sku, description, order_qty, case_packs, reorder_point, order_up_to,
 * safety_stock, interval_forecast, interval_sd, service_level, service_kind, flags (codes, ';'-
 * separated), explanation. Quantities are written with at most 3 decimals (whole units stay whole).
 */
import type { StoredOrderLine, SupplierOrderGroup } from '../store/runs';

export const ORDER_CSV_COLUMNS = [
  'supplier',
  'sku',
  'description',
  'order_qty',
  'case_packs',
  'reorder_point',
  'order_up_to',
  'safety_stock',
  'interval_forecast',
  'interval_sd',
  'service_level',
  'service_kind',
  'flags',
  'explanation',
] as const;

export function csvField(value: string): string {
  return /[",\r\n]|^\s|\s$/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

function num(x: number, decimals = 3): string {
  if (!Number.isFinite(x)) return '';
  const f = 10 ** decimals;
  const r = Math.round(x * f) / f;
  return String(Object.is(r, -0) ? 0 : r);
}

export function orderCsvRow(line: StoredOrderLine): string {
  const cells = [
    line.supplier ?? '',
    line.sku,
    line.description,
    num(line.orderQty),
    num(line.casePacks),
    num(line.reorderPoint),
    num(line.orderUpTo),
    num(line.safetyStock),
    num(line.intervalForecast),
    num(line.intervalSd),
    num(line.serviceLevel, 4),
    line.serviceKind,
    line.flags.join(';'),
    line.explanation,
  ];
  return cells.map(csvField).join(',');
}

export function orderCsv(groups: readonly SupplierOrderGroup[]): string {
  const rows = [ORDER_CSV_COLUMNS.join(',')];
  for (const g of groups) for (const line of g.lines) rows.push(orderCsvRow(line));
  return `${rows.join('\r\n')}\r\n`;
}
