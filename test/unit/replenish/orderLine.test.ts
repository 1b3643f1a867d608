import { describe, expect, it } from 'vitest';
import { psiWeights } from '../../../core/arma/psi';
import { abcClasses, annualConsumptionValue, serviceTarget } from '../../../core/replenish/abc';
import { economicOrderQuantity } from '../../../core/replenish/eoq';
import { armaSumMoments } from '../../../core/replenish/intervalDemand';
import { type OrderLineInput, planOrderLine } from '../../../core/replenish/orderLine';

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

  it('continuous review with costs: EOQ = √(2·50·5200/(0.25·4)) = 721.1 sets the lot; s = 200 + SS', () => {
    // D = 52 × 100 = 5200 a year, A = 50, v = 4, r = 0.25: EOQ = √(520000 / 1) = 721.11 (Harris 1913).
    const line = planOrderLine({
      settings: { ...settings, reviewPeriodWeeks: 0, unitCost: 4, holdingRate: 0.25, orderCost: 50 },
      moments: whiteNoise(100, 100),
      forecastMeans: flat(100),
      position: { onHand: 150, onOrder: 0, backorders: 0, asOf: null },
      service: { level: 0.95, kind: 'cycle', source: 'item' },
      varianceSource: 'model',
    });
    expect(line.eoq).toBeCloseTo(Math.sqrt(520000), 8);
    expect(line.lotSize).toBeCloseTo(721.11, 2);
    expect(line.intervalWeeks).toBe(2);
    expect(line.reorderPoint).toBeCloseTo(200 + 1.644853627 * Math.sqrt(200), 6); // 223.26
    expect(line.orderUpTo).toBeCloseTo(line.reorderPoint + 721.11, 2);
    // 150 ≤ 223.26, so order S − 150 = 794.37 → 795 whole units
    expect(line.orderQty).toBe(795);
    expect(line.explanation).toMatch(/economic order quantity 721 \(Harris\)/);
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
