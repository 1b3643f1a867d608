/**
 * The contract between the statistics (core/), the store and run (app/), and the screens
 * (renderer/): what goes into planning one item and what comes out. Plain data only, so a result
 * can cross a worker thread, be stored as JSON and be sent to the renderer unchanged.
 *
 * Sign convention everywhere in Provision (Box–Jenkins, "ma-minus"):
 *   y_t − μ = φ_1(y_{t−1} − μ) + … + φ_p(y_{t−p} − μ) + ε_t − θ_1 ε_{t−1} − … − θ_q ε_{t−q}.
 */

import type { Diagnostics } from '../diagnose/diagnoseChoice';

export type ServiceKind = 'cycle' | 'fill';

/** One item's planning settings, as the item master (or the workspace defaults) gives them. */
export interface ItemSettings {
  sku: string;
  description: string;
  supplier: string | null;
  unit: string;
  casePack: number;
  moq: number;
  leadTimeWeeks: number;
  leadTimeSdWeeks: number;
  /** 0 means continuous review (s, Q); R > 0 means periodic review (R, S) every R weeks. */
  reviewPeriodWeeks: number;
  /** A fraction, e.g. 0.95. Null means "take the ABC class default, then the workspace default". */
  serviceLevel: number | null;
  serviceKind: ServiceKind;
  unitCost: number | null;
  /** Annual holding cost as a fraction of unit cost. */
  holdingRate: number | null;
  orderCost: number | null;
  shelfLifeWeeks: number | null;
  active: boolean;
}

/** Contiguous weekly history; weekStart[i] is the ISO date (YYYY-MM-DD) of the week's first day. */
export interface WeeklyHistory {
  weekStart: string[];
  /** Demand per week; null = missing observation (empty cell, gap, or a stocked-out week). */
  qty: (number | null)[];
}

export interface InventoryPosition {
  onHand: number;
  onOrder: number;
  backorders: number;
  asOf: string | null;
}

export interface ModelOrder {
  p: number;
  d: number;
  q: number;
}

/** A review flag: our own short code, a sentence a planner understands, and what to do. */
export interface Flag {
  code: string;
  severity: 'info' | 'warning' | 'critical';
  reason: string;
  action: string;
}

export interface ForecastPoint {
  step: number;
  week: string;
  mean: number;
  se: number;
  lower80: number;
  upper80: number;
  lower95: number;
  upper95: number;
  /** Set when a planner adjustment changed this week: the model's own mean and what was applied. */
  adjustment?: { baseMean: number; applied: string[] };
}

/** Planner decisions the next run must respect (see app/store overrides and the audit log). */
export interface PlanningOverrides {
  /** Fit exactly this model instead of choosing one. */
  forcedModel?: { order: ModelOrder; seasonalHarmonics: number; includeMean: boolean } | null;
  /** Manual changes to the forecast over a date range (inclusive ISO dates of week starts). */
  adjustments?: ForecastAdjustment[];
  /** A safety stock fixed by hand, in units. */
  safetyStock?: number | null;
}

export interface ForecastAdjustment {
  from: string;
  to: string;
  kind: 'percent' | 'quantity';
  /** Percent: +10 means ten per cent more. Quantity: units added per week (may be negative). */
  value: number;
  reason: string;
}

/** Workspace-wide defaults and knobs. */
export interface WorkspaceSettings {
  serviceLevel: number;
  serviceKind: ServiceKind;
  reviewPeriodWeeks: number;
  leadTimeWeeks: number;
  horizonWeeks: number;
  /** 1 = Monday (ISO 8601) … 7 = Sunday. */
  weekStartDay: number;
  abcCutoffs: [number, number];
  abcServiceLevels: { A: number; B: number; C: number };
}

export const DEFAULT_WORKSPACE: WorkspaceSettings = {
  serviceLevel: 0.95,
  serviceKind: 'cycle',
  reviewPeriodWeeks: 1,
  leadTimeWeeks: 2,
  horizonWeeks: 26,
  weekStartDay: 1,
  abcCutoffs: [0.8, 0.95],
  abcServiceLevels: { A: 0.98, B: 0.95, C: 0.9 },
};

/** Which review a line was planned for: continuous (s, Q) when reviewPeriodWeeks = 0, else periodic (R, S). */
export type ReviewKind = 'continuous' | 'periodic';

/**
 * One item's replenishment decision (core/replenish/orderLine). Quantities in the item's unit.
 * CSV export columns map as order_qty = orderQty, case_packs = casePacks, reorder_point = reorderPoint,
 * order_up_to = orderUpTo, safety_stock = safetyStock, interval_forecast = intervalForecast,
 * interval_sd = intervalSd, service_level = serviceLevel, service_kind = serviceKind.
 */
export interface OrderLine {
  orderQty: number;
  casePacks: number;
  reorderPoint: number;
  orderUpTo: number;
  safetyStock: number;
  /** Safety stock the policy maths gave before an override or the zero floor. */
  computedSafetyStock: number;
  /** Forecast demand over the protection interval (L, or R + L weeks). */
  intervalForecast: number;
  /** Its standard deviation, covariances between weeks and lead-time spread included. */
  intervalSd: number;
  intervalWeeks: number;
  /** Forecast demand over the lead time alone. */
  leadTimeForecast: number;
  serviceLevel: number;
  serviceKind: ServiceKind;
  /** Where the service target came from. */
  serviceSource: 'item' | 'abc' | 'workspace';
  safetyFactor: number;
  review: ReviewKind;
  inventoryPosition: number;
  /** Order-up-to − position before rounding and caps (0 when no order is due). */
  rawQty: number;
  /** Economic order quantity (Harris 1913) for continuous review when costs are known, else null. */
  eoq: number | null;
  /** Lot size used for continuous review (S = s + lot), null for periodic review. */
  lotSize: number | null;
  /** Units a delivery can sell before expiry (shelf-life items), else null. */
  shelfLifeLimit: number | null;
  /** Codes of each rounding or cap that changed the quantity: case-pack, moq, shelf-life, … */
  capsApplied: string[];
  /** Planner overrides this line respected: safety-stock, forecast-adjustment, forced-model. */
  overridesRespected: string[];
  /** The variance source: 'model' (ARMA ψ-weights), 'intermittent-method' or 'fallback'. */
  varianceSource: 'model' | 'intermittent-method' | 'fallback';
  explanation: string;
}

/** The fitted model of an item, summarised as plain data (core/plan/planItem). */
export interface ModelSummary {
  kind: 'arma' | 'intermittent' | 'fallback';
  /** Plain words, e.g. "ARIMA(1,0,1) with mean and 2 annual harmonic pairs". */
  label: string;
  order: ModelOrder;
  seasonalHarmonics: number;
  includeMean: boolean;
  ar: number[];
  ma: number[];
  /** Mean (d = 0) or drift (d = 1) of the ARMA part; the intermittent rate per week; the fallback level. */
  mean: number | null;
  /** Innovation variance; for intermittent and fallback items the one-step error variance used. */
  sigma2: number | null;
  aicc: number | null;
  loglik: number | null;
  converged: boolean | null;
  arRootModuli: number[];
  maRootModuli: number[];
}

export interface SelectionSummary {
  search: 'stepwise' | 'grid' | 'forced' | 'none';
  candidates: {
    order: ModelOrder;
    seasonalHarmonics: number;
    includeMean: boolean;
    aicc: number | null;
    passedOver?: string;
  }[];
  reason: string;
}

/** Realised accuracy of forecasts earlier runs made for weeks now observed (Trigg 1964). */
export interface ForecastTracking {
  /** Number of past forecasts matched with an observed week. */
  count: number;
  /** Mean error (actual − forecast); positive means the forecasts ran low. */
  bias: number;
  /** Smoothed error / smoothed absolute error after the last week, in [−1, 1]. */
  trackingSignal: number;
  /** |signal| above this is flagged (about 5% by chance for unbiased errors). */
  limit: number;
  alpha: number;
}

/** Everything planning one item produced: what the run stores and the screens show. */
export interface ItemPlan {
  sku: string;
  model: ModelSummary;
  selection: SelectionSummary;
  demandClass: string;
  /** Ljung–Box, roots, normality, outliers, … (core/diagnose/diagnoseChoice), null if it failed. */
  diagnostics: Diagnostics | null;
  /** One-step fitted values aligned with the history, null where undefined. */
  fitted: (number | null)[];
  forecast: ForecastPoint[];
  /** Sample ACF of the residuals at lags 1…lags, with the ±1.96/√n band. */
  residualAcf: { lags: number; acf: number[]; band: number };
  tracking: ForecastTracking | null;
  flags: Flag[];
  order: OrderLine;
}
