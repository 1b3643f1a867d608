import cdf from '@stdlib/stats-base-dists-normal-cdf';
import pdf from '@stdlib/stats-base-dists-normal-pdf';

/**
 * The standard normal loss function (the expected shortfall beyond k of a standard normal X):
 *   G(k) = E[(X − k)⁺] = φ(k) − k·(1 − Φ(k)),
 * as tabulated for safety-stock work in inventory texts (e.g. Silver, Pyke & Thomas, Inventory and
 * Production Management in Supply Chains, appendix on the unit normal loss function; R. G. Brown 1959).
 * 1 − Φ(k) is taken as Φ(−k), which keeps full precision in the upper tail.
 */
export function standardNormalLoss(k: number): number {
  return pdf(k, 0, 1) - k * cdf(-k, 0, 1);
}

/**
 * The k that solves G(k) = g for g > 0. G is strictly decreasing and convex, with G′(k) = −Φ(−k),
 * so Newton's method with a bisection safeguard on a bracket converges in a few steps.
 * For g ≥ G(0) ≈ 0.399 the answer is k ≤ 0 (a safety stock of zero or less would do).
 */
export function inverseNormalLoss(g: number): number {
  if (!(g > 0) || !Number.isFinite(g)) {
    throw new RangeError(`inverseNormalLoss: the target loss must be a finite positive number, got ${g}`);
  }
  // G(k) ≈ −k for very negative k; G(38) underflows. Bracket [lo, hi] with G(lo) ≥ g ≥ G(hi).
  let lo = -g - 10;
  let hi = 38;
  let k = g >= 0.3989 ? -g : Math.sqrt(Math.max(0, -2 * Math.log(g * 2.5)));
  for (let it = 0; it < 100; it++) {
    const f = standardNormalLoss(k) - g;
    if (f > 0) lo = k;
    else hi = k;
    const slope = -cdf(-k, 0, 1);
    let next = slope < 0 ? k - f / slope : Number.NaN;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - k) < 1e-12 * (1 + Math.abs(k))) return next;
    k = next;
  }
  return k;
}
