import quantile from '@stdlib/stats-base-dists-normal-quantile';
import type { ServiceKind } from '../plan/types';
import { inverseNormalLoss } from './normalLoss';

/**
 * The safety factor k, so that safety stock = k·σ over the protection interval:
 * - cycle service α (probability of no stockout in a replenishment cycle): k = Φ⁻¹(α);
 * - fill rate β (share of demand met from stock): k solves G(k) = Q(1 − β)/σ, with G the standard
 *   normal loss function and Q the expected demand per replenishment cycle (the order quantity for
 *   continuous review, the expected demand of one review period for periodic review).
 *   (Silver, Pyke & Thomas, Inventory and Production Management in Supply Chains, ch. on
 *   individual-item (s, Q) and (R, S) systems.) The fill-rate form leaves out the small term for
 *   shortages already outstanding when an order arrives, as the textbook formula does.
 * A negative k is returned as computed; callers clamp the safety stock at zero.
 */
export interface SafetyFactor {
  k: number;
  /** How k was found, in words for the explanation. */
  method: string;
}

export function safetyFactor(
  kind: ServiceKind,
  target: number,
  sd: number,
  cycleDemand: number,
): SafetyFactor {
  if (!(target > 0 && target < 1)) {
    throw new RangeError(`service target must lie strictly between 0 and 1, got ${target}`);
  }
  if (kind === 'cycle') {
    return { k: quantile(target, 0, 1), method: `normal quantile Φ⁻¹(${fmt(target)})` };
  }
  if (!(sd > 0)) return { k: 0, method: 'no demand uncertainty, so no safety factor is needed' };
  const q = Math.max(cycleDemand, 0);
  if (q === 0) {
    // With no expected demand per cycle every unit short is a failure; fall back to the cycle form.
    return { k: quantile(target, 0, 1), method: `no expected demand per cycle, so Φ⁻¹(${fmt(target)})` };
  }
  const g = (q * (1 - target)) / sd;
  return {
    k: inverseNormalLoss(g),
    method: `normal loss G(k) = Q(1 − β)/σ = ${fmt(q)}·${fmt(1 - target)}/${fmt(sd)} = ${fmt(g)}`,
  };
}

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toPrecision(4).replace(/\.?0+$/, '');
}
