import { describe, expect, it } from 'vitest';
import { psiWeights } from '../../../core/arma/psi';
import { simulateArma } from '../../../core/arma/simulate';
import { fitSparseDemand } from '../../../core/intermittent/sparseMethod';
import { type PlanItemInput, planItem } from '../../../core/plan/planItem';
import { DEFAULT_WORKSPACE, type ItemSettings } from '../../../core/plan/types';
import { chooseModel } from '../../../core/select/chooseModel';
import { leadTimeMomentsChoice } from '../../../core/select/forecastChoice';
import { addWeeks } from '../../../core/series/calendar';

// Hand-made items planned end to end through the one per-item function. Fictional items of a
// bakery-supply wholesaler.
const SETTINGS: ItemSettings = {
  sku: 'RYE-25',
  description: 'Rye flour, 25 kg sack',
  supplier: 'Northmill Grain Co.',
  unit: 'sack',
  casePack: 1,
  moq: 0,
  leadTimeWeeks: 2,
  leadTimeSdWeeks: 0,
  reviewPeriodWeeks: 1,
  serviceLevel: null,
  serviceKind: 'cycle',
  unitCost: null,
  holdingRate: null,
  orderCost: null,
  shelfLifeWeeks: null,
  active: true,
};
const weeks = (n: number, from = '2023-01-02') => Array.from({ length: n }, (_, i) => addWeeks(from, i));
const ar1 = Array.from(simulateArma({ ar: [0.7], ma: [], sigma2: 36, mean: 60 }, 156, 11), (v) =>
  Math.round(v),
);

function input(
  qty: (number | null)[],
  extra: Partial<PlanItemInput> = {},
  s: Partial<ItemSettings> = {},
): PlanItemInput {
  return {
    settings: { ...SETTINGS, ...s },
    history: { weekStart: weeks(qty.length), qty },
    position: { onHand: 40, onOrder: 20, backorders: 5, asOf: null },
    overrides: {},
    workspace: DEFAULT_WORKSPACE,
    ...extra,
  };
}

describe('planItem end to end', () => {
  it('a three-year AR(1) item: model, dated forecast, ACF, and an order line built from the model’s moments', () => {
    const plan = planItem(input(ar1));
    expect(plan.sku).toBe('RYE-25');
    expect(plan.model.kind).toBe('arma');
    expect(plan.model.arRootModuli.every((m) => m > 1)).toBe(true);
    expect(plan.selection.candidates.length).toBeGreaterThan(1);
    expect(plan.fitted).toHaveLength(156);
    // horizon from the workspace, weeks dated from the last history week (2025-12-22 + 7 days)
    expect(plan.forecast).toHaveLength(DEFAULT_WORKSPACE.horizonWeeks);
    expect(plan.forecast[0].week).toBe(addWeeks(weeks(156)[155], 1));
    expect(plan.forecast[0].step).toBe(1);
    const f0 = plan.forecast[0];
    expect(f0.upper95 - f0.mean).toBeCloseTo(1.959963985 * f0.se, 6); // normal 95% interval (A&S ch. 26)
    expect(plan.residualAcf.lags).toBe(26);
    expect(plan.residualAcf.band).toBeCloseTo(1.96 / Math.sqrt(156), 3);

    // The order line from the same choice's moments, checked independently of planItem:
    const choice = chooseModel(ar1, weeks(156));
    const m = leadTimeMomentsChoice(choice, 1, 3); // R + L = 1 + 2 weeks
    const o = plan.order;
    expect(o.review).toBe('periodic');
    expect(o.intervalWeeks).toBe(3);
    expect(o.intervalForecast).toBeCloseTo(m.mean, 6);
    expect(o.intervalSd).toBeCloseTo(Math.sqrt(m.variance), 6);
    expect(o.serviceLevel).toBe(0.95); // workspace default, no ABC class given
    expect(o.safetyStock).toBeCloseTo(1.644853627 * o.intervalSd, 6); // Φ⁻¹(0.95), A&S ch. 26
    expect(o.orderUpTo).toBeCloseTo(o.intervalForecast + o.safetyStock, 9);
    expect(o.inventoryPosition).toBe(55); // 40 + 20 − 5
    expect(o.orderQty).toBe(Math.ceil(o.orderUpTo - 55)); // pack of 1: whole units, rounded up
    // With positive autocorrelation the interval σ exceeds the √L rule's one-step σ × √3.
    expect(o.intervalSd).toBeGreaterThan(plan.forecast[0].se * Math.sqrt(3));
    expect(o.explanation).toMatch(/Forecast demand over the next 3 weeks/);
  });

  it('the interval σ of a forced AR(1) equals the ψ-weight sum variance (no √L)', () => {
    const plan = planItem(
      input(ar1, {
        overrides: { forcedModel: { order: { p: 1, d: 0, q: 0 }, seasonalHarmonics: 0, includeMean: true } },
      }),
    );
    expect(plan.model.label).toBe('ARIMA(1,0,0) with mean');
    expect(plan.order.overridesRespected).toEqual(['forced-model']);
    const phi = plan.model.ar[0];
    const sigma2 = plan.model.sigma2 as number;
    // σ²·Σ_{m=0}^{2}(ψ_0+…+ψ_m)² with ψ_j = φ^j (Box, Jenkins & Reinsel ch. 5); the engine's exact
    // finite-sample propagation is the same for a pure AR(1) once the state is known.
    const psi = psiWeights([phi], [], 3);
    const v = sigma2 * (1 + (1 + psi[1]) ** 2 + (1 + psi[1] + psi[2]) ** 2);
    expect(plan.order.intervalSd ** 2).toBeCloseTo(v, 6);
  });

  it('ABC class default and the item’s own target; fill rate', () => {
    const a = planItem(input(ar1, { abcClass: 'A' }));
    expect(a.order.serviceLevel).toBe(0.98);
    expect(a.order.serviceSource).toBe('abc');
    const own = planItem(input(ar1, { abcClass: 'A' }, { serviceLevel: 0.9, serviceKind: 'fill' }));
    expect(own.order.serviceLevel).toBe(0.9);
    expect(own.order.serviceSource).toBe('item');
    expect(own.order.serviceKind).toBe('fill');
    expect(own.order.explanation).toMatch(/normal loss G\(k\)/);
  });

  it('planner overrides: forecast adjustment (marked on the weeks), safety stock, all respected and said', () => {
    const last = weeks(156)[155];
    const plan = planItem(
      input(ar1, {
        overrides: {
          adjustments: [
            {
              from: addWeeks(last, 1),
              to: addWeeks(last, 3),
              kind: 'percent',
              value: 50,
              reason: 'trade fair',
            },
            { from: addWeeks(last, 2), to: addWeeks(last, 2), kind: 'quantity', value: 10, reason: '' },
          ],
          safetyStock: 25,
        },
      }),
    );
    const base = planItem(input(ar1));
    const [w1, w2, w3, w4] = plan.forecast;
    expect(w1.mean).toBeCloseTo(base.forecast[0].mean * 1.5, 9);
    expect(w2.mean).toBeCloseTo(base.forecast[1].mean * 1.5 + 10, 9); // percent first, then +10 units
    expect(w3.adjustment?.applied).toEqual(['+50% (trade fair)']);
    expect(w2.adjustment?.applied).toEqual(['+50% (trade fair)', '+10 units']);
    expect(w4.adjustment).toBeUndefined();
    expect(w1.se).toBe(base.forecast[0].se); // uncertainty stays the model's
    expect(plan.order.intervalForecast).toBeCloseTo(w1.mean + w2.mean + w3.mean, 9);
    expect(plan.order.safetyStock).toBe(25);
    expect(plan.order.overridesRespected).toEqual(['forecast-adjustment', 'safety-stock']);
    expect(plan.order.explanation).toMatch(/planner’s adjustments/);
  });

  it('short history (10 weeks): plans, with the short-history flag', () => {
    const plan = planItem(input(ar1.slice(0, 10)));
    expect(plan.flags.map((f) => f.code)).toContain('short-history');
    expect(Number.isFinite(plan.order.orderUpTo)).toBe(true);
    expect(plan.forecast).toHaveLength(26);
  });

  it('all-zero history: a zero forecast, no order with stock on hand, no exception', () => {
    const plan = planItem(input(new Array(80).fill(0)));
    expect(plan.forecast.every((p) => p.mean === 0)).toBe(true);
    expect(plan.order.orderQty).toBe(0);
    expect(plan.order.safetyStock).toBe(0);
    expect(plan.flags.length).toBeGreaterThan(0);
  });

  it('empty history and a missing position: plans to a zero line with flags', () => {
    const plan = planItem({ ...input([]), position: undefined as never });
    expect(plan.order.orderQty).toBe(0);
    expect(plan.flags.map((f) => f.code)).toContain('too-short');
    expect(plan.forecast.every((p) => p.week === '')).toBe(true);
  });

  it('discontinued (inactive) item: forecast kept, nothing ordered', () => {
    const plan = planItem(input(ar1, {}, { active: false }));
    expect(plan.model.kind).toBe('arma');
    expect(plan.order.orderQty).toBe(0);
    expect(plan.order.capsApplied).toEqual(['inactive']);
  });

  it('sparse demand: the sparse-demand method and its own variance, said on the line', () => {
    const qty = Array.from({ length: 104 }, (_, i) => (i % 5 === 0 ? 15 : 0));
    const plan = planItem(input(qty, { position: { onHand: 0, onOrder: 0, backorders: 0, asOf: null } }));
    expect(plan.model.kind).toBe('intermittent');
    expect(plan.order.varianceSource).toBe('intermittent-method');
    expect(plan.order.explanation).toMatch(/sparse-demand method’s own one-step errors/);
    expect(plan.order.orderQty).toBeGreaterThan(0);
    // The label names the method the choice kept (the smaller in-sample one-step error), with its constants.
    const { chosen } = fitSparseDemand(qty);
    expect(plan.model.label).toBe(
      chosen.method === 'tsb'
        ? `TSB (Teunter, Syntetos & Babai 2011), α = ${chosen.alpha}, β = ${chosen.beta}`
        : `SBA (Syntetos & Boylan 2005), α = ${chosen.alpha}`,
    );
  });

  it('shelf life and MOQ end to end: the cap bites and the line is flagged for review', () => {
    // Forecast about 60 a week, lead time 2, shelf life 1 week: a delivery can sell about one week,
    // less what is left; an MOQ of 500 cannot be sold before it expires → 0 and a flag.
    const plan = planItem(input(ar1, {}, { shelfLifeWeeks: 1, moq: 500 }));
    expect(plan.order.orderQty).toBe(0);
    expect(plan.order.capsApplied).toContain('shelf-life-below-moq');
    expect(plan.flags.map((f) => f.code)).toContain('shelf-life-below-moq');
    const capped = planItem(input(ar1, {}, { shelfLifeWeeks: 1, moq: 0 }));
    expect(capped.order.capsApplied).toContain('shelf-life');
    expect(capped.order.orderQty).toBeLessThanOrEqual(capped.order.shelfLifeLimit as number);
  });

  it('bad settings are replaced with a flag naming field and value; mismatched history is cut', () => {
    const bad = input(ar1, {}, { serviceLevel: 1.5, leadTimeWeeks: -3, casePack: 0 });
    bad.history = { weekStart: weeks(156), qty: ar1.slice(0, 150) };
    const plan = planItem(bad);
    const reasons = plan.flags.filter((f) => f.code === 'setting-replaced').map((f) => f.reason);
    expect(reasons.some((r) => r.includes('service_level = 1.5'))).toBe(true);
    expect(reasons.some((r) => r.includes('lead_time_weeks = -3'))).toBe(true);
    expect(reasons.some((r) => r.includes('case_pack = 0'))).toBe(true);
    expect(plan.flags.map((f) => f.code)).toContain('history-mismatch');
    expect(plan.fitted).toHaveLength(150);
    expect(plan.order.intervalWeeks).toBe(3); // workspace lead time 2 + review 1
  });

  it('never throws, even on nonsense input', () => {
    const plan = planItem(null as never);
    expect(plan.flags[0].code).toBe('plan-error');
    expect(plan.order.orderQty).toBe(0);
    const odd = planItem(
      input([5, null, Number.NaN as never, 1e12, -3, 0, 0], {
        overrides: {
          forcedModel: { order: { p: 30, d: 3, q: 30 }, seasonalHarmonics: 9, includeMean: true },
        },
      }),
    );
    expect(Number.isFinite(odd.order.orderQty)).toBe(true);
  });

  it('forecast bias: past forecasts that ran 20% low for 26 weeks are flagged; accurate ones are not', () => {
    const w = weeks(156);
    const low = w.slice(130).map((week, i) => ({ week, mean: ar1[130 + i] * 0.8, se: 6 }));
    const flagged = planItem(input(ar1, { pastForecasts: low }));
    expect(flagged.tracking?.count).toBe(26);
    expect(flagged.tracking?.bias).toBeGreaterThan(0);
    expect(flagged.flags.map((f) => f.code)).toContain('forecast-bias');
    const fine = w.slice(130).map((week, i) => ({ week, mean: ar1[130 + i] + (i % 2 ? 3 : -3), se: 6 }));
    const ok = planItem(input(ar1, { pastForecasts: fine }));
    expect(ok.flags.map((f) => f.code)).not.toContain('forecast-bias');
  });

  it('plain data: the whole plan survives a JSON round trip unchanged in shape', () => {
    const plan = planItem(input(ar1));
    const back = JSON.parse(JSON.stringify(plan));
    expect(back.order).toEqual(plan.order);
    expect(back.forecast).toEqual(plan.forecast);
    expect(structuredClone(plan).sku).toBe('RYE-25');
  });
});
