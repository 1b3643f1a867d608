/**
 * The complex roots of 1 − c_1 z − … − c_k z^k, for drawing an ARMA model's AR (φ) and MA (θ,
 * ma-minus) roots against the unit circle. Same method as core/arma/roots (which gives the moduli
 * only): the roots are the reciprocals of the eigenvalues λ of the companion matrix of
 * λ^k − c_1 λ^{k−1} − … − c_k (Box, Jenkins & Reinsel, Time Series Analysis, ch. 3); eigenvalues
 * by ml-matrix. A zero eigenvalue (a trailing zero coefficient) is a root at infinity and is left out.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { Complex } from './contract';

export function polynomialRoots(coef: readonly number[]): Complex[] {
  let k = coef.length;
  while (k > 0 && coef[k - 1] === 0) k--;
  if (k === 0 || coef.slice(0, k).some((c) => !Number.isFinite(c))) return [];
  const C = Matrix.zeros(k, k);
  for (let j = 0; j < k; j++) C.set(0, j, coef[j]);
  for (let i = 1; i < k; i++) C.set(i, i - 1, 1);
  const e = new EigenvalueDecomposition(C);
  const out: Complex[] = [];
  for (let i = 0; i < k; i++) {
    const a = e.realEigenvalues[i];
    const b = e.imaginaryEigenvalues[i];
    const m2 = a * a + b * b;
    if (m2 === 0) continue;
    // z = 1/λ = (a − bi)/(a² + b²)
    out.push({ re: a / m2, im: -b / m2 });
  }
  return out;
}
