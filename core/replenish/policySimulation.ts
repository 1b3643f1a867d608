import { windowSumVariance } from '../arma/leadTimeSum';
import { psiWeights } from '../arma/psi';
import { simulateArma } from '../arma/simulate';
import type { ServiceKind } from '../plan/types';
import { packRound } from './orderQuantity';
import { safetyFactor } from './safetyFactor';
import { weeklyCheckReorder } from './weeklyCheckUndershoot';

/**
 * Policy check by simulation: draw years of weekly demand from a stationary ARMA model
 * (core/arma/simulate), run the replenishment policy week by week with backorders, and measure what
 * it achieves. Each week, at its start:
 *   1. the order placed L weeks ago arrives (L = 0: at once);
 *   2. at a review, the policy forecasts the protection interval from everything observed so far
 *      (the model's conditional mean, innovations recovered by inverting the model), sets its level
 *      and orders (case packs and MOQ as in orderQuantity);
 *   3. the week's demand is served from stock; what cannot be served is backordered.
 * Definitions measured (Silver, Pyke & Thomas):
 * - cycle service, periodic review (R, S): a replenishment cycle is the R weeks between the arrival
 *   of one review's order and the next arrival; it is stocked out when the net stock (on hand −
 *   backorders) is negative at its end, i.e. at the end of week t + L + R − 1 for a review at t
 *   (demand is never negative, so that is the lowest point of the cycle);
 * - cycle service, continuous review (s, Q) checked weekly: the same definition — a cycle runs from
 *   one arrival to the next and is stocked out when net stock is negative at its end — so each
 *   order's cycle (the one its arrival closes) ends just before it arrives (end of week t + L − 1).
 *   (For R = 1 with an order every week both definitions give the same weeks.);
 * - fill rate: 1 − (demand not met from stock when it occurred) / (total demand);
 * - average inventory: mean on-hand stock at the end of a week.
 * The policy's σ is the model's sum variance over the protection interval ('sum-variance'), or the
 * one-step σ × √(weeks) of the √L rule ('sqrt-weeks') for comparison. Continuous review with
 * 'sum-variance' is the weekly-checked (R, s, nQ) rule of core/replenish/weeklyCheckUndershoot
 * (s = forecast over L + expected undershoot + safety stock; whole lots back above s); the weekly
 * drop it needs is Var(sum 1..L+1) − Var(sum 1..L) of the model. 'lead-time-only' is the rule this
 * replaced, kept for comparison: s = forecast over L + k·σ_L (textbook (s, Q), undershoot ignored),
 * order up to s + Q. 'lead-time-plus-week' treats the whole extra week as forecast demand: s =
 * forecast over L + 1 + k·σ_{L+1}, whole lots (measured: it over-protects). The fill-rate Q is the model mean × R (periodic) or the lot (continuous),
 * fixed for the run. Simulated demand below zero (rare
 * for the models this is meant for) is served as zero and counted.
 */
export interface PolicySimulationInput {
  model: { ar: ArrayLike<number>; ma: ArrayLike<number>; sigma2: number; mean: number };
  leadTimeWeeks: number;
  /** 0 = continuous review (s, Q) checked every week; R ≥ 1 = periodic review every R weeks. */
  reviewPeriodWeeks: number;
  service: { kind: ServiceKind; level: number };
  years: number;
  seed: number;
  rule?: 'sum-variance' | 'sqrt-weeks' | 'lead-time-only' | 'lead-time-plus-week';
  /** Continuous review lot; default one week of mean demand (at least the MOQ, whole case packs). */
  lotSize?: number;
  casePack?: number;
  moq?: number;
  /** A fixed safety stock instead of the computed one. */
  safetyStock?: number;
  /** Weeks simulated before measuring starts (default 104). */
  warmUpWeeks?: number;
}

export interface PolicySimulationResult {
  weeks: number;
  cycles: number;
  stockoutCycles: number;
  cycleServiceLevel: number;
  fillRate: number;
  averageOnHand: number;
  averageBackorders: number;
  orders: number;
  /** The σ and safety stock the policy used. */
  intervalSd: number;
  safetyFactor: number;
  safetyStock: number;
  /** Continuous review: the E[u] added to the reorder point (0 otherwise). */
  expectedUndershoot: number;
  negativeDemandWeeks: number;
}

export function simulatePolicy(input: PolicySimulationInput): PolicySimulationResult {
  const { model } = input;
  const L = input.leadTimeWeeks;
  const R = input.reviewPeriodWeeks;
  if (!(Number.isInteger(L) && L >= 0 && Number.isInteger(R) && R >= 0)) {
    throw new RangeError(
      `simulatePolicy: lead time and review period must be whole weeks ≥ 0, got ${L}, ${R}`,
    );
  }
  if (!(input.years > 0)) throw new RangeError(`simulatePolicy: years must be positive, got ${input.years}`);
  const periodic = R > 0;
  const T = periodic ? R + L : input.rule === 'lead-time-plus-week' ? L + 1 : L;
  const p = model.ar.length;
  const q = model.ma.length;
  const mu = model.mean;
  const warm = input.warmUpWeeks ?? 104;
  const weeks = Math.round(input.years * 52);
  const n = warm + weeks;
  const pack = input.casePack ?? 1;
  const moq = input.moq ?? 0;
  // default lot as on the order line: one week of mean demand, at least the MOQ and one pack, in whole packs
  const lot = input.lotSize ?? Math.ceil(Math.max(mu, moq, pack) / pack - 1e-9) * pack;

  const psi = psiWeights(model.ar, model.ma, Math.max(T, 1) + 1);
  const sd =
    input.rule === 'sqrt-weeks'
      ? Math.sqrt(model.sigma2 * T)
      : Math.sqrt(windowSumVariance(psi, model.sigma2, 1, T));
  const oldRule = input.rule === 'lead-time-only';
  let factorK: number;
  let ss: number;
  let undershoot = 0;
  if (periodic || (input.rule !== undefined && input.rule !== 'sum-variance')) {
    const factor = safetyFactor(input.service.kind, input.service.level, sd, periodic ? R * mu : lot);
    factorK = factor.k;
    ss = input.safetyStock ?? Math.max(0, factor.k * sd);
  } else {
    // the weekly drop of position − s: one week's demand plus the revision of the L-week forecast
    const dropVar = Math.max(
      0,
      windowSumVariance(psi, model.sigma2, 1, L + 1) - windowSumVariance(psi, model.sigma2, 1, L),
    );
    const w = weeklyCheckReorder(input.service.kind, input.service.level, sd, mu, Math.sqrt(dropVar), lot);
    factorK = w.k;
    undershoot = w.expectedUndershoot;
    ss = input.safetyStock ?? w.safetyStock;
  }

  const y = simulateArma({ ar: model.ar, ma: model.ma, sigma2: model.sigma2, mean: mu }, n, input.seed);
  const e = new Float64Array(n);
  const f = new Float64Array(Math.max(T, 1));
  // Ring buffers indexed by week mod L: an order placed in week t arrives in week t + L.
  const ring = Math.max(L, 1);
  const arriving = new Float64Array(ring);
  const checks = new Int32Array(ring);

  let net = mu * T + ss;
  let onOrder = 0;
  let cycles = 0;
  let stockouts = 0;
  let orders = 0;
  let demandTotal = 0;
  let unmetTotal = 0;
  let onHandTotal = 0;
  let backorderTotal = 0;
  let negatives = 0;

  for (let t = 0; t < n; t++) {
    const measuring = t >= warm;
    const slot = t % ring;
    // 1. receive
    net += arriving[slot];
    onOrder -= arriving[slot];
    arriving[slot] = 0;
    // 2. review: forecast steps 1..T from information up to week t − 1
    if (t > 0 && (periodic ? t % R === 0 : true)) {
      let sum = 0;
      for (let h = 1; h <= T; h++) {
        let v = 0;
        for (let i = 1; i <= p; i++) {
          const back = h - i;
          v += model.ar[i - 1] * (back >= 1 ? f[back - 1] : t - 1 + back >= 0 ? y[t - 1 + back] - mu : 0);
        }
        for (let j = h; j <= q; j++) {
          const idx = t - 1 + h - j;
          if (idx >= 0) v -= model.ma[j - 1] * e[idx];
        }
        f[h - 1] = v;
        sum += v + mu;
      }
      const level = sum + undershoot + ss;
      const position = net + onOrder;
      let raw = 0;
      if (periodic) raw = level - position;
      else if (position <= level) {
        // whole lots back above s; the old 'lead-time-only' rule ordered up to s + Q instead
        raw = oldRule ? level + lot - position : (Math.floor((level - position) / lot) + 1) * lot;
      }
      const { qty } = packRound(raw, pack, moq);
      if (qty > 0) {
        if (L === 0) {
          // continuous review, L = 0: the cycle this order closes ends now, just before it arrives
          if (!periodic && measuring) {
            cycles++;
            if (net < 0) stockouts++;
          }
          net += qty;
        } else {
          arriving[slot] += qty;
          onOrder += qty;
          // continuous review: this order's cycle ends at the end of week t + L − 1
          if (!periodic) checks[(t + L - 1) % ring]++;
        }
        if (measuring) orders++;
      }
    }
    // 3. demand
    let d = y[t];
    if (d < 0) {
      if (measuring) negatives++;
      d = 0;
    }
    const unmet = net >= d ? 0 : net > 0 ? d - net : d;
    net -= d;
    // innovations of the true model, for later forecasts
    let eps = y[t] - mu;
    for (let i = 1; i <= p && i <= t; i++) eps -= model.ar[i - 1] * (y[t - i] - mu);
    for (let j = 1; j <= q && j <= t; j++) eps += model.ma[j - 1] * e[t - j];
    e[t] = eps;
    // 4. end of week: record and close cycles
    const endSlot = t % ring;
    if (periodic) {
      const reviewAt = t - L - R + 1;
      if (reviewAt > 0 && reviewAt % R === 0 && reviewAt >= warm) {
        cycles++;
        if (net < 0) stockouts++;
      }
    } else if (checks[endSlot] > 0) {
      if (measuring) {
        cycles += checks[endSlot];
        if (net < 0) stockouts += checks[endSlot];
      }
      checks[endSlot] = 0;
    }
    if (measuring) {
      demandTotal += d;
      unmetTotal += unmet;
      onHandTotal += Math.max(net, 0);
      backorderTotal += net < 0 ? -net : 0;
    }
  }
  return {
    weeks,
    cycles,
    stockoutCycles: stockouts,
    cycleServiceLevel: cycles > 0 ? 1 - stockouts / cycles : Number.NaN,
    fillRate: demandTotal > 0 ? 1 - unmetTotal / demandTotal : Number.NaN,
    averageOnHand: onHandTotal / weeks,
    averageBackorders: backorderTotal / weeks,
    orders,
    intervalSd: sd,
    safetyFactor: factorK,
    expectedUndershoot: undershoot,
    safetyStock: ss,
    negativeDemandWeeks: negatives,
  };
}
