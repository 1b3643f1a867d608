/**
 * d-fold differencing w = (1 − B)^d y, kept aligned with y: w_t for t < d is NaN (undefined), and a
 * missing y_t makes every w that uses it missing. integrationWeights gives c_1..c_d of
 * (1 − B)^d = 1 − Σ c_k B^k, so y_t = w_t + Σ c_k y_{t−k} (d = 1: c = [1]; d = 2: c = [2, −1]).
 */
export function difference(y: ArrayLike<number>, d: number): Float64Array {
  let w = Float64Array.from(y);
  for (let k = 0; k < d; k++) {
    const next = new Float64Array(w.length);
    next[0] = Number.NaN;
    for (let t = 1; t < w.length; t++) next[t] = w[t] - w[t - 1];
    if (w.length > 0) next[0] = Number.NaN;
    w = next;
  }
  return w;
}

export function integrationWeights(d: number): number[] {
  // Coefficients of (1 − B)^d are binomial with alternating sign; c_k = −coef_k.
  const poly = [1];
  for (let k = 0; k < d; k++) {
    const next = new Array<number>(poly.length + 1).fill(0);
    for (let i = 0; i < poly.length; i++) {
      next[i] += poly[i];
      next[i + 1] -= poly[i];
    }
    poly.splice(0, poly.length, ...next);
  }
  return poly.slice(1).map((c) => -c);
}
