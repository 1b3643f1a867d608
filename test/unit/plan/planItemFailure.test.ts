import { describe, expect, it, vi } from 'vitest';

// The safety net of planItem: when the model choice itself throws (a bug, or a series no one
// foresaw), the item still gets a forecast (its history's mean and spread), an order line and a
// critical flag, and nothing is thrown. The model choice is replaced here by one that throws.
vi.mock('../../../core/select/chooseModel', () => ({
  chooseModel: () => {
    throw new Error('simulated failure inside the model choice');
  },
}));

const { planItem } = await import('../../../core/plan/planItem');
const { DEFAULT_WORKSPACE } = await import('../../../core/plan/types');

describe('planItem when the model choice throws', () => {
  it('falls back to the mean with a critical plan-error flag and a usable order line', () => {
    const qty = [10, 12, 8, 10, 11, 9, 10, 12, 8, 10];
    const weekStart = qty.map((_, i) => `2024-0${1 + Math.floor(i / 4)}-0${1 + (i % 4)}`);
    const plan = planItem({
      settings: {
        sku: 'CRUMB-5',
        description: 'Toasted crumb, 5 kg',
        supplier: null,
        unit: 'bag',
        casePack: 1,
        moq: 0,
        leadTimeWeeks: 2,
        leadTimeSdWeeks: 0,
        reviewPeriodWeeks: 1,
        serviceLevel: 0.95,
        serviceKind: 'cycle',
        unitCost: null,
        holdingRate: null,
        orderCost: null,
        shelfLifeWeeks: null,
        active: true,
      },
      history: { weekStart, qty },
      position: { onHand: 0, onOrder: 0, backorders: 0, asOf: null },
      overrides: {},
      workspace: DEFAULT_WORKSPACE,
    });
    const flag = plan.flags.find((f) => f.code === 'plan-error');
    expect(flag?.severity).toBe('critical');
    expect(flag?.reason).toMatch(/simulated failure inside the model choice/);
    expect(plan.model.kind).toBe('fallback');
    // mean 10, sample s.d. of the ten values: Σ(x − 10)² = 0+4+4+0+1+1+0+4+4+0 = 18, s² = 18/9 = 2
    expect(plan.forecast[0].mean).toBe(10);
    expect(plan.forecast[0].se).toBeCloseTo(Math.sqrt(2), 12);
    // weeks independent in the safety net: Var over 3 weeks = 3 × 2 = 6
    expect(plan.order.intervalSd).toBeCloseTo(Math.sqrt(6), 12);
    expect(plan.order.intervalForecast).toBe(30);
    expect(plan.order.orderQty).toBe(Math.ceil(30 + 1.644853627 * Math.sqrt(6)));
    expect(plan.order.varianceSource).toBe('fallback');
  });
});
