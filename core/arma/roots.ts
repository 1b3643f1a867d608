/**
 * Moduli of the roots of 1 − c_1 z − … − c_k z^k (φ(z) for the AR part, θ(z) for the ma-minus MA
 * part); all > 1 means stationary / invertible (Box, Jenkins & Reinsel, ch. 3). The roots are the
 * reciprocals of the eigenvalues λ of the companion matrix of λ^k − c_1 λ^{k−1} − … − c_k
 * (eigenvalues by ml-matrix). A zero eigenvalue (trailing zero coefficient) is a root at infinity.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { ArmaFit } from './types';

export function polynomialRootModuli(coef: ArrayLike<number>): number[] {
  let k = coef.length;
  while (k > 0 && coef[k - 1] === 0) k--;
  if (k === 0) return [];
  const C = Matrix.zeros(k, k);
  for (let j = 0; j < k; j++) C.set(0, j, coef[j]);
  for (let i = 1; i < k; i++) C.set(i, i - 1, 1);
  const e = new EigenvalueDecomposition(C);
  const re = e.realEigenvalues;
  const im = e.imaginaryEigenvalues;
  const out: number[] = [];
  for (let i = 0; i < k; i++) {
    const mod = Math.hypot(re[i], im[i]);
    out.push(mod === 0 ? Number.POSITIVE_INFINITY : 1 / mod);
  }
  return out.sort((a, b) => a - b);
}

export function arRoots(fit: Pick<ArmaFit, 'ar'>): number[] {
  return polynomialRootModuli(fit.ar);
}

export function maRoots(fit: Pick<ArmaFit, 'ma'>): number[] {
  return polynomialRootModuli(fit.ma);
}
