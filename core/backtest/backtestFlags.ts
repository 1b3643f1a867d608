import { makeFlag } from '../diagnose/flags';
import type { Flag } from '../plan/types';
import type { BacktestResult } from './backtestChoice';

/**
 * Review flags from a refitting backtest. Intervals too narrow: more actuals fall outside the 95%
 * intervals than a binomial(m, 0.05) count would give with probability 1% (upper tail, binomial
 * definition; the errors of overlapping horizons are correlated, so the test is approximate). Loses
 * to naive: the model's mean absolute error over all horizons exceeds the naive forecast's by more
 * than 10% (the same margin as the cheap check in diagnoseChoice).
 */
export function backtestFlags(b: BacktestResult): Flag[] {
  const flags: Flag[] = [];
  let m = 0;
  let outside = 0;
  for (const h of b.horizons) {
    if (h.coverage95 === null) continue;
    m += h.count;
    outside += Math.round(h.count * (1 - h.coverage95));
  }
  if (m >= 10 && binomialUpperTail(outside, m, 0.05) < 0.01) {
    flags.push(makeFlag('intervals-too-narrow', { weeks: b.origins, outside, total: m }));
  }
  if (b.mase !== null && b.naiveMase !== null && b.naiveMase > 0 && b.mase / b.naiveMase > 1.1) {
    flags.push(makeFlag('loses-to-naive', { weeks: b.origins, ratio: b.mase / b.naiveMase }));
  }
  return flags;
}

/** P(X ≥ x) for X ~ Binomial(n, p), summed in log space (definition). */
export function binomialUpperTail(x: number, n: number, p: number): number {
  if (x <= 0) return 1;
  if (x > n) return 0;
  let logC = 0; // log C(n, k), built up from k = 0
  let total = 0;
  for (let k = 0; k <= n; k++) {
    if (k > 0) logC += Math.log((n - k + 1) / k);
    if (k >= x) total += Math.exp(logC + k * Math.log(p) + (n - k) * Math.log1p(-p));
  }
  return Math.min(1, total);
}
