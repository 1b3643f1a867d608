import gammainc from '@stdlib/math-base-special-gammainc';

/**
 * Upper tail of the chi-square distribution, P(X > x) for X ~ χ²_k, as the regularised upper
 * incomplete gamma function Q(k/2, x/2) (definition; Abramowitz & Stegun 26.4.19). Computed directly
 * rather than as 1 − cdf so that far-tail p-values do not underflow to 0.
 */
export function chiSquareUpperTail(x: number, k: number): number {
  if (!(k > 0)) return Number.NaN;
  if (!(x > 0)) return 1;
  if (x === Number.POSITIVE_INFINITY) return 0;
  return gammainc(x / 2, k / 2, true, true);
}
