/**
 * The measured acceptance figures of the selection issue, shared by the (light) unit tests and the
 * (full) benchmark: interval calibration, the seasonal decision, and robustness on awkward series.
 */
import quantile from '@stdlib/stats-base-dists-normal-quantile';
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
}

/** Fit on n weeks of a random ARMA series, check the 1- and 4-step intervals on held-out weeks. */
export function calibration(count: number, seed: number): Calibration {
  const rng = createRng(seed);
  let c180 = 0;
  let c195 = 0;
  let c480 = 0;
  let c495 = 0;
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
  }
  return {
    series: count,
    cover1_80: c180 / count,
    cover1_95: c195 / count,
    cover4_80: c480 / count,
    cover4_95: c495 / count,
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
