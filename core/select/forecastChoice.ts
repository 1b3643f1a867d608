import { windowSumVariance } from '../arma/leadTimeSum';
import { psiWeights } from '../arma/psi';
import { float64Block } from '../arma/typedArrays';
import { sbaWindowVariance } from '../intermittent/sba';
import { forecastArma, leadTimeMoments } from './engine';
import { futureFourierColumns } from './fourier';
import type { ModelChoice } from './modelChoice';

/**
 * Forecasts from a ModelChoice, whatever its kind, with a finite standard error always:
 *   arma: the engine's h-step means and standard errors, Fourier terms continued from the
 *         calendar date of the last history week; for an automatically chosen model the variance is
 *         widened by Akaike's final-prediction-error factor (n + k)/(n − k) (Akaike 1969, Ann. Inst.
 *         Stat. Math. 21), k the estimated mean, ARMA and regression coefficients, n the observations,
 *         an allowance for estimation error that the plug-in variance leaves out (forced models keep
 *         the engine's plug-in variance, as base R's predict reports it);
 *   intermittent: the method's flat rate per week, se from its own one-step errors (the same for
 *         every step: a rate forecast's single-week error does not grow with the horizon);
 *   fallback: the engine's fallback forecast, or the mean with the history's spread.
 */
export interface ChoiceForecast {
  mean: Float64Array;
  se: Float64Array;
}

export function forecastChoice(choice: ModelChoice, horizon: number): ChoiceForecast {
  const h = Math.max(0, Math.floor(horizon));
  if (choice.kind === 'intermittent' && choice.intermittent) {
    const s = choice.intermittent;
    const [mean, se] = float64Block([h, h]);
    mean.fill(s.forecast);
    se.fill(Math.sqrt(s.errorVariance));
    return { mean, se };
  }
  if (choice.fit) {
    try {
      // The model's own rows, widened in place (forecastArma returns fresh arrays).
      const f = forecastArma(choice.fit, h, futureXregOf(choice, h));
      const widen = Math.sqrt(estimationAllowance(choice));
      let ok = true;
      for (let i = 0; i < h; i++) {
        f.se[i] *= widen;
        if (!Number.isFinite(f.mean[i]) || !Number.isFinite(f.se[i])) ok = false;
      }
      if (ok) return { mean: f.mean, se: f.se };
    } catch {
      // fall through to the level below
    }
  }
  const [mean, se] = float64Block([h, h]);
  const level = choice.fallbackLevel ?? levelOf(choice);
  mean.fill(level.value);
  se.fill(level.sd);
  return { mean, se };
}

/**
 * Mean and variance of the sum of forecast weeks fromStep…toStep (1-based, inclusive), with every
 * covariance between the weeks: Var = σ² Σ_k c_k² over the ψ-weights (windowSumVariance). For
 * intermittent items the variance comes from the method's own errors of sums of that many weeks;
 * for a fallback the weeks are taken as independent.
 */
export function leadTimeMomentsChoice(
  choice: ModelChoice,
  fromStep: number,
  toStep: number,
): { mean: number; variance: number } {
  const a = Math.max(1, Math.floor(fromStep));
  const b = Math.floor(toStep);
  if (b < a) return { mean: 0, variance: 0 };
  const f = forecastChoice(choice, b);
  let mean = 0;
  for (let h = a; h <= b; h++) mean += f.mean[h - 1];
  if (choice.kind === 'intermittent' && choice.intermittent) {
    return { mean, variance: sbaWindowVariance(choice.intermittent, a, b) };
  }
  const fit = choice.fit;
  if (choice.kind === 'arma' && fit && Number.isFinite(fit.sigma2)) {
    if (a === 1) {
      // From the first week the engine's exact finite-sample propagation is available.
      try {
        const m = leadTimeMoments(fit, b, futureXregOf(choice, b));
        const variance = m.variance * estimationAllowance(choice);
        if (Number.isFinite(m.mean) && Number.isFinite(variance)) return { mean: m.mean, variance };
      } catch {
        // fall through to the ψ-weight form
      }
    }
    const psi = psiWeights(fit.ar, fit.ma, b, fit.order.d);
    const variance = windowSumVariance(psi, fit.sigma2, a, b) * estimationAllowance(choice);
    if (Number.isFinite(variance)) return { mean, variance };
  }
  let variance = 0;
  for (let h = a; h <= b; h++) variance += f.se[h - 1] ** 2;
  return { mean, variance };
}

/** Akaike's FPE factor (n + k)/(n − k) for automatically chosen ARMA models, 1 otherwise. */
export function estimationAllowance(choice: ModelChoice): number {
  const fit = choice.fit;
  if (choice.kind !== 'arma' || !fit || choice.selection.search === 'forced') return 1;
  const n = fit.nobs;
  const k = Math.max(0, fit.nparams - 1); // σ² is not a coefficient of the predictor
  return n - k > 0 ? (n + k) / (n - k) : 1;
}

function futureXregOf(choice: ModelChoice, horizon: number): Float64Array[] | undefined {
  if (choice.seasonalHarmonics > 0 && choice.fit && choice.fit.xregCoef.length > 0) {
    return futureFourierColumns([choice.lastWeekStart], choice.seasonalHarmonics, horizon);
  }
  return undefined;
}

function levelOf(choice: ModelChoice): { value: number; sd: number } {
  let s = 0;
  let m = 0;
  let ss = 0;
  for (const v of choice.fitted) {
    if (!Number.isFinite(v)) continue;
    s += v;
    m++;
  }
  const value = m > 0 ? s / m : 0;
  m = 0;
  for (const r of choice.residuals) {
    if (!Number.isFinite(r)) continue;
    ss += r * r;
    m++;
  }
  const sd = m > 0 && ss > 0 ? Math.sqrt(ss / m) : Math.max(Math.abs(value) / 10, 1e-6);
  return { value, sd };
}
