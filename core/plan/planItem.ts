import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { acfBand, sampleAcf } from '../arma/autocorrelation';
import { arRoots, maRoots } from '../arma/roots';
import { type Diagnostics, diagnoseChoice } from '../diagnose/diagnoseChoice';
import type { FlagCode } from '../diagnose/flags';
import type { AbcClass } from '../replenish/abc';
import { serviceTarget } from '../replenish/abc';
import type { IntervalMoments, SumMoments } from '../replenish/intervalDemand';
import { planOrderLine, type VarianceSource } from '../replenish/orderLine';
import { chooseModel } from '../select/chooseModel';
import { forecastChoice, leadTimeMomentsChoice } from '../select/forecastChoice';
import type { ModelChoice } from '../select/modelChoice';
import { addWeeks } from '../series/calendar';
import { forecastBiasFlag, trackForecasts } from './trackingSignal';
import type {
  Flag,
  ForecastPoint,
  InventoryPosition,
  ItemPlan,
  ItemSettings,
  ModelSummary,
  OrderLine,
  PlanningOverrides,
  SelectionSummary,
  WeeklyHistory,
  WorkspaceSettings,
} from './types';

/**
 * Plan one item end to end: history + settings + stock + planner overrides → model choice
 * (core/select), diagnostics and flags (core/diagnose), forecast with the planner's adjustments,
 * forecast-bias tracking (Trigg 1964) and the order line (core/replenish). The planning run, the
 * CLI and the tests all call this one function. It never throws: settings that cannot be used are
 * replaced by the workspace defaults with a flag, and if planning fails anyway the item gets a
 * fallback forecast (the mean of its history) and a critical flag.
 *
 * Forecast adjustments move the forecast mean of the weeks they cover (percent or units per week);
 * the uncertainty stays the model's. Planning treats a negative weekly forecast as zero.
 */
export interface PlanItemInput {
  settings: ItemSettings;
  history: WeeklyHistory;
  position: InventoryPosition;
  overrides: PlanningOverrides;
  workspace: WorkspaceSettings;
  abcClass?: AbcClass | null;
  /** Forecasts earlier runs made for weeks that are now observed. */
  pastForecasts?: { week: string; mean: number; se: number; step?: number }[];
  /** Order search of the automatic choice (default stepwise). */
  search?: 'stepwise' | 'grid';
}

const Z80 = quantile(0.9, 0, 1);
const Z95 = quantile(0.975, 0, 1);
const ACF_MAX_LAGS = 26;

/** Where the forecast and its uncertainty come from: a model choice, or the safety-net level. */
interface ForecastSource {
  mean: Float64Array;
  se: Float64Array;
  variance: (from: number, to: number) => number;
  varianceSource: VarianceSource;
}

export function planItem(input: PlanItemInput): ItemPlan {
  const sku = String(input?.settings?.sku ?? '');
  let clean: Cleaned;
  try {
    clean = cleanInput(input);
  } catch (err) {
    return lastResort(sku, input, err);
  }
  try {
    return planWithModel(clean);
  } catch (err) {
    try {
      return planWithLevel(clean, err);
    } catch (err2) {
      return lastResort(sku, input, err2);
    }
  }
}

// ---------------------------------------------------------------------------------------------
// The normal path

function planWithModel(c: Cleaned): ItemPlan {
  const choice = chooseModel(c.y, c.weekStart, {
    forced: c.overrides.forcedModel ?? null,
    search: c.search,
  });
  let diagnostics: Diagnostics | null = null;
  const flags: Flag[] = [...c.flags];
  try {
    const d = diagnoseChoice(choice, c.weekStart, { horizon: c.workspace.horizonWeeks, y: c.y });
    diagnostics = d.diagnostics;
    flags.push(...d.flags);
  } catch (err) {
    flags.push(
      internalFlag('diagnostics-failed', 'info', `The model checks could not be computed (${message(err)}).`),
    );
  }
  const H = forecastLength(c);
  const f = forecastChoice(choice, H);
  const cache = new Map<string, number>();
  const source: ForecastSource = {
    mean: f.mean,
    se: f.se,
    variance: (a, b) => {
      const key = `${a}:${b}`;
      let v = cache.get(key);
      if (v === undefined) {
        v = leadTimeMomentsChoice(choice, a, b).variance;
        if (!Number.isFinite(v) || v < 0) {
          v = 0;
          for (let h = a; h <= b; h++) v += f.se[h - 1] ** 2;
        }
        cache.set(key, v);
      }
      return v;
    },
    varianceSource:
      choice.kind === 'arma' ? 'model' : choice.kind === 'intermittent' ? 'intermittent-method' : 'fallback',
  };
  const upstream: string[] = [];
  if (c.overrides.forcedModel) upstream.push('forced-model');
  return assemble(c, source, flags, upstream, {
    model: summariseModel(choice),
    selection: summariseSelection(choice),
    demandClass: choice.demandClass,
    diagnostics,
    fitted: choice.fitted.map((v) => (Number.isFinite(v) ? v : null)),
    residuals: choice.residuals,
    lastWeek: choice.lastWeekStart,
  });
}

// ---------------------------------------------------------------------------------------------
// The safety net: the history's mean and spread, weeks taken as independent

function planWithLevel(c: Cleaned, cause: unknown): ItemPlan {
  let s = 0;
  let m = 0;
  for (const v of c.y) {
    if (Number.isFinite(v)) {
      s += v;
      m++;
    }
  }
  const level = m > 0 ? s / m : 0;
  let ss = 0;
  for (const v of c.y) if (Number.isFinite(v)) ss += (v - level) ** 2;
  const sd = m > 1 && ss > 0 ? Math.sqrt(ss / (m - 1)) : Math.max(Math.abs(level) / 10, 1e-6);
  const H = forecastLength(c);
  const mean = new Float64Array(H).fill(level);
  const se = new Float64Array(H).fill(sd);
  const flags: Flag[] = [
    ...c.flags,
    internalFlag(
      'plan-error',
      'critical',
      `Planning this item failed (${message(cause)}), so the forecast is the history's mean ${level.toPrecision(4)} with its spread.`,
    ),
  ];
  const n = c.y.length;
  return assemble(
    c,
    { mean, se, variance: (a, b) => Math.max(0, b - a + 1) * sd * sd, varianceSource: 'fallback' },
    flags,
    [],
    {
      model: {
        kind: 'fallback',
        label: 'fallback: mean of the history',
        order: { p: 0, d: 0, q: 0 },
        seasonalHarmonics: 0,
        includeMean: true,
        ar: [],
        ma: [],
        mean: level,
        sigma2: sd * sd,
        aicc: null,
        loglik: null,
        converged: null,
        arRootModuli: [],
        maRootModuli: [],
      },
      selection: { search: 'none', candidates: [], reason: 'planning failed; fell back to the mean' },
      demandClass: 'unknown',
      diagnostics: null,
      fitted: c.y.map((v) => (Number.isFinite(v) ? level : null)),
      residuals: c.y.map((v) => v - level),
      lastWeek: n > 0 ? c.weekStart[n - 1] : '',
    },
  );
}

// ---------------------------------------------------------------------------------------------
// Shared: forecast points, adjustments, order line, tracking, ACF

interface ModelPart {
  model: ModelSummary;
  selection: SelectionSummary;
  demandClass: string;
  diagnostics: Diagnostics | null;
  fitted: (number | null)[];
  residuals: ArrayLike<number>;
  lastWeek: string;
}

function assemble(
  c: Cleaned,
  src: ForecastSource,
  flags: Flag[],
  upstream: string[],
  part: ModelPart,
): ItemPlan {
  const H = src.mean.length;
  const horizon = c.workspace.horizonWeeks;
  const weeks = futureWeeks(part.lastWeek || c.fallbackWeek, H);
  const adjusted = Float64Array.from(src.mean);
  const appliedAt: string[][] = new Array(H);
  for (const adj of c.overrides.adjustments ?? []) {
    for (let h = 0; h < H; h++) {
      const wk = weeks[h];
      if (!wk || wk < adj.from || wk > adj.to) continue;
      const before = adjusted[h];
      adjusted[h] = adj.kind === 'percent' ? before * (1 + adj.value / 100) : before + adj.value;
      (appliedAt[h] ??= []).push(
        `${adj.kind === 'percent' ? `${adj.value > 0 ? '+' : ''}${adj.value}%` : `${adj.value > 0 ? '+' : ''}${adj.value} units`}${adj.reason ? ` (${adj.reason})` : ''}`,
      );
    }
  }
  const forecast: ForecastPoint[] = [];
  for (let h = 0; h < Math.min(horizon, H); h++) {
    const m = adjusted[h];
    const se = src.se[h];
    const point: ForecastPoint = {
      step: h + 1,
      week: weeks[h],
      mean: m,
      se,
      lower80: m - Z80 * se,
      upper80: m + Z80 * se,
      lower95: m - Z95 * se,
      upper95: m + Z95 * se,
    };
    if (appliedAt[h]) point.adjustment = { baseMean: src.mean[h], applied: appliedAt[h] };
    forecast.push(point);
  }
  const planned = new Float64Array(H);
  for (let h = 0; h < H; h++) planned[h] = Math.max(0, adjusted[h]);
  const moments: SumMoments = (a, b): IntervalMoments => {
    let mean = 0;
    for (let h = Math.max(1, a); h <= b; h++) mean += planned[Math.min(h, H) - 1];
    return { mean, variance: src.variance(a, b) };
  };

  // Adjustments that touch the weeks planning uses (the forecast horizon or the interval).
  const touched = appliedAt.some((x) => x !== undefined);
  const respected = [...upstream];
  if (touched) respected.push('forecast-adjustment');

  const service = serviceTarget(
    c.settings.serviceLevel,
    c.abcClass ?? undefined,
    c.workspace.abcServiceLevels,
    c.workspace.serviceLevel,
  );
  const order = planOrderLine({
    settings: c.settings,
    moments,
    forecastMeans: planned,
    position: c.position,
    service: { level: service.level, kind: c.settings.serviceKind, source: service.source },
    safetyStockOverride: c.overrides.safetyStock ?? null,
    varianceSource: src.varianceSource,
    overridesRespected: respected,
  });
  if (touched) {
    order.explanation +=
      ' The forecast includes the planner’s adjustments for the weeks they cover; the uncertainty is the model’s.';
  }
  if (order.capsApplied.includes('shelf-life-below-moq')) {
    flags.push(
      internalFlag(
        'shelf-life-below-moq',
        'warning',
        `The minimum order (${c.settings.moq}) is more than the forecast can sell before it expires (${Math.round(order.shelfLifeLimit ?? 0)}), so no order is suggested.`,
        'Agree a smaller minimum with the supplier or decide the order by hand.',
      ),
    );
  }

  const tracking = trackForecasts(c.pastForecasts, c.weekStart, c.qty);
  const bias = forecastBiasFlag(tracking);
  if (bias) flags.push(bias);

  return {
    sku: c.settings.sku,
    model: part.model,
    selection: part.selection,
    demandClass: part.demandClass,
    diagnostics: part.diagnostics,
    fitted: part.fitted,
    forecast,
    residualAcf: residualAcf(part.residuals),
    tracking,
    flags,
    order,
  };
}

function forecastLength(c: Cleaned): number {
  const s = c.settings;
  const interval = Math.ceil(s.leadTimeWeeks + s.reviewPeriodWeeks) + 1;
  const shelf = s.shelfLifeWeeks != null ? Math.ceil(s.leadTimeWeeks) + Math.floor(s.shelfLifeWeeks) + 1 : 0;
  // 52 weeks at least: the EOQ's annual demand is the mean of the first 52 forecast weeks.
  return Math.max(c.workspace.horizonWeeks, interval, shelf, 52);
}

function futureWeeks(last: string, H: number): string[] {
  const out: string[] = new Array(H).fill('');
  if (!last) return out;
  try {
    for (let h = 0; h < H; h++) out[h] = addWeeks(last, h + 1);
  } catch {
    out.fill('');
  }
  return out;
}

/** Sample ACF of the finite residuals (gaps closed up, an approximation), lags 1…min(26, n/4). */
function residualAcf(residuals: ArrayLike<number>): ItemPlan['residualAcf'] {
  const r: number[] = [];
  for (let i = 0; i < residuals.length; i++) if (Number.isFinite(residuals[i])) r.push(residuals[i]);
  const lags = Math.min(ACF_MAX_LAGS, Math.floor(r.length / 4));
  if (lags < 1) return { lags: 0, acf: [], band: r.length > 0 ? acfBand(r.length) : 0 };
  const acf = sampleAcf(Float64Array.from(r), lags);
  return { lags, acf: Array.from(acf.subarray(1)), band: acfBand(r.length) };
}

function summariseModel(choice: ModelChoice): ModelSummary {
  const fit = choice.fit;
  const finite = (x: number[]) => x.filter((v) => Number.isFinite(v));
  const base = {
    order: choice.order,
    seasonalHarmonics: choice.seasonalHarmonics,
    includeMean: choice.includeMean,
  };
  if (choice.kind === 'intermittent' && choice.intermittent) {
    const s = choice.intermittent;
    return {
      kind: 'intermittent',
      label:
        s.method === 'tsb'
          ? `TSB (Teunter, Syntetos & Babai 2011), α = ${s.alpha}, β = ${s.beta}`
          : `SBA (Syntetos & Boylan 2005), α = ${s.alpha}`,
      ...base,
      ar: [],
      ma: [],
      mean: s.forecast,
      sigma2: s.errorVariance,
      aicc: null,
      loglik: null,
      converged: null,
      arRootModuli: [],
      maRootModuli: [],
    };
  }
  if (choice.kind === 'arma' && fit) {
    const { p, d, q } = choice.order;
    const extra = [
      choice.includeMean ? (d === 0 ? 'with mean' : 'with drift') : '',
      choice.seasonalHarmonics > 0 ? `${choice.seasonalHarmonics} annual harmonic pair(s)` : '',
    ].filter(Boolean);
    return {
      kind: 'arma',
      label: `ARIMA(${p},${d},${q})${extra.length ? ` ${extra.join(' and ')}` : ''}`,
      ...base,
      ar: [...fit.ar],
      ma: [...fit.ma],
      mean: fit.mean,
      sigma2: fit.sigma2,
      aicc: Number.isFinite(fit.aicc) ? fit.aicc : null,
      loglik: Number.isFinite(fit.loglik) ? fit.loglik : null,
      converged: fit.converged,
      arRootModuli: finite(arRoots(fit)),
      maRootModuli: finite(maRoots(fit)),
    };
  }
  const lvl = choice.fallbackLevel;
  return {
    kind: 'fallback',
    label: `fallback: ${lvl?.basis === 'last-value' || fit?.fallback === 'last-value' ? 'last observed value' : 'mean of the history'}`,
    ...base,
    ar: fit ? [...fit.ar] : [],
    ma: fit ? [...fit.ma] : [],
    mean: lvl ? lvl.value : (fit?.mean ?? null),
    sigma2: lvl ? lvl.sd * lvl.sd : (fit?.sigma2 ?? null),
    aicc: null,
    loglik: null,
    converged: fit ? fit.converged : null,
    arRootModuli: [],
    maRootModuli: [],
  };
}

function summariseSelection(choice: ModelChoice): SelectionSummary {
  return {
    search: choice.selection.search,
    candidates: choice.selection.candidates.map((k) => ({
      order: k.order,
      seasonalHarmonics: k.seasonalHarmonics,
      includeMean: k.includeMean,
      aicc: k.aicc != null && Number.isFinite(k.aicc) ? k.aicc : null,
      ...(k.passedOver ? { passedOver: k.passedOver } : {}),
    })),
    reason: choice.selection.reason,
  };
}

// ---------------------------------------------------------------------------------------------
// Input cleaning: what cannot be used is replaced, with a flag naming field and value

interface Cleaned {
  settings: ItemSettings;
  workspace: WorkspaceSettings;
  position: InventoryPosition;
  overrides: PlanningOverrides;
  abcClass: AbcClass | null;
  weekStart: string[];
  qty: (number | null)[];
  y: number[];
  fallbackWeek: string;
  pastForecasts: { week: string; mean: number; se: number }[];
  search: 'stepwise' | 'grid';
  flags: Flag[];
}

function cleanInput(input: PlanItemInput): Cleaned {
  const flags: Flag[] = [];
  const replaced = (field: string, value: unknown, used: string) =>
    flags.push(
      internalFlag(
        'setting-replaced',
        'warning',
        `The setting ${field} = ${JSON.stringify(value)} cannot be used, so ${used} was used instead.`,
        `Correct ${field} in the item master.`,
      ),
    );
  const ws0 = input.workspace;
  const okLevel = (x: unknown): x is number => typeof x === 'number' && x > 0 && x < 1;
  const okWeeks = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x) && x >= 0;
  const workspace: WorkspaceSettings = {
    ...ws0,
    serviceLevel: okLevel(ws0?.serviceLevel) ? ws0.serviceLevel : 0.95,
    serviceKind: ws0?.serviceKind === 'fill' ? 'fill' : 'cycle',
    reviewPeriodWeeks: okWeeks(ws0?.reviewPeriodWeeks) ? ws0.reviewPeriodWeeks : 1,
    leadTimeWeeks: okWeeks(ws0?.leadTimeWeeks) ? ws0.leadTimeWeeks : 2,
    horizonWeeks:
      typeof ws0?.horizonWeeks === 'number' && ws0.horizonWeeks >= 1 && ws0.horizonWeeks <= 520
        ? Math.floor(ws0.horizonWeeks)
        : 26,
    abcServiceLevels: {
      A: okLevel(ws0?.abcServiceLevels?.A) ? ws0.abcServiceLevels.A : 0.98,
      B: okLevel(ws0?.abcServiceLevels?.B) ? ws0.abcServiceLevels.B : 0.95,
      C: okLevel(ws0?.abcServiceLevels?.C) ? ws0.abcServiceLevels.C : 0.9,
    },
  };
  const s0 = input.settings;
  const settings: ItemSettings = { ...s0 };
  if (settings.serviceLevel != null && !okLevel(settings.serviceLevel)) {
    replaced('service_level', settings.serviceLevel, 'the class or workspace default');
    settings.serviceLevel = null;
  }
  if (settings.serviceKind !== 'cycle' && settings.serviceKind !== 'fill') {
    replaced('service_kind', settings.serviceKind, `'${workspace.serviceKind}'`);
    settings.serviceKind = workspace.serviceKind;
  }
  if (!okWeeks(settings.leadTimeWeeks)) {
    replaced('lead_time_weeks', settings.leadTimeWeeks, `${workspace.leadTimeWeeks} weeks`);
    settings.leadTimeWeeks = workspace.leadTimeWeeks;
  }
  if (!okWeeks(settings.leadTimeSdWeeks)) {
    if (settings.leadTimeSdWeeks != null) replaced('lead_time_sd_weeks', settings.leadTimeSdWeeks, '0');
    settings.leadTimeSdWeeks = 0;
  }
  if (!okWeeks(settings.reviewPeriodWeeks)) {
    replaced('review_period_weeks', settings.reviewPeriodWeeks, `${workspace.reviewPeriodWeeks} weeks`);
    settings.reviewPeriodWeeks = workspace.reviewPeriodWeeks;
  }
  if (
    !(typeof settings.casePack === 'number' && settings.casePack >= 1 && Number.isFinite(settings.casePack))
  ) {
    replaced('case_pack', settings.casePack, '1');
    settings.casePack = 1;
  }
  if (!okWeeks(settings.moq)) {
    if (settings.moq != null) replaced('moq', settings.moq, '0');
    settings.moq = 0;
  }
  if (
    settings.shelfLifeWeeks != null &&
    !(okWeeks(settings.shelfLifeWeeks) && settings.shelfLifeWeeks >= 1)
  ) {
    replaced('shelf_life_weeks', settings.shelfLifeWeeks, 'no shelf-life limit');
    settings.shelfLifeWeeks = null;
  }
  if (typeof settings.active !== 'boolean') settings.active = true;
  const p0 = input.position ?? { onHand: 0, onOrder: 0, backorders: 0, asOf: null };
  const num = (field: string, v: unknown): number => {
    if (typeof v === 'number' && Number.isFinite(v)) return v;
    if (v != null) replaced(field, v, '0');
    return 0;
  };
  const position: InventoryPosition = {
    onHand: num('on_hand', p0.onHand),
    onOrder: num('on_order', p0.onOrder),
    backorders: num('backorders', p0.backorders),
    asOf: p0.asOf ?? null,
  };
  const ws = input.history?.weekStart ?? [];
  const qs = input.history?.qty ?? [];
  const n = Math.min(ws.length, qs.length);
  if (ws.length !== qs.length) {
    flags.push(
      internalFlag(
        'history-mismatch',
        'warning',
        `The history has ${ws.length} week dates but ${qs.length} quantities; only the first ${n} were used.`,
        'Re-import the sales history for this item.',
      ),
    );
  }
  const weekStart = ws.slice(0, n);
  const qty = qs.slice(0, n).map((v) => (typeof v === 'number' && Number.isFinite(v) ? v : null));
  const y = qty.map((v) => (v === null ? Number.NaN : v));
  const o = input.overrides ?? {};
  const overrides: PlanningOverrides = {
    forcedModel: o.forcedModel ?? null,
    adjustments: (o.adjustments ?? []).filter(
      (a) =>
        a &&
        typeof a.value === 'number' &&
        Number.isFinite(a.value) &&
        typeof a.from === 'string' &&
        typeof a.to === 'string',
    ),
    safetyStock:
      typeof o.safetyStock === 'number' && Number.isFinite(o.safetyStock) && o.safetyStock >= 0
        ? o.safetyStock
        : null,
  };
  if (o.safetyStock != null && overrides.safetyStock == null)
    replaced('safety stock override', o.safetyStock, 'the computed safety stock');
  const abc = input.abcClass;
  return {
    settings,
    workspace,
    position,
    overrides,
    abcClass: abc === 'A' || abc === 'B' || abc === 'C' ? abc : null,
    weekStart,
    qty,
    y,
    fallbackWeek: position.asOf ?? '',
    pastForecasts: (input.pastForecasts ?? []).filter((f) => f && typeof f.week === 'string'),
    search: input.search === 'grid' ? 'grid' : 'stepwise',
    flags,
  };
}

// ---------------------------------------------------------------------------------------------

function internalFlag(code: FlagCode, severity: Flag['severity'], reason: string, action?: string): Flag {
  return {
    code,
    severity,
    reason,
    action: action ?? 'Check the item’s history and settings, then plan it again; order by hand meanwhile.',
  };
}

function message(err: unknown): string {
  const m = err instanceof Error ? err.message : String(err);
  return m.split('\n')[0].slice(0, 300);
}

/** When even the safety net fails: no forecast, a zero order line, a critical flag. */
function lastResort(sku: string, input: PlanItemInput, err: unknown): ItemPlan {
  const kind = input?.settings?.serviceKind === 'fill' ? 'fill' : 'cycle';
  const level = input?.settings?.serviceLevel ?? input?.workspace?.serviceLevel ?? 0.95;
  const order: OrderLine = {
    orderQty: 0,
    casePacks: 0,
    reorderPoint: 0,
    orderUpTo: 0,
    safetyStock: 0,
    computedSafetyStock: 0,
    intervalForecast: 0,
    intervalSd: 0,
    intervalWeeks: 0,
    leadTimeForecast: 0,
    serviceLevel: level,
    serviceKind: kind,
    serviceSource: 'workspace',
    safetyFactor: 0,
    review: 'periodic',
    inventoryPosition: 0,
    rawQty: 0,
    eoq: null,
    lotSize: null,
    shelfLifeLimit: null,
    capsApplied: [],
    overridesRespected: [],
    varianceSource: 'fallback',
    explanation: `No order suggested: planning failed (${message(err)}). Order by hand until the item plans again.`,
  };
  return {
    sku,
    model: {
      kind: 'fallback',
      label: 'none: planning failed',
      order: { p: 0, d: 0, q: 0 },
      seasonalHarmonics: 0,
      includeMean: false,
      ar: [],
      ma: [],
      mean: null,
      sigma2: null,
      aicc: null,
      loglik: null,
      converged: null,
      arRootModuli: [],
      maRootModuli: [],
    },
    selection: { search: 'none', candidates: [], reason: 'planning failed' },
    demandClass: 'unknown',
    diagnostics: null,
    fitted: [],
    forecast: [],
    residualAcf: { lags: 0, acf: [], band: 0 },
    tracking: null,
    flags: [
      internalFlag(
        'plan-error',
        'critical',
        `Planning this item failed (${message(err)}); there is no forecast.`,
      ),
    ],
    order,
  };
}
