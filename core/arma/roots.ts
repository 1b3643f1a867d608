/**
 * Roots of 1 − c_1 z − … − c_k z^k (φ(z) for the AR part, θ(z) for the ma-minus MA part); all
 * moduli > 1 means stationary / invertible (Box, Jenkins & Reinsel, ch. 3). The roots are the
 * reciprocals of the eigenvalues λ of the companion matrix of λ^k − c_1 λ^{k−1} − … − c_k
 * (eigenvalues by ml-matrix). A zero eigenvalue (trailing zero coefficient) is a root at infinity.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { ArmaFit } from './types';

export interface ComplexRoot {
  re: number;
  im: number;
}

/** The finite complex roots (roots at infinity left out); empty for a zero or non-finite polynomial. */
export function polynomialRoots(coef: ArrayLike<number>): ComplexRoot[] {
  const eig = companionEigenvalues(coef);
  const out: ComplexRoot[] = [];
  for (const { re, im } of eig) {
    const m2 = re * re + im * im;
    // z = 1/λ = (re − i·im)/|λ|²
    if (m2 > 0) out.push({ re: re / m2, im: -im / m2 });
  }
  return out;
}

/**
 * Moduli of every root, ascending; a root at infinity counts as +∞. Degrees 1 and 2 (trailing zeros
 * dropped) — most fitted AR and MA parts, asked for by every candidate of the order search — in
 * closed form: for k = 2, λ = (c_1 ± √(c_1² + 4c_2))/2, a complex pair of modulus √(−c_2) when
 * c_1² + 4c_2 < 0 (the larger |λ| without cancellation, the other from λ_1 λ_2 = −c_2); higher
 * degrees from the companion matrix's eigenvalues.
 */
export function polynomialRootModuli(coef: ArrayLike<number>): number[] {
  let k = coef.length;
  while (k > 0 && coef[k - 1] === 0) k--;
  if (k <= 2) {
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
    const big = (c1 + (c1 >= 0 ? 1 : -1) * Math.sqrt(disc)) / 2;
    const small = big === 0 ? 0 : -c2 / big;
    const a = inv(Math.abs(big));
    const b = inv(Math.abs(small));
    return a <= b ? [a, b] : [b, a];
  }
  return eigenRootModuli(coef);
}

/** polynomialRootModuli from the companion matrix's eigenvalues for every degree (the reference). */
export function eigenRootModuli(coef: ArrayLike<number>): number[] {
  return companionEigenvalues(coef)
    .map(({ re, im }) => {
      const mod = Math.hypot(re, im);
      return mod === 0 ? Number.POSITIVE_INFINITY : 1 / mod;
    })
    .sort((a, b) => a - b);
}

function companionEigenvalues(coef: ArrayLike<number>): ComplexRoot[] {
  let k = coef.length;
  while (k > 0 && coef[k - 1] === 0) k--;
  if (k === 0) return [];
  for (let j = 0; j < k; j++) if (!Number.isFinite(coef[j])) return [];
  const C = Matrix.zeros(k, k);
  for (let j = 0; j < k; j++) C.set(0, j, coef[j]);
  for (let i = 1; i < k; i++) C.set(i, i - 1, 1);
  const e = new EigenvalueDecomposition(C);
  return Array.from({ length: k }, (_, i) => ({ re: e.realEigenvalues[i], im: e.imaginaryEigenvalues[i] }));
}

export function arRoots(fit: Pick<ArmaFit, 'ar'>): number[] {
  return polynomialRootModuli(fit.ar);
}

export function maRoots(fit: Pick<ArmaFit, 'ma'>): number[] {
  return polynomialRootModuli(fit.ma);
}
