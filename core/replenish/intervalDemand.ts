import { windowSumVariance } from '../arma/leadTimeSum';

/**
 * Demand over the protection interval: L weeks for continuous review (s, Q), R + L weeks for
 * periodic review (R, S), counted from the first week after the last observed one. (A continuous-
 * review item is only checked at each weekly run; the extra week it is exposed to is covered by the
 * undershoot term of core/replenish/weeklyCheckUndershoot, not by lengthening this interval.)
 *
 * The demand part comes from the model's moments of the SUM over the interval, covariances between
 * horizons included (for an ARMA model σ² Σ_k c_k², core/arma/leadTimeSum), not from √L × one-week σ.
 *
 * Lead-time variability: for independent, identically distributed weekly demand and an independent
 * lead time, Var = E[T]·σ_D² + D²·σ_L² (Silver, Pyke & Thomas, Inventory and Production Management in
 * Supply Chains). Demand here is autocorrelated, so we use the approximation
 *   Var ≈ Var(sum of demand over T̄ = R + E[L] weeks) + D̄²·σ_L²,
 * the exact sum variance at the mean lead time plus the textbook lead-time term, with D̄ the mean
 * weekly forecast over the interval. A fractional T̄ interpolates linearly between whole weeks.
 */
export interface IntervalMoments {
  mean: number;
  variance: number;
}

/** Moments of the sum of demand over forecast steps from…to (inclusive, step 1 = next week). */
export type SumMoments = (fromStep: number, toStep: number) => IntervalMoments;

export interface IntervalDemand {
  /** Length of the protection interval in weeks (R + E[L], or E[L]). */
  weeks: number;
  mean: number;
  /** Total variance: demand part plus lead-time part. */
  variance: number;
  sd: number;
  /** Variance of the demand sum at the mean lead time. */
  demandVariance: number;
  /** D̄²·σ_L². */
  leadTimeVariance: number;
  /** Mean weekly forecast over the interval, D̄. */
  meanWeekly: number;
  /** The approximation used, in plain words. */
  approximation: string;
}

export function protectionIntervalWeeks(leadTimeWeeks: number, reviewPeriodWeeks: number): number {
  return Math.max(0, leadTimeWeeks) + Math.max(0, reviewPeriodWeeks);
}

export function intervalDemand(
  moments: SumMoments,
  leadTimeWeeks: number,
  leadTimeSdWeeks: number,
  reviewPeriodWeeks: number,
): IntervalDemand {
  const weeks = protectionIntervalWeeks(leadTimeWeeks, reviewPeriodWeeks);
  const lo = Math.floor(weeks);
  const frac = weeks - lo;
  const at = (t: number): IntervalMoments => (t <= 0 ? { mean: 0, variance: 0 } : moments(1, t));
  const a = at(lo);
  const b = frac > 0 ? at(lo + 1) : a;
  const mean = a.mean + frac * (b.mean - a.mean);
  const demandVariance = Math.max(0, a.variance + frac * (b.variance - a.variance));
  const meanWeekly = weeks > 0 ? mean / weeks : frac > 0 ? b.mean : at(1).mean;
  const sdL = Math.max(0, leadTimeSdWeeks);
  const leadTimeVariance = meanWeekly * meanWeekly * sdL * sdL;
  const variance = demandVariance + leadTimeVariance;
  const approximation =
    sdL > 0
      ? `variance of the ${fmtWeeks(weeks)}-week demand sum with its week-to-week covariances, plus ` +
        `(mean weekly demand)² × (lead-time s.d.)² for a lead time that varies by ${fmtWeeks(sdL)} weeks`
      : `variance of the ${fmtWeeks(weeks)}-week demand sum with its week-to-week covariances`;
  return {
    weeks,
    mean,
    variance,
    sd: Math.sqrt(variance),
    demandVariance,
    leadTimeVariance,
    meanWeekly,
    approximation,
  };
}

/**
 * SumMoments of an ARMA/ARIMA model from its ψ-weights, σ² and the path of forecast means
 * (meanPath[h − 1] is the forecast for step h). psi must hold at least as many weights as steps asked.
 */
export function armaSumMoments(
  psi: ArrayLike<number>,
  sigma2: number,
  meanPath: ArrayLike<number>,
): SumMoments {
  return (fromStep, toStep) => {
    let mean = 0;
    for (let h = Math.max(1, fromStep); h <= toStep; h++) mean += meanPath[h - 1];
    return { mean, variance: windowSumVariance(psi, sigma2, fromStep, toStep) };
  };
}

function fmtWeeks(w: number): string {
  return Number.isInteger(w) ? String(w) : w.toFixed(1);
}
