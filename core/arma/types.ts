/**
 * The ARMA engine's data contract. Sign convention (Box–Jenkins, "ma-minus"):
 *   w_t − μ = φ_1(w_{t−1} − μ) + … + φ_p(w_{t−p} − μ) + ε_t − θ_1 ε_{t−1} − … − θ_q ε_{t−q},
 * where w is the d-th difference of the observed series y and ε is white noise with variance σ².
 * Every field is plain data (structured-clone safe) so a fit can cross a worker thread or be stored.
 */

export interface ArmaFitOptions {
  p: number;
  d: number;
  q: number;
  /** Default: true when d = 0, false when d ≥ 1 (then a mean of the differences is a drift). */
  includeMean?: boolean;
  /** Regressor columns of length y.length on the undifferenced scale; differenced with y. */
  xreg?: Float64Array[];
  maxIterations?: number;
  /**
   * 'thorough' (default): every start of the multi-start search. 'quick': only the
   * Hannan–Rissanen and zero starts, for the many candidates of an automatic order search.
   */
  effort?: 'thorough' | 'quick';
}

export interface ArmaStandardErrors {
  ar: number[];
  ma: number[];
  mean: number | null;
  xreg: number[];
}

/** What forecasting needs from the last filter pass, on the differenced (w) scale. */
export interface ArmaForecastState {
  /** Predicted state a_{n+1|n} of the mean-removed differenced process (length r = max(p, q+1)). */
  state: number[];
  /** Its covariance P_{n+1|n} in units of σ², row-major r × r. */
  covariance: number[];
  /** The last d observed levels y_{n−1}, …, y_{n−d} (most recent first); NaN if one was missing. */
  lastLevels: number[];
  /** Length of the input series (forecast step 1 is index n). */
  n: number;
  /** Per regressor column, its last d values x_{n−1}, …, x_{n−d} (to difference future values). */
  xregTail: number[][];
  /** Fallback level (the mean or the last value); NaN for a fitted model. */
  level: number;
}

export interface ArmaFit {
  order: { p: number; d: number; q: number };
  includeMean: boolean;
  mean: number | null;
  xregCoef: number[];
  ar: number[];
  ma: number[];
  sigma2: number;
  loglik: number;
  aic: number;
  aicc: number;
  bic: number;
  /** Observed (non-missing) points after differencing. */
  nobs: number;
  /** Every estimated parameter, the mean, the regressors and σ² included. */
  nparams: number;
  converged: boolean;
  stderr: ArmaStandardErrors;
  /** One-step innovations on the differenced scale, NaN where missing. */
  residuals: Float64Array;
  /** Innovations divided by the square root of their variance σ²F_t, NaN where missing. */
  standardizedResiduals: Float64Array;
  /** One-step predictions on the original scale (length y.length, NaN where undefined). */
  fitted: Float64Array;
  flags: string[];
  fallback: null | 'mean' | 'last-value';
  forecastState: ArmaForecastState;
  /** Likelihood evaluations (filter passes) spent by the optimiser (all starts). */
  evaluations: number;
  /** Analytic gradients computed by the optimiser (each about two passes' work). */
  gradients: number;
}
