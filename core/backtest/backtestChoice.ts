import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { chooseModel } from '../select/chooseModel';
import { forecastChoice } from '../select/forecastChoice';
import type { ModelChoice } from '../select/modelChoice';
import { mase, meanAbsolute, meanOf, naiveScale } from './metrics';

/**
 * Rolling-origin evaluation (Tashman 2000, Int. J. Forecasting 16) over the last `weeks` weeks:
 * for each origin T the chosen specification (order, harmonics, mean) is refitted on y_1…y_T and
 * forecast 1…L weeks ahead; intermittent and fallback items are re-chosen at each origin. Per
 * horizon: MASE against the in-sample naive (or, with annual terms and > 60 weeks, seasonal-naive
 * m = 52) scale of the data before the first origin (Hyndman & Koehler 2006), bias (mean of
 * actual − forecast), and the share of actuals inside the 80% and 95% intervals. The naive forecast
 * (last observed value, or the value 52 weeks before) is scored the same way; the model loses to
 * naive when its mean absolute error over all horizons is larger.
 */
export interface BacktestOptions {
  /** Weeks of origins at the end of the history (default 26). */
  weeks?: number;
  /** Largest horizon L (default 4). */
  lead?: number;
}

export interface HorizonScore {
  step: number;
  count: number;
  mase: number | null;
  bias: number | null;
  coverage80: number | null;
  coverage95: number | null;
  naiveMase: number | null;
}

export interface BacktestResult {
  origins: number;
  lead: number;
  scale: 'naive' | 'seasonal-naive';
  horizons: HorizonScore[];
  mase: number | null;
  naiveMase: number | null;
  bias: number | null;
  coverage80: number | null;
  coverage95: number | null;
  losesToNaive: boolean;
}

const Z80 = quantile(0.9, 0, 1);
const Z95 = quantile(0.975, 0, 1);

export function backtestChoice(
  y: ArrayLike<number>,
  weekStart: readonly string[],
  choice: ModelChoice,
  options: BacktestOptions = {},
): BacktestResult {
  const n = y.length;
  const series = Float64Array.from({ length: n }, (_, i) => (Number.isFinite(y[i]) ? y[i] : Number.NaN));
  const lead = Math.max(1, Math.floor(options.lead ?? 4));
  const weeks = Math.max(1, Math.floor(options.weeks ?? 26));
  const firstOrigin = Math.max(n - weeks, Math.ceil(n / 2), 3);
  const seasonal = choice.seasonalHarmonics > 0 && firstOrigin > 60;
  const m = seasonal ? 52 : 1;
  const scale = naiveScale(series.subarray(0, firstOrigin), m);

  const err: number[][] = Array.from({ length: lead }, () => []);
  const naiveErr: number[][] = Array.from({ length: lead }, () => []);
  const in80: number[] = new Array(lead).fill(0);
  const in95: number[] = new Array(lead).fill(0);
  let origins = 0;
  for (let T = firstOrigin; T < n; T++) {
    const prefix = series.subarray(0, T);
    const weeksPrefix = weekStart.slice(0, T);
    let refit: ModelChoice;
    if (choice.kind === 'arma') {
      refit = chooseModel(prefix, weeksPrefix, {
        forced: {
          order: choice.order,
          seasonalHarmonics: choice.seasonalHarmonics,
          includeMean: choice.includeMean,
        },
      });
    } else {
      refit = chooseModel(prefix, weeksPrefix, { seasonal: false });
    }
    const steps = Math.min(lead, n - T);
    const f = forecastChoice(refit, steps);
    let lastObs = Number.NaN;
    for (let i = T - 1; i >= 0; i--) {
      if (Number.isFinite(series[i])) {
        lastObs = series[i];
        break;
      }
    }
    origins++;
    for (let h = 1; h <= steps; h++) {
      const actual = series[T + h - 1];
      if (!Number.isFinite(actual)) continue;
      const e = actual - f.mean[h - 1];
      err[h - 1].push(e);
      if (Math.abs(e) <= Z80 * f.se[h - 1]) in80[h - 1]++;
      if (Math.abs(e) <= Z95 * f.se[h - 1]) in95[h - 1]++;
      const naive = seasonal && T + h - 1 - 52 >= 0 ? series[T + h - 1 - 52] : lastObs;
      if (Number.isFinite(naive)) naiveErr[h - 1].push(actual - naive);
    }
  }
  const fin = (x: number): number | null => (Number.isFinite(x) ? x : null);
  const horizons: HorizonScore[] = err.map((e, i) => ({
    step: i + 1,
    count: e.length,
    mase: fin(mase(e, scale)),
    bias: fin(meanOf(e)),
    coverage80: e.length ? in80[i] / e.length : null,
    coverage95: e.length ? in95[i] / e.length : null,
    naiveMase: fin(mase(naiveErr[i], scale)),
  }));
  const all = err.flat();
  const allNaive = naiveErr.flat();
  const total = all.length;
  const c80 = in80.reduce((a, b) => a + b, 0);
  const c95 = in95.reduce((a, b) => a + b, 0);
  const modelMae = meanAbsolute(all);
  const naiveMae = meanAbsolute(allNaive);
  return {
    origins,
    lead,
    scale: seasonal ? 'seasonal-naive' : 'naive',
    horizons,
    mase: fin(mase(all, scale)),
    naiveMase: fin(mase(allNaive, scale)),
    bias: fin(meanOf(all)),
    coverage80: total ? c80 / total : null,
    coverage95: total ? c95 / total : null,
    losesToNaive: Number.isFinite(modelMae) && Number.isFinite(naiveMae) && modelMae > naiveMae,
  };
}
