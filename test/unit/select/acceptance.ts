/**
 * The measured acceptance figures of the selection issue, shared by the (light) unit tests and the
 * (full) benchmark: interval calibration, the seasonal decision, and robustness on awkward series.
 */
import cdf from '@stdlib/stats-base-dists-normal-cdf';
import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { psiWeights } from '../../../core/arma/psi';
import { createRng } from '../../../core/arma/random';
import { simulateArma } from '../../../core/arma/simulate';
import { mase, naiveScale } from '../../../core/backtest/metrics';
import { diagnoseChoice } from '../../../core/diagnose/diagnoseChoice';
import { chooseModel } from '../../../core/select/chooseModel';
import { forecastChoice, leadTimeMomentsChoice } from '../../../core/select/forecastChoice';
import { awkwardSeries, randomArmaModel, weeklySeries, weeksFrom } from './seriesGenerators';

const Z80 = quantile(0.9, 0, 1);
const Z95 = quantile(0.975, 0, 1);

export interface Calibration {
  series: number;
  cover1_80: number;
  cover1_95: number;
  cover4_80: number;
  cover4_95: number;
  /**
   * The same coverages for the true model on the same held-out values: its innovations ε (recovered
   * from the simulated series with the true coefficients) against ±z·σ, and Σ_{j<4} ψ_j ε_{n+3−j}
   * against ±z·σ·(Σ ψ_j²)^{1/2} for 4 steps (Box, Jenkins & Reinsel, ch. 5). Any model fitted to the
   * data is measured against this: it is what perfect knowledge of the process would cover on these
   * draws (binomial sampling error √(c(1 − c)/series), about 1 point at 95% on 500 series).
   */
  oracle1_80: number;
  oracle1_95: number;
  oracle4_80: number;
  oracle4_95: number;
  /**
   * The same coverages as probabilities instead of one draw per series: given the history, the
   * held-out value is normal with the true model's conditional mean (held-out value less its
   * unpredictable part, Σ_{j<h} ψ_j ε) and s.d. σ(Σ_{j<h} ψ_j²)^{1/2}, so the chance that the chosen
   * model's interval [f − z·se, f + z·se] covers it is Φ((f + z·se − m)/s) − Φ((f − z·se − m)/s),
   * averaged over the series. Conditional Monte Carlo (Rao–Blackwellisation; e.g. Ross,
   * "Simulation", 5th ed., §9.4): the same quantity as the draw-based figure with the held-out
   * noise integrated out, so what is left is the models' own error. The true model scores exactly
   * the nominal level on it.
   */
  exact1_80: number;
  exact1_95: number;
  exact4_80: number;
  exact4_95: number;
  /** Series where the choice differenced (d ≥ 1) although every simulated series is stationary. */
  differenced: number;
  /** 1-step 95% coverage on those. */
  differencedCover1_95: number;
}

/**
 * One-step innovations of the true ARMA model over y (ma-minus form), started from zero errors at
 * the first point: with every MA root modulus ≥ 1.25 the start-up error has decayed by 1.25^−100 by
 * the first held-out week (n ≥ 104).
 */
function trueInnovations(y: Float64Array, model: { ar: number[]; ma: number[]; mean: number }): Float64Array {
  const e = new Float64Array(y.length);
  for (let t = 0; t < y.length; t++) {
    let v = y[t] - model.mean;
    for (let i = 1; i <= model.ar.length && i <= t; i++) v -= model.ar[i - 1] * (y[t - i] - model.mean);
    for (let j = 1; j <= model.ma.length && j <= t; j++) v += model.ma[j - 1] * e[t - j];
    e[t] = v;
  }
  return e;
}

/** Fit on n weeks of a random ARMA series, check the 1- and 4-step intervals on held-out weeks. */
export function calibration(count: number, seed: number): Calibration {
  const rng = createRng(seed);
  let c180 = 0;
  let c195 = 0;
  let c480 = 0;
  let c495 = 0;
  let o180 = 0;
  let o195 = 0;
  let o480 = 0;
  let o495 = 0;
  let diffd = 0;
  let diffd195 = 0;
  let x180 = 0;
  let x195 = 0;
  let x480 = 0;
  let x495 = 0;
  const inside = (f: number, se: number, z: number, m: number, s: number) =>
    cdf((f + z * se - m) / s, 0, 1) - cdf((f - z * se - m) / s, 0, 1);
  for (let i = 0; i < count; i++) {
    const model = randomArmaModel(rng);
    const n = 104 + Math.floor(rng.uniform() * 157);
    const y = simulateArma(model, n + 4, rng);
    const c = chooseModel(y.subarray(0, n), weeksFrom(n), { seasonal: false });
    const f = forecastChoice(c, 4);
    const e1 = Math.abs(y[n] - f.mean[0]);
    const e4 = Math.abs(y[n + 3] - f.mean[3]);
    if (e1 <= Z80 * f.se[0]) c180++;
    if (e1 <= Z95 * f.se[0]) c195++;
    if (e4 <= Z80 * f.se[3]) c480++;
    if (e4 <= Z95 * f.se[3]) c495++;
    if (c.order.d > 0) {
      diffd++;
      if (e1 <= Z95 * f.se[0]) diffd195++;
    }
    const eps = trueInnovations(y, model);
    const psi = psiWeights(model.ar, model.ma, 4);
    const sd = Math.sqrt(model.sigma2);
    let t4 = 0;
    let v4 = 0;
    for (let j = 0; j < 4; j++) {
      t4 += psi[j] * eps[n + 3 - j];
      v4 += psi[j] * psi[j];
    }
    const sd4 = sd * Math.sqrt(v4);
    if (Math.abs(eps[n]) <= Z80 * sd) o180++;
    if (Math.abs(eps[n]) <= Z95 * sd) o195++;
    if (Math.abs(t4) <= Z80 * sd4) o480++;
    if (Math.abs(t4) <= Z95 * sd4) o495++;
    const m1 = y[n] - eps[n];
    const m4 = y[n + 3] - t4;
    x180 += inside(f.mean[0], f.se[0], Z80, m1, sd);
    x195 += inside(f.mean[0], f.se[0], Z95, m1, sd);
    x480 += inside(f.mean[3], f.se[3], Z80, m4, sd4);
    x495 += inside(f.mean[3], f.se[3], Z95, m4, sd4);
  }
  return {
    series: count,
    cover1_80: c180 / count,
    cover1_95: c195 / count,
    cover4_80: c480 / count,
    cover4_95: c495 / count,
    oracle1_80: o180 / count,
    oracle1_95: o195 / count,
    oracle4_80: o480 / count,
    oracle4_95: o495 / count,
    exact1_80: x180 / count,
    exact1_95: x195 / count,
    exact4_80: x480 / count,
    exact4_95: x495 / count,
    differenced: diffd,
    differencedCover1_95: diffd > 0 ? diffd195 / diffd : Number.NaN,
  };
}

export interface SeasonalFigures {
  series: number;
  /** Share of annual-cycle series where Fourier terms were chosen. */
  chosenOnSeasonal: number;
  /** Mean 13-week MASE of the chosen model and of the best non-seasonal model on the cycle series. */
  maseChosen: number;
  maseNonSeasonal: number;
  /** Share of series without a cycle where no Fourier terms were chosen. */
  notChosenOnPlain: number;
}

export function seasonality(count: number, seed: number): SeasonalFigures {
  const rng = createRng(seed);
  const n = 156;
  const h = 13;
  const w = weeksFrom(n);
  let chosen = 0;
  let notChosen = 0;
  let mChosen = 0;
  let mPlain = 0;
  for (let i = 0; i < count; i++) {
    const y = weeklySeries(rng, n + h, true);
    const train = y.subarray(0, n);
    const c = chooseModel(train, w);
    if (c.seasonalHarmonics > 0) chosen++;
    const plain = chooseModel(train, w, { seasonal: false });
    const scale = naiveScale(train, 1);
    const fc = forecastChoice(c, h);
    const fp = forecastChoice(plain, h);
    const ec = new Float64Array(h);
    const ep = new Float64Array(h);
    for (let k = 0; k < h; k++) {
      ec[k] = y[n + k] - fc.mean[k];
      ep[k] = y[n + k] - fp.mean[k];
    }
    mChosen += mase(ec, scale);
    mPlain += mase(ep, scale);
    const z = weeklySeries(rng, n, false);
    if (chooseModel(z, w).seasonalHarmonics === 0) notChosen++;
  }
  return {
    series: count,
    chosenOnSeasonal: chosen / count,
    maseChosen: mChosen / count,
    maseNonSeasonal: mPlain / count,
    notChosenOnPlain: notChosen / count,
  };
}

export interface Robustness {
  series: number;
  exceptions: number;
  nonFinite: number;
  withoutFlags: number;
  kinds: Record<string, number>;
  firstProblem: string | null;
}

/** Random awkward series through choice, forecast, lead-time sums and diagnosis. */
export function robustness(count: number, seed: number): Robustness {
  const rng = createRng(seed);
  const out: Robustness = {
    series: count,
    exceptions: 0,
    nonFinite: 0,
    withoutFlags: 0,
    kinds: {},
    firstProblem: null,
  };
  for (let i = 0; i < count; i++) {
    const y = awkwardSeries(rng);
    const w = weeksFrom(y.length);
    try {
      const c = chooseModel(y, w);
      out.kinds[c.kind] = (out.kinds[c.kind] ?? 0) + 1;
      const f = forecastChoice(c, 12);
      const lt = leadTimeMomentsChoice(c, 1, 4);
      const d = diagnoseChoice(c, w);
      let bad = !Number.isFinite(lt.mean) || !Number.isFinite(lt.variance);
      for (let k = 0; k < 12; k++) if (!Number.isFinite(f.mean[k]) || !Number.isFinite(f.se[k])) bad = true;
      if (bad) {
        out.nonFinite++;
        out.firstProblem ??= `series ${i} (n = ${y.length}): non-finite forecast`;
      }
      // "Each gets a result and flags": the flag list exists; an item with nothing to report has none.
      if (!Array.isArray(d.flags)) out.withoutFlags++;
    } catch (err) {
      out.exceptions++;
      out.firstProblem ??= `series ${i} (n = ${y.length}): ${err instanceof Error ? err.message : String(err)}`;
    }
  }
  return out;
}
