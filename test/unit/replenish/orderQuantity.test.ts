import { describe, expect, it } from 'vitest';
import { orderQuantity, packRound } from '../../../core/replenish/orderQuantity';

// Acceptance 4: worked examples, arithmetic written out. Rules: core/replenish/orderQuantity.ts.

describe('suggested order quantity: worked examples', () => {
  it('case-pack rounding: S = 380, position 143, packs of 12 → 237 → 20 packs = 240', () => {
    // raw = 380 − 143 = 237; 237 / 12 = 19.75 → round UP to 20 packs; 20 × 12 = 240.
    const r = orderQuantity({
      orderUpTo: 380,
      reorderPoint: 380,
      inventoryPosition: 143,
      casePack: 12,
      moq: 0,
      shelfLife: null,
    });
    expect(r.raw).toBe(237);
    expect(r.casePacks).toBe(20);
    expect(r.qty).toBe(240);
    expect(r.applied).toEqual(['case-pack']);
    expect(r.steps.join(' ')).toContain('20 × 12 = 240');
  });

  it('an exact multiple of the pack is not rounded: S = 300, position 180, packs of 24 → 120 = 5 packs', () => {
    // raw = 300 − 180 = 120; 120 / 24 = 5 exactly, so 5 packs and no rounding step.
    const r = orderQuantity({
      orderUpTo: 300,
      reorderPoint: 300,
      inventoryPosition: 180,
      casePack: 24,
      moq: 0,
      shelfLife: null,
    });
    expect(r.qty).toBe(120);
    expect(r.casePacks).toBe(5);
    expect(r.applied).toEqual([]);
  });

  it('MOQ: S = 130, position 95, packs of 6, MOQ 100 → 35 → 6 packs = 36 → raised to 17 packs = 102', () => {
    // raw = 130 − 95 = 35; 35 / 6 = 5.83 → 6 packs = 36 < MOQ 100;
    // MOQ in whole packs: 100 / 6 = 16.67 → 17 packs; 17 × 6 = 102.
    const r = orderQuantity({
      orderUpTo: 130,
      reorderPoint: 130,
      inventoryPosition: 95,
      casePack: 6,
      moq: 100,
      shelfLife: null,
    });
    expect(r.raw).toBe(35);
    expect(r.qty).toBe(102);
    expect(r.casePacks).toBe(17);
    expect(r.applied).toEqual(['case-pack', 'moq']);
    expect(r.steps.join(' ')).toContain('17 × 6 = 102');
  });

  it('shelf-life cap: 3-week life, lead time 2, forecast 40/week, position 100, S = 400, packs of 10 → 300 capped at 100', () => {
    // raw = 400 − 100 = 300 = 30 packs of 10.
    // Expected left when the delivery arrives (older stock, sold first): 100 − (40 + 40) = 20.
    // The delivery arrives at the start of week 3 and lasts 3 weeks: forecast of weeks 3–5 =
    // 40 + 40 + 40 = 120, less the 20 of older stock = 100 usable → 10 packs of 10 = 100.
    const r = orderQuantity({
      orderUpTo: 400,
      reorderPoint: 400,
      inventoryPosition: 100,
      casePack: 10,
      moq: 0,
      shelfLife: { shelfLifeWeeks: 3, leadTimeWeeks: 2, forecastMeans: [40, 40, 40, 40, 40, 40] },
    });
    expect(r.raw).toBe(300);
    expect(r.shelfLifeLimit).toBe(100);
    expect(r.qty).toBe(100);
    expect(r.casePacks).toBe(10);
    expect(r.applied).toEqual(['shelf-life']);
    expect(r.steps.join(' ')).toMatch(/Shelf life 3 weeks.*capped at 10 × 10 = 100/);
  });

  it('shelf-life cap rounds DOWN to packs: usable 95 with packs of 12 → 7 packs = 84', () => {
    // Forecast 35/week, lead time 1, life 3: weeks 2–4 sell 35 × 3 = 105; left at arrival
    // 45 − 35 = 10; usable = 105 − 10 = 95; 95 / 12 = 7.9 → DOWN to 7 packs = 84 (never above the cap).
    const r = orderQuantity({
      orderUpTo: 200,
      reorderPoint: 200,
      inventoryPosition: 45,
      casePack: 12,
      moq: 0,
      shelfLife: { shelfLifeWeeks: 3, leadTimeWeeks: 1, forecastMeans: [35, 35, 35, 35] },
    });
    expect(r.shelfLifeLimit).toBe(95);
    expect(r.qty).toBe(84);
    expect(r.casePacks).toBe(7);
  });

  it('shelf-life cap below the MOQ: no order, and the line says why', () => {
    // Forecast 10/week, lead 1, life 2: weeks 2–3 sell 20; nothing left at arrival (5 − 10 < 0);
    // usable 20 → 4 packs of 5 = 20, below the MOQ of 50 → 0.
    const r = orderQuantity({
      orderUpTo: 60,
      reorderPoint: 60,
      inventoryPosition: 5,
      casePack: 5,
      moq: 50,
      shelfLife: { shelfLifeWeeks: 2, leadTimeWeeks: 1, forecastMeans: [10, 10, 10] },
    });
    expect(r.qty).toBe(0);
    expect(r.applied).toContain('shelf-life-below-moq');
    expect(r.steps.join(' ')).toMatch(/below the minimum order 50/);
  });

  it('zero order: position 260 above the reorder point 250 → nothing, whatever S is', () => {
    // 260 > 250, so no order (periodic review would order only below S; here s = 250 < S = 400).
    const r = orderQuantity({
      orderUpTo: 400,
      reorderPoint: 250,
      inventoryPosition: 260,
      casePack: 12,
      moq: 24,
      shelfLife: null,
    });
    expect(r.qty).toBe(0);
    expect(r.casePacks).toBe(0);
    expect(r.applied).toEqual(['above-reorder-point']);
    expect(r.steps[0]).toMatch(/260 is above the reorder point 250/);
  });

  it('at the reorder point exactly an order is due: position 250 = s → 400 − 250 = 150 → 13 packs of 12 = 156', () => {
    // 150 / 12 = 12.5 → 13 packs; 13 × 12 = 156.
    const r = orderQuantity({
      orderUpTo: 400,
      reorderPoint: 250,
      inventoryPosition: 250,
      casePack: 12,
      moq: 0,
      shelfLife: null,
    });
    expect(r.qty).toBe(156);
  });

  it('a negative position (backorders beyond stock) is ordered back up: S = 50, position −20 → 70', () => {
    // on hand 0 + on order 10 − backorders 30 = −20; 50 − (−20) = 70.
    const r = orderQuantity({
      orderUpTo: 50,
      reorderPoint: 50,
      inventoryPosition: -20,
      casePack: 1,
      moq: 0,
      shelfLife: null,
    });
    expect(r.qty).toBe(70);
  });

  it('floating-point noise does not add a pack: 24.000000001 in packs of 24 is 1 pack', () => {
    expect(packRound(24.000000001, 24, 0)).toEqual({ qty: 24, packs: 1 });
    expect(packRound(0, 24, 48)).toEqual({ qty: 0, packs: 0 });
  });
});
