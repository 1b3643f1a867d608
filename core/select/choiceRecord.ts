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
 * choice is automatic. Plain data for JSON.stringify (non-finite numbers are written as null).
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
  const weekStart = weekStartsFrom(firstWeekDay, n);
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
  const { diagnostics, flags } = diagnoseChoice(choice, weekStart, { horizon: h, y: values, forecast: fc });
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
          ...(choice.intermittent.beta !== undefined ? { beta: choice.intermittent.beta } : {}),
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
        ...(c.aiccFrom ? { aiccFrom: c.aiccFrom } : {}),
        ...(c.passedOver ? { passedOver: c.passedOver } : {}),
      })),
      reason: choice.selection.reason,
    },
    demandClass: choice.demandClass,
    // Plain numbers, arrays and objects only: JSON.stringify writes its non-finite numbers as null.
    diagnostics,
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

/**
 * A deep copy of plain data (objects, arrays, typed arrays) with non-finite numbers as null, as JSON
 * has no NaN or Infinity; undefined members are left out, as JSON.stringify leaves them.
 */
export function finite<T>(v: T): T {
  return finiteCopy(v) as T;
}

function finiteCopy(v: unknown): unknown {
  if (typeof v === 'number') return Number.isFinite(v) ? v : null;
  if (v === null || typeof v !== 'object') return v;
  if (Array.isArray(v) || ArrayBuffer.isView(v)) {
    const a = v as ArrayLike<unknown>;
    const out = new Array<unknown>(a.length);
    for (let i = 0; i < a.length; i++) {
      const x = finiteCopy(a[i]);
      out[i] = x === undefined ? null : x;
    }
    return out;
  }
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(v)) {
    const x = finiteCopy((v as Record<string, unknown>)[key]);
    if (x !== undefined) out[key] = x;
  }
  return out;
}

/**
 * Labels already made, by day number. The files of one call (and the items of one store) share
 * their calendar weeks, so each label is made once instead of once per file: 156 new strings per
 * three-year file were a fifth of the memory a `fit` allocated per file. Bounded: cleared when full.
 */
const WEEK_LABELS = new Map<number, string>();
const MAX_WEEK_LABELS = 1 << 16;
/** The last list made: files of one call usually cover the same weeks, and then share it. */
let lastLabels: { first: number; labels: readonly string[] } = { first: Number.NaN, labels: [] };

/**
 * YYYY-MM-DD of day numbers first, first + 7, … (n of them), as formatIsoDate writes them. The list
 * is frozen: the same list is returned again for the same weeks.
 */
export function weekStartsFrom(first: number, n: number): readonly string[] {
  const count = Math.max(0, n);
  if (lastLabels.first === first && lastLabels.labels.length === count) return lastLabels.labels;
  const out = new Array<string>(count);
  for (let i = 0; i < count; i++) {
    const day = first + 7 * i;
    let label = WEEK_LABELS.get(day);
    if (label === undefined) {
      if (WEEK_LABELS.size >= MAX_WEEK_LABELS) WEEK_LABELS.clear();
      label = formatIsoDate(day);
      WEEK_LABELS.set(day, label);
    }
    out[i] = label;
  }
  lastLabels = { first, labels: Object.freeze(out) };
  return lastLabels.labels;
}
