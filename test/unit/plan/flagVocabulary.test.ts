import { describe, expect, it } from 'vitest';
import { simulateArma } from '../../../core/arma/simulate';
import { FLAG_CODES } from '../../../core/diagnose/flags';
import { planItem } from '../../../core/plan/planItem';
import { DEFAULT_WORKSPACE, type ItemSettings } from '../../../core/plan/types';
import { addWeeks } from '../../../core/series/calendar';

// One vocabulary: whatever an item meets, every flag it gets has a code from FLAG_CODES and a
// non-empty sentence and action. Fictional item of a bakery-supply wholesaler.
const SETTINGS: ItemSettings = {
  sku: 'SEED-MIX-3',
  description: 'Six-seed mix, 3 kg',
  supplier: 'Northmill Grain Co.',
  unit: 'bag',
  casePack: 6,
  moq: 12,
  leadTimeWeeks: 3,
  leadTimeSdWeeks: 0.5,
  reviewPeriodWeeks: 1,
  serviceLevel: 0.95,
  serviceKind: 'cycle',
  unitCost: 9.5,
  holdingRate: 0.2,
  orderCost: 25,
  shelfLifeWeeks: 2,
  active: true,
};

const spike = Array.from({ length: 120 }, (_, i) => (i === 100 ? 900 : 20));
const sparse = Array.from({ length: 150 }, (_, i) => (i % 9 === 0 ? 7 : 0));
const shifted = Array.from(simulateArma({ ar: [0.4], ma: [], sigma2: 16, mean: 50 }, 156, 5), (v, i) =>
  Math.round(i >= 140 ? v * 1.6 : v),
);
const cases: (number | null)[][] = [
  [],
  [5, 5, 5, 5, 5, 5, 5, 5, 5, 5],
  Array.from({ length: 60 }, () => 0),
  spike,
  sparse,
  shifted,
  Array.from({ length: 30 }, (_, i) => (i % 4 === 0 ? null : 10 + i)),
];

describe('flag vocabulary', () => {
  it('lists each code once', () => {
    expect(new Set(FLAG_CODES).size).toBe(FLAG_CODES.length);
  });

  it('every flag planItem raises on awkward items uses a listed code with a sentence and an action', () => {
    const known = new Set<string>(FLAG_CODES);
    let seen = 0;
    for (const qty of cases) {
      const plan = planItem({
        settings: SETTINGS,
        history: { weekStart: qty.map((_, i) => addWeeks('2023-06-05', i)), qty },
        position: { onHand: 3, onOrder: 0, backorders: 0, asOf: null },
        overrides: {},
        workspace: DEFAULT_WORKSPACE,
      });
      for (const f of plan.flags) {
        seen++;
        expect(known.has(f.code), `unlisted flag code '${f.code}'`).toBe(true);
        expect(f.reason.length).toBeGreaterThan(10);
        expect(f.action.length).toBeGreaterThan(10);
      }
    }
    expect(seen).toBeGreaterThan(cases.length);
  });
});
