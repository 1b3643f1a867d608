/**
 * Variance of a SUM of forecast errors over a window of future weeks, with every covariance between
 * horizons included. With e_h = Σ_{j=0}^{h−1} ψ_j ε_{T+h−j}, the sum S = Σ_{h=a}^{b} e_h collects the
 * shock ε_{T+k} with weight c_k = Σ_{h=max(a,k)}^{b} ψ_{h−k}, so Var(S) = σ² Σ_{k=1}^{b} c_k².
 * For the first L weeks (a = 1, b = L) this is σ² Σ_{m=0}^{L−1} (ψ_0 + … + ψ_m)², which for
 * autocorrelated demand differs from L·σ²_1 (the "√L rule"); for white noise both equal L·σ².
 * (Box, Jenkins & Reinsel, ch. 5; the lead-time form is standard in inventory texts, e.g. Silver,
 * Pyke & Thomas, Inventory and Production Management in Supply Chains.)
 */
export function windowSumVariance(psi: ArrayLike<number>, sigma2: number, from: number, to: number): number {
  if (to < from || to < 1) return 0;
  const a = Math.max(1, from);
  if (psi.length < to) throw new RangeError(`need ${to} ψ-weights, got ${psi.length}`);
  let total = 0;
  for (let k = 1; k <= to; k++) {
    let c = 0;
    for (let h = Math.max(a, k); h <= to; h++) c += psi[h - k];
    total += c * c;
  }
  return sigma2 * total;
}

/** Variance of the sum of the next L weeks' forecast errors: windowSumVariance over weeks 1…L. */
export function leadTimeSumVariance(psi: ArrayLike<number>, sigma2: number, L: number): number {
  return windowSumVariance(psi, sigma2, 1, L);
}

/** Covariance of the h1- and h2-step forecast errors: σ² Σ_{j=0}^{h1−1} ψ_j ψ_{j+h2−h1} (h1 ≤ h2). */
export function forecastErrorCovariance(
  psi: ArrayLike<number>,
  sigma2: number,
  h1: number,
  h2: number,
): number {
  const lo = Math.min(h1, h2);
  const gap = Math.abs(h2 - h1);
  let s = 0;
  for (let j = 0; j < lo; j++) s += psi[j] * psi[j + gap];
  return sigma2 * s;
}
