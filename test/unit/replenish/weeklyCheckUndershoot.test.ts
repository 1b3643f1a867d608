import cdf from '@stdlib/stats-base-dists-normal-cdf';
import pdf from '@stdlib/stats-base-dists-normal-pdf';
import { describe, expect, it } from 'vitest';
import { weeklyCheckReorder } from '../../../core/replenish/weeklyCheckUndershoot';

// With a weekly drop of exactly m (s.d. 0) the undershoot is uniform on [0, m] (stationary-excess
// distribution of a constant: P(d > u)/E[d] = 1/m on [0, m]), which gives closed forms by integrating
// the normal tail and the normal loss function over u (our derivation, written out here):
//   P(stockout)       = (1/m)∫₀^m Φ̄((x − u)/σ) du = (σ/m)[G((x − m)/σ) − G(x/σ)],
//   expected shortage = (1/m)∫₀^m σG((x − u)/σ) du = (σ²/m)[G₂((x − m)/σ) − G₂(x/σ)],
// with G(k) = φ(k) − kΦ̄(k) (the standard normal loss function) and its integral
// G₂(k) = ∫_k^∞ G = ½[(1 + k²)Φ̄(k) − kφ(k)] (the second-order loss function, e.g. in Silver, Pyke &
// Thomas — from memory; checked here against the first form's derivative G₂′ = −G numerically).
const G = (k: number) => pdf(k, 0, 1) - k * cdf(-k, 0, 1);
const G2 = (k: number) => 0.5 * ((1 + k * k) * cdf(-k, 0, 1) - k * pdf(k, 0, 1));

describe('weekly-check reorder point (R, s, nQ) with R = 1', () => {
  it('G₂ is the integral of G (numerical derivative)', () => {
    for (const k of [-1, 0, 0.7, 2]) expect((G2(k - 1e-5) - G2(k + 1e-5)) / 2e-5).toBeCloseTo(G(k), 7);
  });

  it('no lead-time uncertainty, constant weekly demand 100: 95% cycle service → margin = 95th percentile of U(0, 100) = 95', () => {
    const r = weeklyCheckReorder('cycle', 0.95, 0, 100, 0, 200);
    expect(r.expectedUndershoot).toBeCloseTo(50, 9); // mean of U(0, 100)
    expect(r.margin).toBeCloseTo(95, 6);
    expect(r.safetyStock).toBeCloseTo(45, 6);
  });

  it('cycle service, σ_L = √200, constant drop 100: (σ/m)[G((x − m)/σ) − G(x/σ)] = 0.05 at the margin', () => {
    const s = Math.sqrt(200);
    const r = weeklyCheckReorder('cycle', 0.95, s, 100, 0, 200);
    expect((s / 100) * (G((r.margin - 100) / s) - G(r.margin / s))).toBeCloseTo(0.05, 5);
    expect(r.k).toBeCloseTo(r.safetyStock / s, 12);
  });

  it('fill rate, σ_L = 20, constant drop 100, lot 400: (σ²/m)[G₂((x − m)/σ) − G₂(x/σ)] = 400 × 0.02 = 8', () => {
    const r = weeklyCheckReorder('fill', 0.98, 20, 100, 0, 400);
    expect((400 / 100) * (G2((r.margin - 100) / 20) - G2(r.margin / 20))).toBeCloseTo(8, 4);
  });

  it('a varying drop lifts the mean undershoot to E[d²]/(2E[d]) (renewal theory): d ~ N(100, 30²) → 54.5', () => {
    // (100² + 30²)/(2 × 100) = 54.5
    expect(weeklyCheckReorder('cycle', 0.95, 20, 100, 30, 300).expectedUndershoot).toBeCloseTo(54.5, 2);
  });

  it('never a negative safety stock: a lot of 50 weeks at 90% fill needs none', () => {
    const r = weeklyCheckReorder('fill', 0.9, 20, 100, 10, 5000);
    expect(r.safetyStock).toBe(0);
    expect(r.margin).toBe(r.expectedUndershoot);
    expect(r.method).toMatch(/never below/);
  });

  it('refuses a target outside (0, 1) with its value', () => {
    expect(() => weeklyCheckReorder('cycle', 1.2, 20, 100, 10, 200)).toThrow(/1\.2/);
  });
});
