/**
 * The one place select/, diagnose/ and backtest/ reach into the ARMA engine (core/arma/), so a
 * rename there is one edit here.
 */
export { fitArma } from '../arma/fitArma';
export { forecastArma, leadTimeMoments } from '../arma/forecast';

export { polynomialRootModuli } from '../arma/roots';

import { polynomialRootModuli } from '../arma/roots';

/** Smallest root modulus of 1 − c_1 z − … − c_k z^k; Infinity when there is no root. */
export function minRootModulus(coef: ArrayLike<number>): number {
  let m = Number.POSITIVE_INFINITY;
  for (const r of polynomialRootModuli(coef)) if (r < m) m = r;
  return m;
}
