import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { describe, expect, it } from 'vitest';
import { inverseNormalLoss, standardNormalLoss } from '../../../core/replenish/normalLoss';
import { safetyFactor } from '../../../core/replenish/safetyFactor';

// Acceptance 1: check values from named tables, compared with @stdlib to 1e-6.
//
// Percentage points of the standard normal, x such that Φ(x) = p, as printed to 9 decimals in the
// standard normal tables of Abramowitz & Stegun (1964), Handbook of Mathematical Functions, ch. 26
// (percentage points table). Quoted from memory, so every one is also checked here against @stdlib.
const PERCENTAGE_POINTS: [number, number][] = [
  [0.9, 1.281551566],
  [0.95, 1.644853627],
  [0.975, 1.959963985],
  [0.98, 2.053748911],
  [0.99, 2.326347874],
  [0.995, 2.575829304],
  [0.999, 3.090232306],
];

// Standard normal loss G(k) = φ(k) − k·Q(k), worked by hand from the density φ(k) and upper tail
// Q(k) = 1 − Φ(k) of Abramowitz & Stegun (1964), Table 26.1 (values to 10 decimals quoted from
// memory). The 4-significant-figure column is the unit normal loss table of inventory texts (e.g.
// Silver, Pyke & Thomas, appendix), also from memory.
const LOSS: { k: number; phi: number; Q: number; printed: number }[] = [
  { k: 0, phi: 0.3989422804, Q: 0.5, printed: 0.3989 }, // 0.3989422804 − 0
  { k: 0.5, phi: 0.3520653268, Q: 0.3085375387, printed: 0.1978 }, // 0.3520653268 − 0.1542687694 = 0.1977965574
  { k: 1, phi: 0.2419707245, Q: 0.1586552539, printed: 0.08332 }, // 0.2419707245 − 0.1586552539 = 0.0833154706
  { k: 1.5, phi: 0.1295175957, Q: 0.0668072013, printed: 0.02931 }, // 0.1295175957 − 0.1002108020 = 0.0293067937
  { k: 2, phi: 0.0539909665, Q: 0.0227501319, printed: 0.008491 }, // 0.0539909665 − 0.0455002638 = 0.0084907027
  { k: 2.5, phi: 0.0175283005, Q: 0.0062096653, printed: 0.002004 }, // 0.0175283005 − 0.0155241633 = 0.0020041372
  { k: 3, phi: 0.0044318484, Q: 0.001349898, printed: 0.0003822 }, // 0.0044318484 − 0.0040496940 = 0.0003821544
];

describe('normal quantiles (Abramowitz & Stegun ch. 26) against @stdlib', () => {
  for (const [p, x] of PERCENTAGE_POINTS) {
    it(`Φ⁻¹(${p}) = ${x}`, () => {
      expect(Math.abs(quantile(p, 0, 1) - x)).toBeLessThan(1e-6);
      // the cycle-service safety factor is exactly this quantile
      expect(Math.abs(safetyFactor('cycle', p, 1, 1).k - x)).toBeLessThan(1e-6);
    });
  }
});

describe('standard normal loss function G(k) = φ(k) − k(1 − Φ(k))', () => {
  for (const row of LOSS) {
    it(`G(${row.k}) from A&S Table 26.1 by hand = ${(row.phi - row.k * row.Q).toFixed(10)}`, () => {
      const byHand = row.phi - row.k * row.Q;
      expect(Math.abs(standardNormalLoss(row.k) - byHand)).toBeLessThan(1e-6);
      // the printed 4-figure inventory table agrees to its own rounding
      expect(Math.abs(standardNormalLoss(row.k) - row.printed) / row.printed).toBeLessThan(5e-4);
    });
  }

  it('inverse: solving G(k) = g returns k to 1e-9, tails and negative k included', () => {
    for (const k of [-3, -1, -0.2, 0, 0.3, 1, 1.7, 2.5, 4, 6]) {
      expect(Math.abs(inverseNormalLoss(standardNormalLoss(k)) - k)).toBeLessThan(1e-9);
    }
  });

  it('fill-rate factor: Q = 100, σ = 30, β = 0.98 gives G(k) = 100·0.02/30 = 0.0667', () => {
    // G(k) = 2/30 = 0.066667; from the table, G(1.1) ≈ 0.06862 and G(1.2) ≈ 0.05610 (A&S φ, Q by
    // hand), so k lies a little above 1.1.
    const f = safetyFactor('fill', 0.98, 30, 100);
    expect(standardNormalLoss(f.k)).toBeCloseTo(2 / 30, 12);
    expect(f.k).toBeGreaterThan(1.1);
    expect(f.k).toBeLessThan(1.2);
  });

  it('rejects a target outside (0, 1) with the value in the message', () => {
    expect(() => safetyFactor('cycle', 1.2, 1, 1)).toThrow(/1\.2/);
    expect(() => inverseNormalLoss(0)).toThrow(/positive/);
  });
});
