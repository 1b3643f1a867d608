/**
 * The one place select/, diagnose/ and backtest/ reach into the ARMA engine (core/arma/), so a
 * rename there is one edit here.
 */
export { fitArma } from '../arma/fitArma';
export { forecastArma, leadTimeMoments } from '../arma/forecast';

import { polynomialRootModuli as companionRootModuli } from '../arma/roots';

/**
 * Moduli of the roots of 1 − c_1 z − … − c_k z^k, ascending (a root at infinity as +∞), as the
 * engine's polynomialRootModuli gives them. Degrees 1 and 2 — most fitted AR and MA parts — are
 * solved in closed form: the roots are the reciprocals of the roots λ of λ^k − c_1 λ^{k−1} − … − c_k,
 * for k = 2 λ = (c_1 ± √(c_1² + 4c_2))/2, a complex pair of modulus √(−c_2) when c_1² + 4c_2 < 0.
 * Higher degrees go to the engine's companion-matrix eigenvalues. Every candidate of the order
 * search and every diagnosis asks for these, so the general eigen-decomposition is kept for where it
 * is needed.
 */
export function polynomialRootModuli(coef: ArrayLike<number>): number[] {
  let k = coef.length;
  while (k > 0 && coef[k - 1] === 0) k--;
  if (k > 2) return companionRootModuli(coef);
  for (let j = 0; j < k; j++) if (!Number.isFinite(coef[j])) return [];
  if (k === 0) return [];
  const inv = (lambda: number): number => (lambda === 0 ? Number.POSITIVE_INFINITY : 1 / lambda);
  if (k === 1) return [inv(Math.abs(coef[0]))];
  const c1 = coef[0];
  const c2 = coef[1];
  const disc = c1 * c1 + 4 * c2;
  if (disc < 0) {
    const m = inv(Math.sqrt(-c2));
    return [m, m];
  }
  // The larger |λ| without cancellation; the other from λ_1 λ_2 = −c_2.
  const big = (c1 + (c1 >= 0 ? 1 : -1) * Math.sqrt(disc)) / 2;
  const small = big === 0 ? 0 : -c2 / big;
  const a = inv(Math.abs(big));
  const b = inv(Math.abs(small));
  return a <= b ? [a, b] : [b, a];
}

/** Smallest root modulus of 1 − c_1 z − … − c_k z^k; Infinity when there is no root. */
export function minRootModulus(coef: ArrayLike<number>): number {
  let m = Number.POSITIVE_INFINITY;
  for (const r of polynomialRootModuli(coef)) if (r < m) m = r;
  return m;
}
