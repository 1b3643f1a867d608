/**
 * TSB, the method of Teunter, Syntetos & Babai (2011, European Journal of Operational Research 214):
 * the probability that a week has demand, p, is smoothed every week and the size of a demand, z,
 * only in weeks with demand,
 *   p ← p + β (1{y_t > 0} − p),   z ← z + α (y_t − z) when y_t > 0,
 * and the forecast per week is f = p · z, flat over the horizon. Unlike Croston-type methods (SBA),
 * the forecast falls during a long run of zero weeks, so an item that stops selling is seen to stop.
 * Started as SBA is, at the first demand (z = its size, p = 1 / the weeks up to it; Croston 1972).
 * α and β are chosen from {0.05, 0.1, 0.2, 0.3} by the smallest in-sample one-step mean squared
 * error (common practice, as for SBA); uncertainty from the method's own errors (sba.ts, ownErrors).
 */
import { observedMean, ownErrors, type SbaState } from './sba';

const CONSTANTS = [0.05, 0.1, 0.2, 0.3];

export function fitTsb(y: ArrayLike<number>): SbaState {
  let best: SbaState | null = null;
  for (const alpha of CONSTANTS) {
    for (const beta of CONSTANTS) {
      const s = runTsb(y, alpha, beta);
      if (!best || s.errorVariance < best.errorVariance) best = s;
    }
  }
  return best as SbaState;
}

export function runTsb(y: ArrayLike<number>, alpha: number, beta: number): SbaState {
  const n = y.length;
  const fitted = new Array<number>(n).fill(Number.NaN);
  const meanAll = observedMean(y);
  let z = Number.NaN;
  let p = Number.NaN;
  let since = 0;
  let f = Number.NaN;
  for (let t = 0; t < n; t++) {
    fitted[t] = f;
    const v = y[t];
    if (!Number.isFinite(v)) continue; // a missing week tells nothing about demand
    since++;
    if (Number.isNaN(z)) {
      if (v === 0) continue;
      z = v;
      p = 1 / since;
    } else if (v !== 0) {
      p += beta * (1 - p);
      z += alpha * (v - z);
    } else {
      p -= beta * p;
    }
    f = p * z;
  }
  if (!Number.isFinite(f)) f = meanAll; // no demand at all: forecast the (zero) mean
  return {
    method: 'tsb',
    alpha,
    beta,
    size: Number.isFinite(z) ? z : 0,
    interval: p > 0 ? 1 / p : 0,
    forecast: f,
    fitted,
    ...ownErrors(y, fitted, meanAll),
  };
}
