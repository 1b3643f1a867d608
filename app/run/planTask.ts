/**
 * The planning run's per-item function, run inside a pool worker: one item's input → the engine's
 * planItem (core/plan/planItem, pure, never throws) → the rows the store keeps (ItemRunRecord).
 * Serialising the detail to JSON here, in the worker, keeps that work off the main thread, which
 * only inserts the rows.
 */
import { planItem } from '../../core/plan/planItem';
import type { ItemPlan } from '../../core/plan/types';
import type { ItemRunRecord, ModelRecord } from '../store/runs';
import { checkRunRecord } from './checkRecord';
import { expandHistory } from './compactHistory';
import type { RunItemInput } from './runInput';

type ModelKey = string;

const keyOf = (m: {
  order: { p: number; d: number; q: number };
  seasonalHarmonics: number;
  includeMean: boolean;
}) => `${m.order.p},${m.order.d},${m.order.q},${m.seasonalHarmonics},${m.includeMean ? 1 : 0}`;

/** Candidates of the selection plus the chosen model, one row per distinct model (the chosen one wins). */
function modelRecords(plan: ItemPlan): ModelRecord[] {
  const rows = new Map<ModelKey, ModelRecord>();
  for (const c of plan.selection.candidates) {
    rows.set(keyOf(c), {
      p: c.order.p,
      d: c.order.d,
      q: c.order.q,
      seasonalHarmonics: c.seasonalHarmonics,
      includeMean: c.includeMean,
      aicc: c.aicc,
      chosen: false,
      detailJson: JSON.stringify({ passedOver: c.passedOver ?? null }),
    });
  }
  const m = plan.model;
  const prior = rows.get(keyOf(m));
  rows.set(keyOf(m), {
    p: m.order.p,
    d: m.order.d,
    q: m.order.q,
    seasonalHarmonics: m.seasonalHarmonics,
    includeMean: m.includeMean,
    aicc: m.aicc ?? prior?.aicc ?? null,
    chosen: true,
    detailJson: JSON.stringify(m),
  });
  return [...rows.values()];
}

/** The item screen's extras: what ItemRunRecord has no column for. */
function detail(plan: ItemPlan, input: RunItemInput): string {
  const d = plan.diagnostics;
  const lines: {
    name: string;
    value: number | null;
    pValue: number | null;
    flagCode: string | null;
    text: string;
  }[] = [];
  if (d?.ljungBox) {
    lines.push({
      name: `Ljung–Box Q(${d.ljungBox.lags})`,
      value: d.ljungBox.statistic,
      pValue: d.ljungBox.pValue,
      flagCode: 'residual-autocorrelation',
      text: `residual autocorrelation test on ${d.ljungBox.n} residuals, ${d.ljungBox.df} degrees of freedom`,
    });
  }
  if (d?.jarqueBera) {
    lines.push({
      name: 'Jarque–Bera',
      value: d.jarqueBera.statistic,
      pValue: d.jarqueBera.pValue,
      flagCode: 'non-normal-residuals',
      text: `normality of residuals: skewness ${d.jarqueBera.skewness.toFixed(2)}, kurtosis ${d.jarqueBera.kurtosis.toFixed(2)}`,
    });
  }
  if (d?.levelShift) {
    lines.push({
      name: 'Level shift',
      value: d.levelShift.z,
      pValue: d.levelShift.pValue,
      flagCode: 'level-shift',
      text: `last ${d.levelShift.weeks} weeks against the weeks before: relative gap ${d.levelShift.relativeGap.toFixed(2)}`,
    });
  }
  if (d?.recent) {
    lines.push({
      name: 'Recent error ratio',
      value: d.recent.errorRatio,
      pValue: d.recent.pValue,
      flagCode: 'intervals-too-narrow',
      text: `over the last ${d.recent.weeks} weeks; 1 when the model's spread is right`,
    });
    lines.push({
      name: 'Model vs naive forecast',
      value: d.recent.naiveRatio,
      pValue: null,
      flagCode: 'loses-to-naive',
      text: 'mean absolute one-step error of the model over that of last week’s value',
    });
  }
  if (d?.roots.minAr != null) {
    lines.push({
      name: 'Smallest AR root modulus',
      value: d.roots.minAr,
      pValue: null,
      flagCode: 'near-unit-root',
      text: 'above 1 means stationary; close to 1 means the model is near a unit root',
    });
  }
  if (d?.roots.minMa != null) {
    lines.push({
      name: 'Smallest MA root modulus',
      value: d.roots.minMa,
      pValue: null,
      flagCode: 'near-noninvertible',
      text: 'above 1 means invertible',
    });
  }
  const band = plan.residualAcf.band;
  return JSON.stringify({
    kind: plan.model.kind,
    label: plan.model.label,
    demandClass: plan.demandClass,
    abcClass: input.abcClass,
    fitted: plan.fitted,
    // aligned with the history (same length), so the screen places them without a copy of the weeks
    residualAcf: plan.residualAcf.acf,
    // band = 1.96/√n (Box & Jenkins), so n = (1.96/band)²
    residualCount: band > 0 ? Math.round((1.959963985 / band) ** 2) : 0,
    acfBand: band,
    arRootModuli: plan.model.arRootModuli,
    maRootModuli: plan.model.maRootModuli,
    ar: plan.model.ar,
    ma: plan.model.ma,
    diagnostics: lines,
    diagnosticsDetail: d,
    selection: { search: plan.selection.search, reason: plan.selection.reason },
    tracking: plan.tracking,
    overridesApplied: plan.order.overridesRespected,
    adjustedWeeks: plan.forecast
      .filter((f) => f.adjustment)
      .map((f) => ({ week: f.week, baseMean: f.adjustment!.baseMean, applied: f.adjustment!.applied })),
  });
}

export function toRunRecord(plan: ItemPlan, input: RunItemInput): ItemRunRecord {
  const o = plan.order;
  return {
    status: plan.model.kind === 'fallback' ? 'fallback' : 'planned',
    models: modelRecords(plan),
    forecasts: plan.forecast.map((f) => ({
      step: f.step,
      week: f.week,
      mean: f.mean,
      se: f.se,
      lower80: f.lower80,
      upper80: f.upper80,
      lower95: f.lower95,
      upper95: f.upper95,
    })),
    flags: plan.flags,
    order: {
      orderQty: o.orderQty,
      casePacks: o.casePacks,
      reorderPoint: o.reorderPoint,
      orderUpTo: o.orderUpTo,
      safetyStock: o.safetyStock,
      intervalForecast: o.intervalForecast,
      intervalSd: o.intervalSd,
      serviceLevel: o.serviceLevel,
      serviceKind: o.serviceKind,
      explanation: o.explanation,
      detailJson: JSON.stringify(o),
    },
    diagnosticsJson: detail(plan, input),
    error: null,
  };
}

export function planTask(input: RunItemInput): ItemRunRecord {
  const plan = planItem({
    settings: input.settings,
    history: expandHistory(input.history),
    position: input.position,
    overrides: input.overrides,
    workspace: input.workspace,
    abcClass: input.abcClass,
    pastForecasts: input.pastForecasts,
  });
  const record = toRunRecord(plan, input);
  checkRunRecord(input.settings.sku, record);
  return record;
}
