/**
 * A last check of an item's rows before they leave the worker: every number the store keeps in a
 * NOT NULL column must be finite and every code one the schema accepts. A record that fails is
 * thrown back as that item's error (so the item gets the failed-item line and flag) instead of
 * failing the run's one write transaction for every item.
 */
import type { ItemRunRecord } from '../store/runs';

const SEVERITIES = new Set(['info', 'warning', 'critical']);

export function checkRunRecord(sku: string, r: ItemRunRecord): void {
  const bad = (field: string, value: unknown) => {
    throw new Error(
      `planning ${sku}: the engine returned ${field} = ${String(value)}, which cannot be stored`,
    );
  };
  for (const f of r.forecasts) {
    for (const k of ['mean', 'se', 'lower80', 'upper80', 'lower95', 'upper95'] as const) {
      if (!Number.isFinite(f[k])) bad(`forecast step ${f.step} ${k}`, f[k]);
    }
    if (!Number.isInteger(f.step) || !/^\d{4}-\d{2}-\d{2}$/.test(f.week))
      bad(`forecast step ${f.step} week`, f.week);
  }
  const o = r.order;
  if (o) {
    for (const k of [
      'orderQty',
      'casePacks',
      'reorderPoint',
      'orderUpTo',
      'safetyStock',
      'intervalForecast',
      'intervalSd',
      'serviceLevel',
    ] as const) {
      if (!Number.isFinite(o[k])) bad(`order ${k}`, o[k]);
    }
    if (o.serviceKind !== 'cycle' && o.serviceKind !== 'fill') bad('order serviceKind', o.serviceKind);
  }
  for (const f of r.flags) if (!SEVERITIES.has(f.severity)) bad(`flag ${f.code} severity`, f.severity);
  for (const m of r.models) {
    for (const k of ['p', 'd', 'q', 'seasonalHarmonics'] as const)
      if (!Number.isInteger(m[k])) bad(`model ${k}`, m[k]);
  }
}
