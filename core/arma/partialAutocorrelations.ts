/**
 * Reparameterisation of a stationary AR (or invertible MA) polynomial 1 − c_1 z − … − c_k z^k
 * through its partial autocorrelations π_1..π_k, |π_j| < 1 (Barndorff-Nielsen & Schou 1973;
 * Jones 1980, Technometrics 22(3); Monahan 1984, Biometrika 71(2)). The Durbin–Levinson recursion
 * maps π to coefficients:
 *   c^{(j)}_j = π_j,  c^{(j)}_i = c^{(j−1)}_i − π_j c^{(j−1)}_{j−i}  (i < j),
 * and the unconstrained optimiser works on u_j with π_j = tanh(u_j). Because the ma-minus MA
 * polynomial 1 − θ_1 z − … − θ_q z^q has the same form as the AR one, one map serves both
 * (invertible θ ⇔ stationary "AR" with coefficients θ), which is the sign care Monahan asks for.
 */

/** u (unconstrained) → coefficients, written into out[0..k). work must hold k numbers. */
export function unconstrainedToCoefficients(
  u: ArrayLike<number>,
  offset: number,
  k: number,
  out: Float64Array,
  outOffset: number,
  work: Float64Array,
): void {
  for (let j = 0; j < k; j++) {
    const pi = Math.tanh(u[offset + j]);
    out[outOffset + j] = pi;
    for (let i = 0; i < j; i++) work[i] = out[outOffset + i] - pi * out[outOffset + j - 1 - i];
    for (let i = 0; i < j; i++) out[outOffset + i] = work[i];
  }
}

/**
 * The Jacobian of unconstrainedToCoefficients: jac[i·k + l] = ∂c_i/∂u_l, by differentiating the
 * Durbin–Levinson recursion step by step (∂π_j/∂u_j = 1 − π_j²). work must hold k(k + 2) numbers.
 */
export function unconstrainedJacobian(
  u: ArrayLike<number>,
  offset: number,
  k: number,
  jac: Float64Array,
  work: Float64Array,
): void {
  // work: c (the coefficients so far) at 0, their next values at k, the next Jacobian at 2k.
  const cNew = k;
  const D = 2 * k;
  jac.fill(0, 0, k * k);
  for (let j = 0; j < k; j++) {
    const pi = Math.tanh(u[offset + j]);
    const dpi = 1 - pi * pi;
    for (let i = 0; i < j; i++) {
      const cm = work[j - 1 - i];
      work[cNew + i] = work[i] - pi * cm;
      for (let l = 0; l < j; l++) work[D + i * k + l] = jac[i * k + l] - pi * jac[(j - 1 - i) * k + l];
      work[D + i * k + j] = -dpi * cm;
    }
    for (let i = 0; i < j; i++) {
      work[i] = work[cNew + i];
      for (let l = 0; l <= j; l++) jac[i * k + l] = work[D + i * k + l];
    }
    work[j] = pi;
    jac[j * k + j] = dpi;
  }
}

/** Partial autocorrelations of a polynomial (step-down recursion); null if not strictly inside. */
export function coefficientsToPartials(coef: ArrayLike<number>): Float64Array | null {
  const k = coef.length;
  const c = new Float64Array(coef);
  const pi = new Float64Array(k);
  const next = new Float64Array(k);
  for (let j = k - 1; j >= 0; j--) {
    const pj = c[j];
    if (!(Math.abs(pj) < 1)) return null;
    pi[j] = pj;
    const den = 1 - pj * pj;
    for (let i = 0; i < j; i++) next[i] = (c[i] + pj * c[j - 1 - i]) / den;
    for (let i = 0; i < j; i++) c[i] = next[i];
  }
  return pi;
}

/** Coefficients → unconstrained u = atanh(π); null if the polynomial is not strictly inside. */
export function coefficientsToUnconstrained(coef: ArrayLike<number>, limit = 0.995): number[] | null {
  const pi = coefficientsToPartials(coef);
  if (!pi) return null;
  const out: number[] = [];
  for (let j = 0; j < pi.length; j++) {
    const v = Math.max(-limit, Math.min(limit, pi[j]));
    out.push(Math.atanh(v));
  }
  return out;
}

/** True when 1 − c_1 z − … − c_k z^k has all roots strictly outside the unit circle. */
export function isStationaryPolynomial(coef: ArrayLike<number>): boolean {
  return coefficientsToPartials(coef) !== null;
}
