/**
 * Economic order quantity (Harris 1913, "How many parts to make at once"):
 *   EOQ = √(2·A·D / (r·v)),
 * with D the annual demand in units, A the fixed cost per order, v the unit cost and r the annual
 * holding cost as a fraction of unit cost. Returns null when any input is missing or not positive.
 */
export function economicOrderQuantity(
  annualDemand: number,
  orderCost: number | null,
  unitCost: number | null,
  holdingRate: number | null,
): number | null {
  if (orderCost == null || unitCost == null || holdingRate == null) return null;
  if (!(annualDemand > 0 && orderCost > 0 && unitCost > 0 && holdingRate > 0)) return null;
  return Math.sqrt((2 * orderCost * annualDemand) / (holdingRate * unitCost));
}
