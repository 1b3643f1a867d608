import cdf from '@stdlib/stats-base-dists-normal-cdf';
import pdf from '@stdlib/stats-base-dists-normal-pdf';
import { describe, expect, it } from 'vitest';
import { psiWeights } from '../../../core/arma/psi';
import { abcClasses, annualConsumptionValue, serviceTarget } from '../../../core/replenish/abc';
import { economicOrderQuantity } from '../../../core/replenish/eoq';
import { armaSumMoments } from '../../../core/replenish/intervalDemand';
import { type OrderLineInput, planOrderLine } from '../../../core/replenish/orderLine';
import { simulatePolicy } from '../../../core/replenish/policySimulation';

const settings: OrderLineInput['settings'] = {
  unit: 'each',
  casePack: 1,
  moq: 0,
  leadTimeWeeks: 2,
  leadTimeSdWeeks: 0,
  reviewPeriodWeeks: 1,
  unitCost: null,
  holdingRate: null,
  orderCost: null,
  shelfLifeWeeks: null,
  active: true,
};
const flat = (level: number, n = 60) => new Float64Array(n).fill(level);
const whiteNoise = (sigma2: number, level: number) =>
  armaSumMoments(psiWeights([], [], 60), sigma2, flat(level));

// Independent check of the weekly-check reorder point: composite Simpson over the undershoot u on
// [0, m + 10 s.d.], density P(d > u)/E[d] with d ~ N(m, sd²) (stationary-excess distribution of the
// weekly drop, renewal theory); Φ from @stdlib, G(k) = φ(k) − k(1 − Φ(k)).
function undershootSum(f: (u: number) => number, m: number, sd: number): number {
  const n = 2000;
  const top = m + 10 * sd;
  const h = top / n;
  let num = 0;
  let den = 0;
  for (let i = 0; i <= n; i++) {
    const u = i * h;
    const wgt = (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2) * cdf((m - u) / sd, 0, 1);
    num += wgt * f(u);
    den += wgt;
  }
  return num / den;
}
function stockoutProbability(x: number, sdL: number, m: number, sd: number): number {
  return undershootSum((u) => cdf(-(x - u) / sdL, 0, 1), m, sd);
}
function expectedShortage(x: number, sdL: number, m: number, sd: number): number {
  return undershootSum(
    (u) => {
      const k = (x - u) / sdL;
      return sdL * (pdf(k, 0, 1) - k * cdf(-k, 0, 1));
    },
    m,
    sd,
  );
}

describe('order line', () => {
  it('periodic review, white noise: S = 3·100 + 1.645·√(3·100) = 328.49; position 150 → 179', () => {
    // Interval R + L = 3 weeks: mean 300, σ = √300 = 17.3205 (white noise, σ² = 100 per week);
    // k = Φ⁻¹(0.95) = 1.644854 (A&S ch. 26); SS = 28.4897; S = 328.4897;
    // raw = 328.4897 − 150 = 178.49 → whole units (pack 1) 179.
    const line = planOrderLine({
      settings,
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 120, onOrder: 40, backorders: 10, asOf: null },
      service: { level: 0.95, kind: 'cycle', source: 'workspace' },
      varianceSource: 'model',
    });
    expect(line.intervalWeeks).toBe(3);
    expect(line.intervalForecast).toBeCloseTo(300, 10);
    expect(line.intervalSd).toBeCloseTo(Math.sqrt(300), 10);
    expect(line.safetyStock).toBeCloseTo(1.644853627 * Math.sqrt(300), 6);
    expect(line.orderUpTo).toBeCloseTo(328.4897, 3);
    expect(line.reorderPoint).toBe(line.orderUpTo);
    expect(line.inventoryPosition).toBe(150);
    expect(line.orderQty).toBe(179);
    expect(line.review).toBe('periodic');
    expect(line.eoq).toBeNull();
    expect(line.explanation).toMatch(/next 3 weeks \(lead time 2 \+ review period 1\): 300/);
    expect(line.explanation).toMatch(/95% cycle service/);
    expect(line.explanation).toMatch(/on hand 120 \+ on order 40 − backorders 10 = 150/);
  });

  it('continuous review checked weekly, with costs: EOQ 721.1 → lot 722; s = 200 + E[u] 50.5 + SS; one lot', () => {
    // D = 52 × 100 = 5200 a year, A = 50, v = 4, r = 0.25: EOQ = √(520000 / 1) = 721.11 (Harris 1913),
    // rounded up to whole units (pack 1): lot 722.
    // Checked at each weekly run = (R, s, nQ) with R = 1 (core/replenish/weeklyCheckUndershoot):
    // lead-time demand over L = 2 weeks, mean 200, σ_L = √200; weekly drop N(100, 10²) (white noise:
    // Var(3-week sum) − Var(2-week sum) = 300 − 200); mean undershoot E[d²]/(2E[d]) =
    // (100² + 10²)/200 = 50.5 (renewal theory, the mean of the stationary-excess distribution).
    const line = planOrderLine({
      settings: { ...settings, reviewPeriodWeeks: 0, unitCost: 4, holdingRate: 0.25, orderCost: 50 },
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 150, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.95, kind: 'cycle', source: 'item' },
      varianceSource: 'model',
    });
    expect(line.eoq).toBeCloseTo(Math.sqrt(520000), 8);
    expect(line.lotSize).toBe(722);
    expect(line.intervalWeeks).toBe(2);
    expect(line.intervalForecast).toBeCloseTo(200, 10);
    const undershoot = line.reorderPoint - 200 - line.safetyStock;
    expect(undershoot).toBeCloseTo(50.5, 2);
    // The reorder point meets its definition: P(D_L + u > s) = 5%, checked by an independent
    // Simpson sum over u (density P(d > u)/E[d]) of P(N(200, 200) > s − u).
    expect(stockoutProbability(line.reorderPoint - 200, Math.sqrt(200), 100, 10)).toBeCloseTo(0.05, 4);
    expect(line.orderUpTo).toBeCloseTo(line.reorderPoint + 722, 8);
    // 150 ≤ s ≈ 304.2: n = ⌊(304.2 − 150)/722⌋ + 1 = 1 lot of 722
    expect(line.orderQty).toBe(722);
    expect(line.explanation).toMatch(/economic order quantity 721 \(Harris\)/);
    expect(line.explanation).toMatch(
      /checked at each weekly run, so the reorder point covers lead time \+ 1 week/,
    );
    expect(line.explanation).toMatch(/1 lot of 722 = 722/);
  });

  it('continuous review: a position far below s gets as many whole lots as bring it back above', () => {
    // lot = one week of forecast (no costs) = 100; s ≈ 304 as above (same demand, same target);
    // position −150 (backorders): n = ⌊(304.2 + 150)/100⌋ + 1 = 5 lots = 500 → position 350 > s.
    const line = planOrderLine({
      settings: { ...settings, reviewPeriodWeeks: 0 },
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 0, onOrder: 0, backorders: 150, asOf: null },
      service: { level: 0.95, kind: 'cycle', source: 'item' },
      varianceSource: 'model',
    });
    expect(line.lotSize).toBe(100);
    expect(line.reorderPoint).toBeGreaterThan(300);
    expect(line.reorderPoint).toBeLessThan(350);
    expect(line.orderQty).toBe(500);
    expect(line.inventoryPosition + line.orderQty).toBeGreaterThan(line.reorderPoint);
    expect(line.inventoryPosition + line.orderQty - 100).toBeLessThanOrEqual(line.reorderPoint);
  });

  it('continuous review, fill rate: the lot is the Q in the shortage per cycle', () => {
    // β = 0.98, Q = lot 400 (case packs of 400 = MOQ): expected shortage per cycle Q(1 − β) = 8,
    // checked by the independent Simpson sum E_u[σ_L·G((x − u)/σ_L)].
    const line = planOrderLine({
      settings: { ...settings, reviewPeriodWeeks: 0, moq: 400 },
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 400, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.98, kind: 'fill', source: 'item' },
      varianceSource: 'model',
    });
    expect(line.lotSize).toBe(400);
    expect(expectedShortage(line.reorderPoint - 200, Math.sqrt(200), 100, 10)).toBeCloseTo(8, 3);
    expect(line.orderQty).toBe(0); // 400 is above s
    expect(line.explanation).toMatch(/Q\(1 − β\) = 400·0\.02/);
  });

  it('continuous review: the order line sets the same reorder point as the policy simulation checks', () => {
    // AR(1) φ = 0.7, σ² = 100, mean 100, L = 6, lot 400: both take σ_L and the weekly drop from the
    // model's sum variances (core/arma/leadTimeSum) and call weeklyCheckReorder, so the margin
    // s − forecast over L must agree; the simulation shows that margin reaches the target.
    const psi = psiWeights([0.7], [], 60);
    for (const kind of ['cycle', 'fill'] as const) {
      const level = kind === 'cycle' ? 0.95 : 0.98;
      const line = planOrderLine({
        settings: { ...settings, leadTimeWeeks: 6, reviewPeriodWeeks: 0, moq: 400 },
        moments: armaSumMoments(psi, 100, flat(100)),
        forecastMeans: flat(100),
        position: { onHand: 0, onOrder: 0, backorders: 0, asOf: null },
        service: { level, kind, source: 'item' },
        varianceSource: 'model',
      });
      const sim = simulatePolicy({
        model: { ar: [0.7], ma: [], sigma2: 100, mean: 100 },
        leadTimeWeeks: 6,
        reviewPeriodWeeks: 0,
        lotSize: 400,
        service: { kind, level },
        years: 1,
        seed: 1,
      });
      expect(line.lotSize).toBe(400);
      expect(line.reorderPoint - line.intervalForecast).toBeCloseTo(
        sim.expectedUndershoot + sim.safetyStock,
        9,
      );
      expect(line.safetyStock).toBeCloseTo(sim.safetyStock, 9);
    }
  });

  it('fill rate: Q per review period enters G(k); a safety stock can come out as zero, never negative', () => {
    // σ = √300 = 17.32, Q = 1 × 100, β = 0.9: G(k) = 100·0.1/17.32 = 0.577 > G(0) = 0.399 → k < 0 → SS 0.
    const line = planOrderLine({
      settings,
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 0, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.9, kind: 'fill', source: 'abc' },
      varianceSource: 'model',
    });
    expect(line.safetyFactor).toBeLessThan(0);
    expect(line.computedSafetyStock).toBeLessThan(0);
    expect(line.safetyStock).toBe(0);
    expect(line.orderUpTo).toBeCloseTo(300, 10);
    expect(line.explanation).toMatch(/set to 0, never below/);
    expect(line.explanation).toMatch(/ABC class default/);
  });

  it('a planner safety stock replaces the computed one and the line says so', () => {
    const line = planOrderLine({
      settings,
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 100, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.95, kind: 'cycle', source: 'workspace' },
      safetyStockOverride: 75,
      varianceSource: 'model',
      overridesRespected: ['forecast-adjustment'],
    });
    expect(line.safetyStock).toBe(75);
    expect(line.orderUpTo).toBeCloseTo(375, 10);
    expect(line.orderQty).toBe(275);
    expect(line.overridesRespected).toEqual(['forecast-adjustment', 'safety-stock']);
    expect(line.explanation).toMatch(/fixed by the planner at 75/);
  });

  it('intermittent items say the variance is the method’s own; inactive items order nothing', () => {
    const line = planOrderLine({
      settings: { ...settings, active: false },
      moments: whiteNoise(4, 1),
      forecastMeans: flat(1),
      position: { onHand: 0, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.95, kind: 'cycle', source: 'workspace' },
      varianceSource: 'intermittent-method',
    });
    expect(line.orderQty).toBe(0);
    expect(line.capsApplied).toEqual(['inactive']);
    expect(line.explanation).toMatch(/sparse-demand method’s own one-step errors/);
    expect(line.explanation).toMatch(/inactive/);
  });

  it('lead-time spread widens the interval: σ_L = 1 week adds D² = 100² to the variance', () => {
    const base = {
      settings,
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 0, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.95, kind: 'cycle' as const, source: 'workspace' as const },
      varianceSource: 'model' as const,
    };
    const fixed = planOrderLine(base);
    const varying = planOrderLine({ ...base, settings: { ...settings, leadTimeSdWeeks: 1 } });
    expect(varying.intervalSd ** 2).toBeCloseTo(fixed.intervalSd ** 2 + 100 * 100, 8); // 300 + 10000
  });
});

describe('EOQ (Harris 1913)', () => {
  it('textbook example: D = 1200, A = 100, v = 10, r = 0.24 → √(240000/2.4) = 316.23', () => {
    expect(economicOrderQuantity(1200, 100, 10, 0.24)).toBeCloseTo(316.227766, 5);
  });
  it('unknown or zero costs give no EOQ', () => {
    expect(economicOrderQuantity(1200, null, 10, 0.24)).toBeNull();
    expect(economicOrderQuantity(0, 100, 10, 0.24)).toBeNull();
  });
});

describe('ABC classes (Pareto split by annual consumption value)', () => {
  it('values 500, 200, 150, 100, 30, 20 (total 1000): cumulative before = 0, 50, 70, 85, 95, 98% → A A A B C C', () => {
    // Cut-offs 80%/95% (the workspace default, common practice): A while the share before < 80%,
    // B while < 95%, else C.
    const m = abcClasses(
      [
        { sku: 'F', annualValue: 20 },
        { sku: 'A', annualValue: 500 },
        { sku: 'C', annualValue: 150 },
        { sku: 'B', annualValue: 200 },
        { sku: 'E', annualValue: 30 },
        { sku: 'D', annualValue: 100 },
        { sku: 'X', annualValue: null },
      ],
      [0.8, 0.95],
    );
    expect(['A', 'B', 'C', 'D', 'E', 'F'].map((s) => m.get(s))).toEqual(['A', 'A', 'A', 'B', 'C', 'C']);
    expect(m.has('X')).toBe(false);
  });
  it('configurable cut-offs; zero-value items are C; bad cut-offs are refused with their values', () => {
    const m = abcClasses(
      [
        { sku: 'a', annualValue: 60 },
        { sku: 'b', annualValue: 40 },
        { sku: 'z', annualValue: 0 },
      ],
      [0.5, 0.7],
    );
    // shares before: a 0% < 50% → A; b 60%, between 50% and 70% → B; z has no value → C
    expect([m.get('a'), m.get('b'), m.get('z')]).toEqual(['A', 'B', 'C']);
    expect(() => abcClasses([], [0.9, 0.8])).toThrow(/0\.9, 0\.8/);
  });
  it('service target: the item’s own beats its class default, which beats the workspace default', () => {
    const cls = { A: 0.98, B: 0.95, C: 0.9 };
    expect(serviceTarget(0.99, 'C', cls, 0.95)).toEqual({ level: 0.99, source: 'item' });
    expect(serviceTarget(null, 'C', cls, 0.95)).toEqual({ level: 0.9, source: 'abc' });
    expect(serviceTarget(null, undefined, cls, 0.93)).toEqual({ level: 0.93, source: 'workspace' });
    expect(annualConsumptionValue(10, 2.5)).toBe(1300);
    expect(annualConsumptionValue(10, null)).toBeNull();
  });
});
