/**
 * The audit log's entries in the planner's words: what was decided, from what to what. The store
 * keeps the before/after values as JSON; this turns them into a line for the item's history.
 */
import type { AuditEntry as StoredAuditEntry } from '../store/audit';
import type { AuditEntry } from './contract';

const ACTIONS: Record<string, string> = {
  'force-model': 'Model fixed',
  'clear-forced-model': 'Model choice returned to the automatic search',
  'add-adjustment': 'Forecast adjusted',
  'remove-adjustment': 'Forecast adjustment removed',
  'fix-safety-stock': 'Safety stock fixed by hand',
  'clear-safety-stock': 'Safety stock returned to the computed value',
  'mark-reviewed': 'Marked reviewed',
  'clear-reviewed': 'Reviewed mark removed',
  'edit-order-qty': 'Order quantity changed',
  'clear-order-edit': 'Order quantity edit removed',
  'change-settings': 'Workspace settings changed',
};

function modelLabel(m: unknown): string {
  const f = m as { order?: { p: number; d: number; q: number }; seasonalHarmonics?: number } | null;
  if (!f?.order) return 'automatic';
  const h = f.seasonalHarmonics ? ` + ${f.seasonalHarmonics} annual harmonics` : '';
  return `ARIMA(${f.order.p},${f.order.d},${f.order.q})${h}`;
}

function detail(e: StoredAuditEntry): string {
  const before = e.before as Record<string, unknown> | unknown[] | number | null;
  const after = e.after as Record<string, unknown> | unknown[] | number | null;
  switch (e.action) {
    case 'force-model':
    case 'clear-forced-model':
      return `${modelLabel(before)} → ${modelLabel(after)}`;
    case 'add-adjustment':
    case 'remove-adjustment': {
      const list = (Array.isArray(after) ? after : []) as {
        from: string;
        to: string;
        kind: string;
        value: number;
      }[];
      if (e.action === 'add-adjustment' && list.length > 0) {
        const a = list[list.length - 1];
        const v =
          a.kind === 'percent'
            ? `${a.value > 0 ? '+' : ''}${a.value}%`
            : `${a.value > 0 ? '+' : ''}${a.value} units/week`;
        return `${v} from ${a.from} to ${a.to}`;
      }
      return `${list.length} adjustment${list.length === 1 ? '' : 's'} remain`;
    }
    case 'fix-safety-stock':
    case 'clear-safety-stock':
      return `${before ?? 'computed'} → ${after ?? 'computed'} units`;
    case 'edit-order-qty':
    case 'clear-order-edit': {
      const b = before as { orderQty?: number | null } | null;
      const a = after as { orderQty?: number | null } | null;
      return `${b?.orderQty ?? '–'} → ${a?.orderQty ?? '–'} units`;
    }
    default:
      return '';
  }
}

export function auditInWords(e: StoredAuditEntry): AuditEntry {
  return {
    at: e.at,
    sku: e.sku,
    action: ACTIONS[e.action] ?? e.action,
    detail: detail(e),
    reason: e.reason ?? '',
  };
}
