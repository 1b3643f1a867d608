import type { Flag } from '../plan/types';

/**
 * The review-flag vocabulary: our own short codes, each with a sentence a planner understands (the
 * numbers behind the verdict in it) and a suggested action. Flagged items form the review queue.
 */
/**
 * Every flag code Provision raises, in one list: the model checks below, and the planning-level codes
 * raised where their facts live (core/plan: forecast bias, settings, plan errors, shelf life; app/run:
 * an item whose planning failed outright).
 */
export const FLAG_CODES = [
  'short-history',
  'too-short',
  'constant',
  'fallback',
  'not-converged',
  'near-unit-root',
  'near-noninvertible',
  'residual-autocorrelation',
  'non-normal-residuals',
  'outlier-weeks',
  'level-shift',
  'negative-forecast',
  'intervals-too-narrow',
  'loses-to-naive',
  'sparse-demand',
  'unsound-model',
  'seasonal-terms',
  'forecast-bias',
  'setting-replaced',
  'history-mismatch',
  'plan-error',
  'shelf-life-below-moq',
  'diagnostics-failed',
  'plan-failed',
] as const;

export type FlagCode = (typeof FLAG_CODES)[number];

/** The codes whose sentence and action makeFlag writes; the others are written beside their facts. */
type ModelCheckCode = Exclude<
  FlagCode,
  | 'forecast-bias'
  | 'setting-replaced'
  | 'history-mismatch'
  | 'plan-error'
  | 'shelf-life-below-moq'
  | 'diagnostics-failed'
  | 'plan-failed'
>;

const pct = (x: number): string => `${Math.round(Math.abs(x) * 100)}%`;
const num = (x: number, digits = 3): string =>
  Number.isFinite(x) ? Number(x.toPrecision(digits)).toString() : String(x);

export function makeFlag(code: ModelCheckCode, facts: Record<string, number | string> = {}): Flag {
  const f = facts;
  switch (code) {
    case 'short-history':
      return {
        code,
        severity: 'warning',
        reason: `Only ${f.weeks} weeks of history (less than a year), so the model has seen no full seasonal cycle.`,
        action: 'Check the forecast against your own expectation until a year of sales has been recorded.',
      };
    case 'too-short':
      return {
        code,
        severity: 'critical',
        reason: `Only ${f.weeks} observed weeks, too few to fit a model; the forecast is the ${f.basis}.`,
        action: 'Set a forecast or safety stock by hand for this item.',
      };
    case 'constant':
      return {
        code,
        severity: 'info',
        reason: `Every observed week has the same demand (${num(Number(f.value))}), so there is no variation to model.`,
        action: 'Confirm the history is right; the forecast repeats that value.',
      };
    case 'fallback':
      return {
        code,
        severity: 'warning',
        reason: `No model could be fitted, so the forecast is the ${f.basis} with a spread taken from the history.`,
        action: 'Review the history for data errors and set the forecast by hand if needed.',
      };
    case 'not-converged':
      return {
        code,
        severity: 'warning',
        reason: `The estimation for ARIMA(${f.order}) stopped before settling, so its parameters may be off.`,
        action: 'Compare the forecast with recent sales; consider forcing a simpler model.',
      };
    case 'near-unit-root':
      return {
        code,
        severity: 'warning',
        reason: `An AR root has modulus ${Number(f.modulus).toFixed(3)} (within 1.05 of the unit circle), so demand behaves almost like a random walk and long-range forecasts are fragile.`,
        action: 'Watch the forecast after each new week; consider a model with differencing.',
      };
    case 'near-noninvertible':
      return {
        code,
        severity: 'info',
        reason: `An MA root has modulus ${Number(f.modulus).toFixed(3)} (within 1.05 of the unit circle), so the model nearly cancels its own terms.`,
        action: 'Consider forcing a simpler model with fewer terms.',
      };
    case 'residual-autocorrelation':
      return {
        code,
        severity: 'warning',
        reason: `The model's errors still follow a pattern (Ljung–Box Q = ${num(Number(f.q))} at ${f.lags} lags, p = ${num(Number(f.p), 2)}), so it misses part of the structure.`,
        action: 'Review the history; consider forcing a model with more terms.',
      };
    case 'non-normal-residuals':
      return {
        code,
        severity: 'info',
        reason: `The errors are far from bell-shaped (Jarque–Bera ${num(Number(f.jb))}, p = ${num(Number(f.p), 2)}; skewness ${num(Number(f.skew), 2)}), so the intervals are approximate.`,
        action: 'Treat the safety stock as approximate; check for promotions or one-off orders.',
      };
    case 'outlier-weeks':
      return {
        code,
        severity: 'warning',
        reason: `${f.count} week(s) lie more than 4 standard deviations from the model's fit: ${f.weeks}.`,
        action:
          'Check those weeks for one-off orders or data errors and mark them missing if they are not real demand.',
      };
    case 'level-shift':
      return {
        code,
        severity: 'warning',
        reason: `The last ${f.weeks} weeks run ${pct(Number(f.gap))} ${Number(f.gap) >= 0 ? 'above' : 'below'} the model's fit (z = ${num(Number(f.z), 2)}).`,
        action:
          'Check for a lasting change (new customer, lost listing) and adjust the forecast if it is real.',
      };
    case 'negative-forecast':
      return {
        code,
        severity: 'warning',
        reason: `The forecast goes below zero (lowest ${num(Number(f.min))} in week ${f.step}); demand cannot be negative.`,
        action: 'Negative weeks are treated as zero in planning; review the trend in the history.',
      };
    case 'intervals-too-narrow':
      return {
        code,
        severity: 'warning',
        reason:
          f.outside !== undefined
            ? `In a backtest over ${f.weeks} weeks, ${f.outside} of ${f.total} actuals fell outside the 95% intervals (about ${num(0.05 * Number(f.total), 2)} expected), so the intervals are too narrow.`
            : `Over the last ${f.weeks} weeks the one-step errors were ${num(Number(f.ratio), 2)} times as large as the model expects, so its intervals are too narrow.`,
        action: 'Raise the safety stock or review recent weeks for a change in demand.',
      };
    case 'loses-to-naive':
      return {
        code,
        severity: 'warning',
        reason: `Over the last ${f.weeks} weeks the model's errors were ${pct(Number(f.ratio) - 1)} larger than simply repeating last week's demand (error ratio ${num(Number(f.ratio), 2)}).`,
        action: 'Review the item; a simpler model or a manual forecast may serve better.',
      };
    case 'sparse-demand':
      return {
        code,
        severity: 'info',
        reason: `Demand is ${f.demandClass}: one week in ${num(Number(f.adi), 2)} has an order (ADI ${num(Number(f.adi), 3)}, CV² ${num(Number(f.cv2), 2)}), so a method for sparse demand (SBA or TSB) is used instead of ARMA.`,
        action: 'Expect orders in lumps; the forecast is an average rate per week.',
      };
    case 'unsound-model':
      return {
        code,
        severity: 'warning',
        reason: `Every candidate model had a root within 1.01 of the unit circle or did not converge; ARIMA(${f.order}) was used anyway.`,
        action: 'Consider forcing a simple model for this item.',
      };
    case 'seasonal-terms':
      return {
        code,
        severity: 'info',
        reason: `An annual cycle was found and is modelled with ${f.k} harmonic pair(s).`,
        action: 'No action needed; check the seasonal peaks look right on the chart.',
      };
  }
}
