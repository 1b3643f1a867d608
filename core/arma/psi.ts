/**
 * ψ-weights (the MA(∞) representation) of an ARIMA(p,d,q) model in the Box–Jenkins "ma-minus" form
 *   φ(B)(1 − B)^d y_t = θ(B) ε_t,  φ(B) = 1 − Σ φ_i B^i,  θ(B) = 1 − Σ θ_j B^j,
 * so that y_{T+h} − ŷ_T(h) = Σ_{j=0}^{h−1} ψ_j ε_{T+h−j}.
 * Recursion: ψ_0 = 1, ψ_j = −θ_j + Σ_{i=1}^{min(j,p*)} φ*_i ψ_{j−i}, where φ*(B) = φ(B)(1 − B)^d
 * (Box, Jenkins & Reinsel, Time Series Analysis, ch. 5).
 */
export function psiWeights(
  ar: ArrayLike<number>,
  ma: ArrayLike<number>,
  n: number,
  d = 0,
  /** Where to write them (at least n long); a new array by default. */
  psi: Float64Array = new Float64Array(Math.max(n, 0)),
  /** Continue a sequence: psi[0…from) already holds these weights. */
  from = 0,
): Float64Array {
  const phi = integratedAr(ar, d);
  for (let j = from; j < n; j++) {
    let v = j === 0 ? 1 : j <= ma.length ? -ma[j - 1] : 0;
    const top = Math.min(j, phi.length);
    for (let i = 1; i <= top; i++) v += phi[i - 1] * psi[j - i];
    psi[j] = v;
  }
  return psi;
}

/**
 * The AR coefficients φ*_i of φ*(B) = φ(B)(1 − B)^d = 1 − Σ φ*_i B^i.
 */
export function integratedAr(ar: ArrayLike<number>, d: number): Float64Array {
  // Polynomial coefficients c_0..c_k of φ(B) with c_0 = 1, c_i = −φ_i.
  let poly = new Float64Array(ar.length + 1);
  poly[0] = 1;
  for (let i = 0; i < ar.length; i++) poly[i + 1] = -ar[i];
  for (let k = 0; k < d; k++) {
    const next = new Float64Array(poly.length + 1);
    for (let i = 0; i < poly.length; i++) {
      next[i] += poly[i];
      next[i + 1] -= poly[i];
    }
    poly = next;
  }
  const out = new Float64Array(poly.length - 1);
  for (let i = 1; i < poly.length; i++) out[i - 1] = -poly[i];
  return out;
}
