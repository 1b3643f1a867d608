import { forecastIntervals } from '../arma/forecast';
import { backtestChoice } from '../backtest/backtestChoice';
import { backtestFlags } from '../backtest/backtestFlags';
import { diagnoseChoice } from '../diagnose/diagnoseChoice';
import { formatIsoDate } from '../series/calendar';
import { chooseModel } from './chooseModel';
import { forecastChoice } from './forecastChoice';

/**
 * One item's record for the `fit` command's JSON line, from history to choice, forecast, diagnosis
 * and (on request) backtest. With an order given the model is exactly ARIMA(p,d,q) (a mean when
 * d = 0 unless switched off; no seasonal terms, no sparse-demand method, no search); without one the
 * choice is automatic. Plain data; non-finite numbers become null.
 */
export interface ChoiceRecordOptions {
  order: { p: number; d: number; q: number } | null;
  includeMean: boolean | undefined;
  horizon: number;
  search?: 'stepwise' | 'grid';
  backtest?: boolean;
  /** Largest horizon of the backtest (default 4 weeks). */
  backtestLead?: number;
}

export function choiceRecord(
  file: string,
  values: Float64Array,
  firstWeekDay: number,
  options: ChoiceRecordOptions,
): Record<string, unknown> {
  const n = values.length;
  const weekStart = Array.from({ length: n }, (_, i) => formatIsoDate(firstWeekDay + 7 * i));
  const choice = chooseModel(
    values,
    weekStart,
    options.order
      ? {
          forced: {
            order: options.order,
            seasonalHarmonics: 0,
            includeMean: options.includeMean ?? options.order.d === 0,
          },
        }
      : { search: options.search ?? 'stepwise' },
  );
  const h = options.horizon;
  const fc = forecastChoice(choice, h);
  const iv = forecastIntervals(fc.mean, fc.se);
  const forecast = [];
  for (let i = 0; i < h; i++) {
    forecast.push({
      step: i + 1,
      mean: num(fc.mean[i]),
      se: num(fc.se[i]),
      lower80: num(iv.lower80[i]),
      upper80: num(iv.upper80[i]),
      lower95: num(iv.lower95[i]),
      upper95: num(iv.upper95[i]),
    });
  }
  const { diagnostics, flags } = diagnoseChoice(choice, weekStart, { horizon: h, y: values });
  const fit = choice.kind === 'intermittent' ? null : choice.fit;
  const record: Record<string, unknown> = {
    // The fields of the fixed-order record first, in its order, then what the choice adds.
    file,
    n,
    order: choice.order,
    mean: fit?.mean == null ? null : num(fit.mean),
    ar: fit ? fit.ar.map(num) : [],
    ma: fit ? fit.ma.map(num) : [],
    sigma2: num(
      fit ? fit.sigma2 : (choice.intermittent?.errorVariance ?? (choice.fallbackLevel?.sd ?? 0) ** 2),
    ),
    loglik: fit ? num(fit.loglik) : null,
    aic: fit ? num(fit.aic) : null,
    aicc: fit ? num(fit.aicc) : null,
    bic: fit ? num(fit.bic) : null,
    converged: fit ? fit.converged : false,
    stderr: fit
      ? {
          ar: fit.stderr.ar.map(num),
          ma: fit.stderr.ma.map(num),
          mean: fit.stderr.mean === null ? null : num(fit.stderr.mean),
          xreg: fit.stderr.xreg.map(num),
        }
      : null,
    flags: flags.map((f) => ({ code: f.code, severity: f.severity, reason: f.reason, action: f.action })),
    forecast,
    signConvention: 'ma-minus',
    kind: choice.kind,
    seasonalHarmonics: choice.seasonalHarmonics,
    xreg: fit ? fit.xregCoef.map(num) : [],
    intermittent: choice.intermittent
      ? {
          method: choice.intermittent.method,
          alpha: choice.intermittent.alpha,
          size: num(choice.intermittent.size),
          interval: num(choice.intermittent.interval),
          rate: num(choice.intermittent.forecast),
        }
      : null,
    selection: {
      candidates: choice.selection.candidates.map((c) => ({
        order: c.order,
        seasonalHarmonics: c.seasonalHarmonics,
        includeMean: c.includeMean,
        aicc: c.aicc === null ? null : num(c.aicc),
        ...(c.passedOver ? { passedOver: c.passedOver } : {}),
      })),
      reason: choice.selection.reason,
    },
    demandClass: choice.demandClass,
    diagnostics: finite(diagnostics),
  };
  if (options.backtest) {
    const b = backtestChoice(values, weekStart, choice, { lead: options.backtestLead ?? 4 });
    record.backtest = finite(b);
    // The backtest's verdicts replace the cheap checks of the same name.
    const fromBacktest = backtestFlags(b);
    const codes = new Set(fromBacktest.map((f) => f.code));
    record.flags = [
      ...(record.flags as typeof fromBacktest).filter((f) => !codes.has(f.code)),
      ...fromBacktest,
    ];
  }
  return record;
}

function num(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

/** A deep copy with non-finite numbers as null (JSON has no NaN or Infinity). */
function finite<T>(v: T): T {
  return JSON.parse(JSON.stringify(v, (_k, x) => (typeof x === 'number' && !Number.isFinite(x) ? null : x)));
}
