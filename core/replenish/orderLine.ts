import type { InventoryPosition, ItemSettings, OrderLine, ServiceKind } from '../plan/types';
import { economicOrderQuantity } from './eoq';
import { intervalDemand, type SumMoments } from './intervalDemand';
import { orderQuantity } from './orderQuantity';
import { safetyFactor } from './safetyFactor';
import { weeklyCheckReorder } from './weeklyCheckUndershoot';

/**
 * One item's order line: protection-interval demand → safety stock → reorder point and order-up-to
 * level → suggested quantity, with a plain-words explanation of every number.
 *
 * Policies (Silver, Pyke & Thomas, Inventory and Production Management in Supply Chains):
 * - periodic review (R, S), reviewPeriodWeeks = R > 0: protection interval R + L;
 *   S = forecast over R + L + safety stock; an order is due whenever the position is below S
 *   (the reorder point of the line is S itself); fill-rate Q = expected demand of one review period.
 * - continuous review (s, Q), reviewPeriodWeeks = 0: stock is in fact only checked at each weekly
 *   planning run, so this is the (R, s, nQ) system with R = 1 (core/replenish/weeklyCheckUndershoot):
 *   s = forecast over L + expected undershoot (the part of the next week's drop that happens before
 *   the run sees the position) + safety stock; at or below s, order the fewest whole lots Q that
 *   bring the position back above s. Q = the economic order quantity (Harris 1913) when costs are
 *   known, else one week of forecast demand (our default), never less than the minimum order or one
 *   case pack, in whole case packs; the fill-rate Q is that lot. S = s + Q is the highest position.
 * Safety stock = k·σ, never negative; a safety stock fixed by the planner replaces it.
 */
export type VarianceSource = OrderLine['varianceSource'];

export interface OrderLineInput {
  settings: Pick<
    ItemSettings,
    | 'unit'
    | 'casePack'
    | 'moq'
    | 'leadTimeWeeks'
    | 'leadTimeSdWeeks'
    | 'reviewPeriodWeeks'
    | 'unitCost'
    | 'holdingRate'
    | 'orderCost'
    | 'shelfLifeWeeks'
    | 'active'
  >;
  /** Moments of the forecast demand sum over steps from…to (covariances included). */
  moments: SumMoments;
  /** Weekly forecast means from step 1 (adjustments applied); used for EOQ and the shelf-life cap. */
  forecastMeans: ArrayLike<number>;
  position: InventoryPosition;
  service: { level: number; kind: ServiceKind; source: OrderLine['serviceSource'] };
  safetyStockOverride?: number | null;
  varianceSource: VarianceSource;
  /** Overrides already respected upstream (forecast-adjustment, forced-model), echoed on the line. */
  overridesRespected?: string[];
}

export function planOrderLine(input: OrderLineInput): OrderLine {
  const { settings, position, service } = input;
  const periodic = settings.reviewPeriodWeeks > 0;
  const R = periodic ? settings.reviewPeriodWeeks : 0;
  const L = Math.max(0, settings.leadTimeWeeks);
  const sdL = Math.max(0, settings.leadTimeSdWeeks || 0);
  const interval = intervalDemand(input.moments, L, sdL, R);
  const lead = periodic ? intervalDemand(input.moments, L, 0, 0) : interval;
  const intervalMean = Math.max(0, interval.mean);
  const unit = settings.unit ? ` ${settings.unit}` : '';
  const pack = Number.isFinite(settings.casePack) ? Math.max(settings.casePack, 1) : 1;
  const moq = Math.max(0, settings.moq || 0);

  const weeklyForYear = meanOf(input.forecastMeans, 52, interval.meanWeekly);
  const eoq = periodic
    ? null
    : economicOrderQuantity(52 * weeklyForYear, settings.orderCost, settings.unitCost, settings.holdingRate);
  const lotBase = periodic ? 0 : Math.max(eoq ?? Math.max(0, interval.meanWeekly), moq, pack);
  // the lot in whole case packs (the tolerance keeps 24.000000001 from becoming an extra pack)
  const lotSize = periodic ? null : Math.ceil(lotBase / pack - 1e-9) * pack;
  const cycleDemand = periodic ? R * Math.max(0, interval.meanWeekly) : (lotSize as number);

  let factor: { k: number; method: string };
  let computedSafetyStock: number;
  let undershoot = 0;
  if (periodic) {
    factor = safetyFactor(service.kind, service.level, interval.sd, cycleDemand);
    computedSafetyStock = factor.k * interval.sd;
  } else {
    // The weekly drop of (position − s): a week's demand plus the revision of the lead-time
    // forecast, Var(sum of weeks 1..L+1) − Var(sum of weeks 1..L) = σ²(ψ₀ + … + ψ_L)² for ARMA.
    // (A fractional L interpolates between whole weeks, as intervalDemand does.)
    const vNext = intervalDemand(input.moments, L + 1, 0, 0).demandVariance;
    const vLead = intervalDemand(input.moments, L, 0, 0).demandVariance;
    const wr = weeklyCheckReorder(
      service.kind,
      service.level,
      interval.sd,
      Math.max(0, interval.meanWeekly),
      Math.sqrt(Math.max(0, vNext - vLead)),
      lotSize as number,
    );
    factor = { k: wr.k, method: wr.method };
    computedSafetyStock = wr.safetyStock;
    undershoot = wr.expectedUndershoot;
  }
  const qWords =
    service.kind === 'fill'
      ? periodic
        ? ` (Q = expected demand of one ${w(R)}-week review period, ${q(cycleDemand)})`
        : ` (Q = the lot, ${q(cycleDemand)})`
      : '';
  const overridden = input.safetyStockOverride != null && Number.isFinite(input.safetyStockOverride);
  const safetyStock = overridden
    ? Math.max(0, input.safetyStockOverride as number)
    : Math.max(0, computedSafetyStock);
  const reorderPoint = intervalMean + undershoot + safetyStock;
  const orderUpTo = periodic ? reorderPoint : reorderPoint + (lotSize as number);
  const ip = position.onHand + position.onOrder - position.backorders;

  const overridesRespected = [...(input.overridesRespected ?? [])];
  if (overridden) overridesRespected.push('safety-stock');

  const text: string[] = [];
  const weeksText = periodic
    ? `the next ${w(interval.weeks)} weeks (lead time ${w(L)} + review period ${w(R)})`
    : `the ${w(interval.weeks)}-week lead time`;
  text.push(
    `Forecast demand over ${weeksText}: ${q(intervalMean)}${unit}, give or take ${q(interval.sd)} ` +
      `(one standard deviation: ${interval.approximation}).`,
  );
  if (input.varianceSource === 'intermittent-method') {
    text.push(
      'Demand is sparse, so the uncertainty comes from the sparse-demand method’s own one-step errors, ' +
        'not from an ARMA model.',
    );
  } else if (input.varianceSource === 'fallback') {
    text.push(
      'No model could be trusted for this item, so the uncertainty comes from a simple fallback forecast.',
    );
  }
  const serviceWords =
    service.kind === 'cycle' ? 'cycle service (no stockout in a cycle)' : 'fill rate (demand met from stock)';
  const sourceWords =
    service.source === 'item'
      ? "the item's own target"
      : service.source === 'abc'
        ? 'its ABC class default'
        : 'the workspace default';
  text.push(`Target: ${pct(service.level)} ${serviceWords}, ${sourceWords}.`);
  if (overridden) {
    text.push(
      `Safety stock fixed by the planner at ${q(safetyStock)}${unit}; it replaces the computed ` +
        `${q(Math.max(0, computedSafetyStock))} (safety factor ${factor.k.toFixed(2)} × ${q(interval.sd)}).`,
    );
  } else if (computedSafetyStock < 0) {
    text.push(
      `Safety factor ${factor.k.toFixed(2)} from the ${factor.method}${qWords} is negative: the target is met without ` +
        'safety stock, so it is set to 0, never below.',
    );
  } else {
    text.push(
      `Safety factor ${factor.k.toFixed(2)} from the ${factor.method}${qWords}; safety stock ${factor.k.toFixed(2)} × ` +
        `${q(interval.sd)} = ${q(safetyStock)}${unit}.`,
    );
  }
  if (periodic) {
    text.push(
      `Order-up-to level = ${q(intervalMean)} + ${q(safetyStock)} = ${q(orderUpTo)}; an order is due below it.`,
    );
  } else {
    const lotWords =
      eoq != null
        ? `the economic order quantity ${q(eoq)} (Harris)`
        : 'one week of forecast demand (no order and holding costs given)';
    const raised = lotBase > (eoq ?? interval.meanWeekly) + 1e-9;
    const packed = (lotSize as number) > lotBase + 1e-9;
    text.push(
      `Stock is checked at each weekly run, so the reorder point covers lead time + 1 week: by the time a ` +
        `run sees the position it may have fallen up to a week's demand below the reorder point, ` +
        `${q(undershoot)}${unit} on average.`,
    );
    text.push(
      `Reorder point = ${q(intervalMean)} + ${q(undershoot)} + ${q(safetyStock)} = ${q(reorderPoint)}; lot ` +
        `${q(lotSize as number)} from ${lotWords}${raised ? ', raised to the minimum order or one case pack' : ''}` +
        `${packed ? `, rounded up to whole case packs of ${q(pack)}` : ''}; at or below the reorder point, whole ` +
        `lots are ordered to bring the position back above it (at most ${q(orderUpTo)}).`,
    );
  }
  text.push(
    `Inventory position = on hand ${q(position.onHand)} + on order ${q(position.onOrder)} − backorders ` +
      `${q(position.backorders)} = ${q(ip)}.`,
  );

  let qty = 0;
  let casePacks = 0;
  let rawQty = 0;
  let shelfLifeLimit: number | null = null;
  const capsApplied: string[] = [];
  if (!settings.active) {
    text.push('The item is inactive (discontinued), so no order is suggested.');
    capsApplied.push('inactive');
  } else {
    const oq = orderQuantity({
      orderUpTo,
      reorderPoint,
      lot: periodic ? null : lotSize,
      inventoryPosition: ip,
      casePack: pack,
      moq,
      shelfLife:
        settings.shelfLifeWeeks != null && settings.shelfLifeWeeks > 0
          ? { shelfLifeWeeks: settings.shelfLifeWeeks, leadTimeWeeks: L, forecastMeans: input.forecastMeans }
          : null,
    });
    qty = oq.qty;
    casePacks = oq.casePacks;
    rawQty = oq.raw;
    shelfLifeLimit = oq.shelfLifeLimit;
    capsApplied.push(...oq.applied);
    text.push(...oq.steps);
    if (qty > 0) {
      text.push(
        pack > 1
          ? `Suggested order: ${q(qty)}${unit} (${casePacks} case pack${casePacks === 1 ? '' : 's'}).`
          : `Suggested order: ${q(qty)}${unit}.`,
      );
    }
  }

  return {
    orderQty: qty,
    casePacks,
    reorderPoint,
    orderUpTo,
    safetyStock,
    computedSafetyStock,
    intervalForecast: intervalMean,
    intervalSd: interval.sd,
    intervalWeeks: interval.weeks,
    leadTimeForecast: Math.max(0, lead.mean),
    serviceLevel: service.level,
    serviceKind: service.kind,
    serviceSource: service.source,
    safetyFactor: factor.k,
    review: periodic ? 'periodic' : 'continuous',
    inventoryPosition: ip,
    rawQty,
    eoq,
    lotSize,
    shelfLifeLimit,
    capsApplied,
    overridesRespected,
    varianceSource: input.varianceSource,
    explanation: text.join(' '),
  };
}

function meanOf(x: ArrayLike<number>, n: number, otherwise: number): number {
  const m = Math.min(n, x.length);
  if (m === 0) return Math.max(0, otherwise);
  let s = 0;
  for (let i = 0; i < m; i++) s += Math.max(0, x[i]);
  return s / m;
}

function q(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (Number.isInteger(x)) return String(x);
  return Math.abs(x) >= 100 ? x.toFixed(0) : x.toFixed(1);
}

function w(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toFixed(1);
}

function pct(x: number): string {
  return `${(100 * x).toFixed(1).replace(/\.0$/, '')}%`;
}
