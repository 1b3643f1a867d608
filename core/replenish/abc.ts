/**
 * ABC classification by annual consumption value (annual demand × unit cost), the Pareto split of
 * inventory practice (common practice; e.g. Silver, Pyke & Thomas, ch. on ABC classification):
 * items sorted by value, largest first; an item is A while the cumulative share of value BEFORE it
 * is below the first cut-off (so the item that crosses 80% is still A), B while it is below the
 * second, C after. Items with an unknown value (no unit cost) get no class: they take the
 * workspace default service target. Ties in value keep the SKU order, so the split is repeatable.
 */
export type AbcClass = 'A' | 'B' | 'C';

export interface AbcInput {
  sku: string;
  /** Annual consumption value, or null when unknown. */
  annualValue: number | null;
}

export function abcClasses(
  items: readonly AbcInput[],
  cutoffs: readonly [number, number],
): Map<string, AbcClass> {
  const [cutA, cutB] = cutoffs;
  if (!(cutA > 0 && cutA <= cutB && cutB <= 1)) {
    throw new RangeError(`ABC cut-offs must satisfy 0 < A ≤ B ≤ 1, got [${cutA}, ${cutB}]`);
  }
  const valued = items
    .filter((i) => i.annualValue != null && Number.isFinite(i.annualValue) && i.annualValue >= 0)
    .map((i) => ({ sku: i.sku, value: i.annualValue as number }))
    .sort((a, b) => b.value - a.value || (a.sku < b.sku ? -1 : a.sku > b.sku ? 1 : 0));
  let total = 0;
  for (const v of valued) total += v.value;
  const out = new Map<string, AbcClass>();
  let before = 0;
  for (const v of valued) {
    const share = total > 0 ? before / total : 1;
    out.set(v.sku, v.value > 0 && share < cutA ? 'A' : v.value > 0 && share < cutB ? 'B' : 'C');
    before += v.value;
  }
  return out;
}

/** Annual consumption value from a mean weekly demand (52 weeks a year) and a unit cost. */
export function annualConsumptionValue(meanWeeklyDemand: number, unitCost: number | null): number | null {
  if (unitCost == null || !Number.isFinite(unitCost) || !Number.isFinite(meanWeeklyDemand)) return null;
  return 52 * Math.max(0, meanWeeklyDemand) * Math.max(0, unitCost);
}

/** An item's service target: its own, else its class default, else the workspace default. */
export function serviceTarget(
  own: number | null,
  abcClass: AbcClass | undefined,
  classDefaults: { A: number; B: number; C: number },
  workspaceDefault: number,
): { level: number; source: 'item' | 'abc' | 'workspace' } {
  if (own != null) return { level: own, source: 'item' };
  if (abcClass) return { level: classDefaults[abcClass], source: 'abc' };
  return { level: workspaceDefault, source: 'workspace' };
}
