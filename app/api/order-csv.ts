/**
 * The order list as CSV (RFC 4180 quoting: a field with a comma, quote or line break is quoted and
 * its quotes doubled). The first columns are those of the command line's `plan` export; the last
 * two say what the run suggested and why the planner changed it.
 */
import type { OrderLine } from './contract';

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
  'suggested_qty',
  'edit_reason',
] as const;

function field(v: string | number | null): string {
  if (v === null) return '';
  const s =
    typeof v === 'number' ? (Number.isInteger(v) ? String(v) : String(Math.round(v * 1000) / 1000)) : v;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function ordersCsv(lines: readonly OrderLine[]): string {
  const out = [ORDER_CSV_COLUMNS.join(',')];
  for (const l of lines) {
    out.push(
      [
        l.supplier ?? '',
        l.sku,
        l.description,
        l.orderQty,
        l.casePacks,
        l.reorderPoint,
        l.orderUpTo,
        l.safetyStock,
        l.intervalForecast,
        l.intervalSd,
        l.serviceLevel,
        l.serviceKind,
        l.flags.join(' '),
        l.explanation.join(' '),
        l.suggestedQty,
        l.edit?.reason ?? '',
      ]
        .map(field)
        .join(','),
    );
  }
  return `${out.join('\r\n')}\r\n`;
}
