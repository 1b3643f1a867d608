import { createRng, type Rng } from './random';

/**
 * Simulate an ARIMA(p,d,q) process in the "ma-minus" form
 *   w_t − μ = Σ φ_i (w_{t−i} − μ) + ε_t − Σ θ_j ε_{t−j},  ε_t ~ N(0, σ²),  w = (1 − B)^d y,
 * discarding a burn-in so the start-up transient is gone (common practice), then integrating d times
 * from zero.
 */
export interface SimulationModel {
  ar: ArrayLike<number>;
  ma: ArrayLike<number>;
  sigma2: number;
  mean?: number;
  d?: number;
}

export function simulateArma(
  model: SimulationModel,
  n: number,
  seed: number | Rng,
  burnIn?: number,
): Float64Array {
  const rng = typeof seed === 'number' ? createRng(seed) : seed;
  const p = model.ar.length;
  const q = model.ma.length;
  const burn = burnIn ?? Math.max(200, 20 * (p + q));
  const total = n + burn;
  const sd = Math.sqrt(model.sigma2);
  const w = new Float64Array(total);
  const e = new Float64Array(total);
  for (let t = 0; t < total; t++) {
    const eps = sd * rng.normal();
    e[t] = eps;
    let v = eps;
    for (let i = 1; i <= p && i <= t; i++) v += model.ar[i - 1] * w[t - i];
    for (let j = 1; j <= q && j <= t; j++) v -= model.ma[j - 1] * e[t - j];
    w[t] = v;
  }
  const mu = model.mean ?? 0;
  let out = new Float64Array(n);
  for (let t = 0; t < n; t++) out[t] = w[burn + t] + mu;
  for (let k = 0; k < (model.d ?? 0); k++) {
    const integrated = new Float64Array(n);
    let level = 0;
    for (let t = 0; t < n; t++) integrated[t] = level += out[t];
    out = integrated;
  }
  return out;
}
