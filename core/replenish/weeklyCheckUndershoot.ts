import cdf from '@stdlib/stats-base-dists-normal-cdf';
import type { ServiceKind } from '../plan/types';
import { standardNormalLoss } from './normalLoss';

/**
 * Reorder point of a lot-size policy whose stock is only checked at each weekly planning run: the
 * (R, s, nQ) system with R = 1 week (Silver, Pyke & Thomas, Inventory and Production Management in
 * Supply Chains, (R, s, S) and (R, s, Q) systems; Hadley & Whitin 1963 — cited from memory).
 *
 * At a run the position is compared with s; when it is at or below, whole lots Q are ordered to bring
 * it back above s. Between two runs the position drops by about one week's demand d, so when the run
 * sees it, it is below s by an UNDERSHOOT u ≥ 0. The order then arrives L weeks later, and the cycle
 * that ends just before it arrives is stocked out when D_L + u > s (D_L: demand over the lead time).
 *
 * Approximation used: the position after ordering is spread evenly over (s, s + Q] (the (R, s, nQ)
 * result, Hadley & Whitin), so at a run that orders, u = d − V with V uniform on (0, Q] and d > V:
 * density ∝ P(d > u) − P(d > u + Q), u ≥ 0. For Q above the largest weekly drop that is the
 * stationary-excess distribution P(d > u)/E[d⁺] of renewal theory, mean E[d²]/(2E[d]). The drop d is
 * taken as normal (caller's mean and s.d.), successive drops as independent, and u independent of
 * the lead-time forecast error (u is known at the run, the later errors are not). Then
 *   P(stockout in a cycle) = E_u[1 − Φ((x − u)/σ_L)],
 *   expected shortage per cycle = E_u[σ_L · G((x − u)/σ_L)],
 * with x = s − (forecast over L). x is solved for the cycle-service target α (P = 1 − α) or the
 * fill-rate target β (shortage = Q(1 − β), Q the lot), by bisection; E_u is a composite Simpson sum on 160 intervals.
 * Stated as: reorder point = forecast over L + expected undershoot E[u] + safety stock, so the
 * reorder point covers the lead time plus the part of the next week the position can fall below it.
 * Treating the whole extra week as forecast demand (s over L + 1 weeks) over-protects when weekly
 * demand varies little (measured in test/bench/policy.bench.ts: 98–99.8% for a 95% target).
 * The safety stock is never negative (x ≥ E[u]).
 */
export interface WeeklyCheckReorder {
  /** s − forecast over the lead time. */
  margin: number;
  /** E[u], the mean drop below s by the time a run sees it. */
  expectedUndershoot: number;
  /** margin − E[u], never below 0. */
  safetyStock: number;
  /** safetyStock / σ_L (0 when σ_L = 0). */
  k: number;
  method: string;
}

const GRID = 160; // even, for Simpson's rule

export function weeklyCheckReorder(
  kind: ServiceKind,
  target: number,
  leadSd: number,
  weekMean: number,
  weekSd: number,
  lot: number,
): WeeklyCheckReorder {
  if (!(target > 0 && target < 1)) {
    throw new RangeError(`service target must lie strictly between 0 and 1, got ${target}`);
  }
  const m = Math.max(0, weekMean);
  const sdD = Math.max(0, weekSd);
  const sL = Math.max(0, leadSd);
  // Undershoot grid on [0, top]: P(d > u) is below 1e-15 past m + 8 s.d.
  const top = m + 8 * sdD;
  const q = Math.max(0, lot);
  // P(d > v) for the weekly drop d ~ N(m, sdD²); a step at m when it does not vary
  const over = (v: number): number => (sdD > 0 ? cdf((m - v) / sdD, 0, 1) : v <= m ? 1 : 0);
  const u = new Float64Array(GRID + 1);
  const g = new Float64Array(GRID + 1);
  let eu = 0;
  if (top > 0) {
    const h = top / GRID;
    // weights normalised below, so the common factor h/3 is left out
    let norm = 0;
    for (let i = 0; i <= GRID; i++) {
      u[i] = i * h;
      const tail = over(u[i]) - over(u[i] + q);
      g[i] = (i === 0 || i === GRID ? 1 : i % 2 === 1 ? 4 : 2) * tail; // composite Simpson
      norm += g[i];
    }
    for (let i = 0; i <= GRID; i++) {
      g[i] /= norm;
      eu += g[i] * u[i];
    }
  } else {
    g[0] = 1;
  }
  // Decreasing in x: the probability of a stockout (cycle) or the expected shortage (fill).
  const risk = (x: number): number => {
    let s = 0;
    for (let i = 0; i <= GRID; i++) {
      if (g[i] === 0) continue;
      const z = x - u[i];
      if (kind === 'cycle') s += g[i] * (sL > 0 ? cdf(-z / sL, 0, 1) : z < 0 ? 1 : 0);
      else s += g[i] * (sL > 0 ? sL * standardNormalLoss(z / sL) : Math.max(0, -z));
    }
    return s;
  };
  const goal = kind === 'cycle' ? 1 - target : Math.max(0, lot) * (1 - target);
  let lo = -10 * sL - 1;
  let hi = top + 40 * sL + 1;
  for (let it = 0; it < 200 && hi - lo > 1e-9 * (1 + Math.abs(hi)); it++) {
    const mid = 0.5 * (lo + hi);
    if (risk(mid) > goal) lo = mid;
    else hi = mid;
  }
  const solved = hi;
  const margin = Math.max(solved, eu);
  const safetyStock = margin - eu;
  const words =
    kind === 'cycle'
      ? `P(lead-time demand + undershoot > reorder point) = ${fmt(1 - target)}`
      : `expected shortage per cycle = Q(1 − β) = ${fmt(lot)}·${fmt(1 - target)}`;
  return {
    margin,
    expectedUndershoot: eu,
    safetyStock,
    k: sL > 0 ? safetyStock / sL : 0,
    method:
      `weekly-check (R, s, nQ) rule with R = 1: ${words}, the undershoot spread as one week's drop ` +
      `(mean ${fmt(m)}, s.d. ${fmt(sdD)})` +
      (solved < eu ? '; the target is met without safety stock, so it is 0, never below' : ''),
  };
}

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toPrecision(4).replace(/\.?0+$/, '');
}
