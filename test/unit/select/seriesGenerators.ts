/**
 * Seeded generators of test series for the selection tests and benchmark: random stationary ARMA
 * models (roots kept away from the unit circle), weekly series with and without an annual cycle, and
 * "awkward" random series (random lengths, zeros, spikes, trends, gaps).
 */
import type { Rng } from '../../../core/arma/random';
import { simulateArma } from '../../../core/arma/simulate';
import { minRootModulus } from '../../../core/select/engine';

export const weeksFrom = (n: number, start = Date.UTC(2021, 0, 4)): string[] =>
  Array.from({ length: n }, (_, i) => new Date(start + i * 7 * 86_400_000).toISOString().slice(0, 10));

/** A random ARMA(p,q) with p, q ≤ 2 and every root modulus ≥ 1.25. */
export function randomArmaModel(rng: Rng): { ar: number[]; ma: number[]; sigma2: number; mean: number } {
  const orders = [
    [1, 0],
    [2, 0],
    [0, 1],
    [0, 2],
    [1, 1],
    [2, 1],
    [1, 2],
    [2, 2],
  ];
  const [p, q] = orders[Math.floor(rng.uniform() * orders.length)];
  for (;;) {
    const ar = Array.from({ length: p }, () => 1.8 * rng.uniform() - 0.9);
    const ma = Array.from({ length: q }, () => 1.8 * rng.uniform() - 0.9);
    if (minRootModulus(ar) >= 1.25 && minRootModulus(ma) >= 1.25) {
      const mean = 20 + 180 * rng.uniform();
      const sd = mean * (0.05 + 0.15 * rng.uniform());
      return { ar, ma, sigma2: sd * sd, mean };
    }
  }
}

/** Weekly series with an AR(1) error and, when seasonal, an annual cycle of two harmonics. */
export function weeklySeries(
  rng: Rng,
  n: number,
  seasonal: boolean,
  start = Date.UTC(2021, 0, 4),
): Float64Array {
  const phi = 0.2 + 0.6 * rng.uniform();
  const level = 50 + 100 * rng.uniform();
  const sd = level * 0.08;
  const noise = simulateArma({ ar: [phi], ma: [], sigma2: sd * sd, mean: level }, n, rng);
  if (!seasonal) return noise;
  const amp = level * (0.15 + 0.15 * rng.uniform());
  const phase = 2 * Math.PI * rng.uniform();
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const days = (start - Date.UTC(2000, 0, 3)) / 86_400_000 + 7 * i;
    const w = (2 * Math.PI * days) / 365.25;
    out[i] = noise[i] + amp * Math.sin(w + phase) + 0.4 * amp * Math.cos(2 * w + phase);
  }
  return out;
}

/** A random awkward series: length 3…400, a mix of zeros, spikes, trends, steps, gaps and scale. */
export function awkwardSeries(rng: Rng): number[] {
  const n = 3 + Math.floor(rng.uniform() * 398);
  const kind = Math.floor(rng.uniform() * 8);
  const scale = 10 ** Math.floor(rng.uniform() * 8 - 1);
  const y: number[] = new Array(n);
  const trend = (rng.uniform() - 0.5) * 0.05 * scale;
  for (let t = 0; t < n; t++) {
    let v = scale * (1 + 0.3 * rng.normal());
    if (kind === 1) v = rng.uniform() < 0.7 ? 0 : v; // intermittent
    if (kind === 2) v = 0; // all zeros
    if (kind === 3) v = scale; // constant
    if (kind === 4) v += trend * t; // trend (may go negative)
    if (kind === 5 && t > n / 2) v += 2 * scale; // step
    if (rng.uniform() < 0.02) v += 20 * scale; // spike
    if (kind === 6 && rng.uniform() < 0.1) v = Number.NaN; // gaps
    if (kind === 7) v = Math.round(Math.max(0, v)); // whole units
    y[t] = v;
  }
  return y;
}
