import { scratchBlock, withScratch } from '../arma/typedArrays';
import type { Flag } from '../plan/types';
import { polynomialRootModuli } from '../select/engine';
import { type ChoiceForecast, forecastChoice } from '../select/forecastChoice';
import type { ModelChoice } from '../select/modelChoice';
import { chiSquareUpperTail } from './chiSquare';
import { makeFlag } from './flags';
import { type JarqueBeraResult, jarqueBera } from './jarqueBera';
import { type LevelShiftResult, levelShift } from './levelShift';
import { type LjungBoxResult, ljungBox, ljungBoxLags } from './ljungBox';

/**
 * The diagnostic record of one fitted item and the review flags that follow from it. Thresholds
 * (stated; common practice unless cited):
 *   Ljung–Box p < 0.01 at min(10, n/5) lags (min(104, n/5) when annual terms are in), df − (p + q);
 *   any AR or MA root modulus < 1.05; Jarque–Bera p < 0.001; |standardised residual| > 4 (outlier
 *   weeks, listed by date); a level shift over the last 12 weeks (levelShift.ts); non-convergence;
 *   fewer than 52 weeks of history; a forecast mean below zero within the horizon;
 *   over the last 26 one-step innovations: Σ z² against χ²_m (upper tail p < 0.01: intervals too
 *   narrow) and the model's mean absolute one-step error against that of the naive forecast
 *   y_{t−1} (ratio > 1.1: loses to naive).
 */
export interface Diagnostics {
  ljungBox: LjungBoxResult | null;
  jarqueBera: JarqueBeraResult | null;
  roots: { ar: number[]; ma: number[]; minAr: number | null; minMa: number | null };
  outliers: { week: string; z: number }[];
  levelShift: LevelShiftResult | null;
  converged: boolean | null;
  historyWeeks: number;
  observedWeeks: number;
  negativeForecast: { step: number; min: number } | null;
  recent: {
    weeks: number;
    /** √(mean z²) over the recent innovations: 1 when the model's σ is right. */
    errorRatio: number;
    pValue: number;
    /** Mean |model one-step error| / mean |naive one-step error| over the same weeks. */
    naiveRatio: number;
  } | null;
  demand: { demandClass: string; adi: number; cv2: number };
}

export const ROOT_WARNING = 1.05;
export const OUTLIER_Z = 4;
export const RECENT_WEEKS = 26;
export const SHORT_HISTORY_WEEKS = 52;
/** The model must be clearly worse (10% larger mean absolute error) to be flagged: a random walk model
 * and the naive forecast are the same model up to a drift, and should not flag by chance. */
export const LOSES_TO_NAIVE = 1.1;

export interface DiagnoseOptions {
  horizon?: number;
  y?: ArrayLike<number>;
  /** The choice's forecast over at least `horizon` weeks when the caller has it already. */
  forecast?: ChoiceForecast;
}

export function diagnoseChoice(
  choice: ModelChoice,
  weekStart: readonly string[],
  options: DiagnoseOptions = {},
): { diagnostics: Diagnostics; flags: Flag[] } {
  // The standardised errors and the tests' copies are scratch: the record holds plain numbers only.
  return withScratch(() => diagnoseScratched(choice, weekStart, options));
}

function diagnoseScratched(
  choice: ModelChoice,
  weekStart: readonly string[],
  options: DiagnoseOptions,
): { diagnostics: Diagnostics; flags: Flag[] } {
  // One function per check, each pushing its flags; the order of the calls is the order of the flags.
  const flags: Flag[] = [];
  const fit = choice.fit;
  // Actual demand is fitted + residual wherever both exist.
  const y = options.y ?? choice.fitted.map((f, i) => f + choice.residuals[i]);
  const z = standardizedErrors(choice);
  const tests = residualTests(choice, flags);
  const roots = rootChecks(choice, flags);
  const outliers = choice.kind !== 'intermittent' ? outlierWeeks(z, weekStart, flags) : [];
  let shift: LevelShiftResult | null = null;
  if (choice.kind === 'arma') {
    shift = levelShift(y, choice.fitted, z, 12);
    if (shift.detected)
      flags.push(makeFlag('level-shift', { weeks: shift.weeks, gap: shift.relativeGap, z: shift.z }));
  }
  const converged = fit && choice.kind === 'arma' ? fit.converged : null;
  if (converged === false) flags.push(makeFlag('not-converged', { order: orderText(choice) }));
  if (choice.historyWeeks < SHORT_HISTORY_WEEKS)
    flags.push(makeFlag('short-history', { weeks: choice.historyWeeks }));
  if (choice.kind !== 'arma') kindFlags(choice, flags);
  if (choice.kind === 'arma' && choice.selection.reason.includes('no sound candidate')) {
    flags.push(makeFlag('unsound-model', { order: orderText(choice) }));
  }
  if (choice.seasonalHarmonics > 0) flags.push(makeFlag('seasonal-terms', { k: choice.seasonalHarmonics }));
  const negative = negativeForecast(choice, options.horizon ?? 26, options.forecast, flags);
  const recent = recentChecks(choice, y, z, flags);

  return {
    diagnostics: {
      ljungBox: tests.lb,
      jarqueBera: tests.jb,
      roots,
      outliers,
      levelShift: shift,
      converged,
      historyWeeks: choice.historyWeeks,
      observedWeeks: choice.observedWeeks,
      negativeForecast: negative,
      recent,
      demand: { demandClass: choice.demandClass, adi: choice.demand.adi, cv2: choice.demand.cv2 },
    },
    flags,
  };
}

/** Standardised one-step errors on the scale the model measures them (NaN where there is none). */
function standardizedErrors(choice: ModelChoice): Float64Array {
  const fit = choice.fit;
  const n = choice.residuals.length;
  const [z] = scratchBlock([n]);
  z.fill(Number.NaN);
  if (choice.kind === 'arma' && fit) {
    const sz = fit.standardizedResiduals;
    const off = n - sz.length;
    for (let i = 0; i < sz.length; i++) if (i + off >= 0) z[i + off] = sz[i];
    return z;
  }
  const sigma =
    choice.kind === 'intermittent' && choice.intermittent
      ? Math.sqrt(choice.intermittent.errorVariance)
      : (choice.fallbackLevel?.sd ?? (fit ? Math.sqrt(fit.sigma2) : Number.NaN));
  if (sigma > 0) for (let i = 0; i < n; i++) z[i] = choice.residuals[i] / sigma;
  return z;
}

/** Ljung–Box and Jarque–Bera on an ARMA model's innovations (at least 8 of them). */
function residualTests(
  choice: ModelChoice,
  flags: Flag[],
): { lb: LjungBoxResult | null; jb: JarqueBeraResult | null } {
  const fit = choice.fit;
  if (choice.kind !== 'arma' || !fit) return { lb: null, jb: null };
  const innov = fit.residuals;
  let m = 0;
  for (let i = 0; i < innov.length; i++) if (Number.isFinite(innov[i])) m++;
  if (m < 8) return { lb: null, jb: null };
  const pq = choice.order.p + choice.order.q;
  const lb = ljungBox(innov, ljungBoxLags(m, choice.seasonalHarmonics > 0 ? 52 : 0), pq);
  const jb = jarqueBera(innov);
  if (lb.pValue < 0.01)
    flags.push(makeFlag('residual-autocorrelation', { q: lb.statistic, lags: lb.lags, p: lb.pValue }));
  if (jb.pValue < 0.001)
    flags.push(makeFlag('non-normal-residuals', { jb: jb.statistic, p: jb.pValue, skew: jb.skewness }));
  return { lb, jb };
}

function rootChecks(choice: ModelChoice, flags: Flag[]): Diagnostics['roots'] {
  const fit = choice.fit;
  const arRoots = fit && choice.kind === 'arma' ? polynomialRootModuli(fit.ar) : [];
  const maRoots = fit && choice.kind === 'arma' ? polynomialRootModuli(fit.ma) : [];
  const minAr = arRoots.length ? arRoots[0] : null;
  const minMa = maRoots.length ? maRoots[0] : null;
  if (minAr !== null && minAr < ROOT_WARNING) flags.push(makeFlag('near-unit-root', { modulus: minAr }));
  if (minMa !== null && minMa < ROOT_WARNING) flags.push(makeFlag('near-noninvertible', { modulus: minMa }));
  return { ar: arRoots, ma: maRoots, minAr, minMa };
}

/** Weeks whose standardised error exceeds OUTLIER_Z, by date. */
function outlierWeeks(
  z: Float64Array,
  weekStart: readonly string[],
  flags: Flag[],
): { week: string; z: number }[] {
  const outliers: { week: string; z: number }[] = [];
  for (let i = 0; i < z.length; i++) {
    if (Number.isFinite(z[i]) && Math.abs(z[i]) > OUTLIER_Z)
      outliers.push({ week: weekStart[i] ?? `#${i}`, z: z[i] });
  }
  if (outliers.length > 0) {
    const shown = outliers.slice(0, 5).map((o) => o.week);
    const more = outliers.length > 5 ? ` and ${outliers.length - 5} more` : '';
    flags.push(makeFlag('outlier-weeks', { count: outliers.length, weeks: shown.join(', ') + more }));
  }
  return outliers;
}

/** Why an item has no ARMA model: a fallback's reason, or sparse demand. */
function kindFlags(choice: ModelChoice, flags: Flag[]): void {
  const fit = choice.fit;
  if (choice.kind === 'fallback') {
    const basis = choice.fallbackLevel?.basis ?? (fit?.fallback === 'last-value' ? 'last value' : 'mean');
    const engineFlags = fit?.flags ?? [];
    if (engineFlags.includes('constant') || engineFlags.includes('all-zero')) {
      const v = choice.fitted.find((f) => Number.isFinite(f)) ?? 0;
      flags.push(makeFlag('constant', { value: v }));
    } else if (choice.observedWeeks < 3 || engineFlags.includes('too-short')) {
      flags.push(makeFlag('too-short', { weeks: choice.observedWeeks, basis }));
    } else {
      flags.push(makeFlag('fallback', { basis }));
    }
  }
  if (choice.kind === 'intermittent') {
    flags.push(
      makeFlag('sparse-demand', {
        demandClass: choice.demandClass,
        adi: choice.demand.adi,
        cv2: choice.demand.cv2,
      }),
    );
  }
}

/** The lowest forecast mean below zero within the horizon, if any. */
function negativeForecast(
  choice: ModelChoice,
  horizon: number,
  given: ChoiceForecast | undefined,
  flags: Flag[],
): Diagnostics['negativeForecast'] {
  if (!(horizon > 0)) return null;
  let negative: Diagnostics['negativeForecast'] = null;
  const f = given && given.mean.length >= horizon ? given : forecastChoice(choice, horizon);
  for (let h = 0; h < horizon; h++) {
    if (f.mean[h] < 0 && (!negative || f.mean[h] < negative.min)) negative = { step: h + 1, min: f.mean[h] };
  }
  if (negative) flags.push(makeFlag('negative-forecast', negative));
  return negative;
}

/** The cheap checks from the last 26 one-step innovations (no refit). */
function recentChecks(
  choice: ModelChoice,
  y: ArrayLike<number>,
  z: Float64Array,
  flags: Flag[],
): Diagnostics['recent'] {
  let m = 0;
  let z2 = 0;
  let modelAbs = 0;
  let naiveAbs = 0;
  for (let i = choice.residuals.length - 1; i >= 1 && m < RECENT_WEEKS; i--) {
    const e = choice.residuals[i];
    const naive = y[i] - y[i - 1];
    if (!Number.isFinite(z[i]) || !Number.isFinite(e) || !Number.isFinite(naive)) continue;
    m++;
    z2 += z[i] * z[i];
    modelAbs += Math.abs(e);
    naiveAbs += Math.abs(naive);
  }
  if (m < 8) return null;
  const pValue = chiSquareUpperTail(z2, m);
  const errorRatio = Math.sqrt(z2 / m);
  const naiveRatio = naiveAbs > 0 ? modelAbs / naiveAbs : modelAbs > 0 ? Number.POSITIVE_INFINITY : 1;
  if (pValue < 0.01) flags.push(makeFlag('intervals-too-narrow', { weeks: m, ratio: errorRatio }));
  if (naiveRatio > LOSES_TO_NAIVE && choice.kind !== 'intermittent')
    flags.push(makeFlag('loses-to-naive', { weeks: m, ratio: naiveRatio }));
  return { weeks: m, errorRatio, pValue, naiveRatio: Number.isFinite(naiveRatio) ? naiveRatio : 1e9 };
}

function orderText(c: ModelChoice): string {
  return `${c.order.p},${c.order.d},${c.order.q}`;
}
