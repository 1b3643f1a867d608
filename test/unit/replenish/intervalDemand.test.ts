import { describe, expect, it } from 'vitest';
import { psiWeights } from '../../../core/arma/psi';
import { createRng } from '../../../core/arma/random';
import { simulateArma } from '../../../core/arma/simulate';
import { armaSumMoments, intervalDemand } from '../../../core/replenish/intervalDemand';

describe('demand over the protection interval', () => {
  it('acceptance 2 — AR(1) φ = 0.8, L = 4: sum variance matches simulation within 2%; L × one-week variance is 4.73× too small', () => {
    // Theory (Box, Jenkins & Reinsel ch. 5; core/arma/leadTimeSum): ψ = 1, 0.8, 0.64, 0.512,
    // partial sums 1, 1.8, 2.44, 2.952, Var = σ²(1 + 3.24 + 5.9536 + 8.714304) = 18.907904 σ².
    // The √L rule takes L × the one-week (one-step) forecast-error variance = 4σ², too small by the
    // factor 18.907904 / 4 = 4.727 (and L × the unconditional weekly variance σ²/(1 − φ²) = 11.11σ²
    // is too small by 18.907904 / 11.111 = 1.70).
    const phi = 0.8;
    const mu = 50;
    const sigma2 = 1;
    const n = 400_000;
    const y = simulateArma({ ar: [phi], ma: [], sigma2, mean: mu }, n + 4, 20261202);
    // Realised 4-week demand minus its forecast from each origin t (true model's conditional mean).
    let s1 = 0;
    let s2 = 0;
    for (let t = 0; t < n; t++) {
      let forecast = 0;
      let actual = 0;
      let g = 1;
      for (let h = 1; h <= 4; h++) {
        g *= phi;
        forecast += mu + g * (y[t] - mu);
        actual += y[t + h];
      }
      const err = actual - forecast;
      s1 += err;
      s2 += err * err;
    }
    const simulated = s2 / n - (s1 / n) ** 2;
    const path = new Float64Array(4).fill(mu);
    const ours = intervalDemand(armaSumMoments(psiWeights([phi], [], 4), sigma2, path), 4, 0, 0);
    expect(ours.variance).toBeCloseTo(18.907904, 9);
    expect(ours.mean).toBeCloseTo(200, 12);
    expect(Math.abs(ours.variance / simulated - 1)).toBeLessThan(0.02);
    const sqrtRule = 4 * sigma2;
    // The √L rule is off by the theoretical factor 4.727, seen in the simulation to within 2%.
    expect(Math.abs(simulated / sqrtRule / 4.726976 - 1)).toBeLessThan(0.02);
    const unconditional = (4 * sigma2) / (1 - phi * phi);
    expect(Math.abs(simulated / unconditional / 1.701711 - 1)).toBeLessThan(0.02);
  });

  it('random lead time, white noise: Var = E[L]σ² + D²σ_L² (Silver, Pyke & Thomas) is matched by simulation', () => {
    // L ∈ {2, 4, 6} equally likely: E[L] = 4, Var(L) = (4 + 0 + 4)/3 = 8/3. D = 10, σ² = 4:
    // Var = 4·4 + 100·8/3 = 16 + 266.67 = 282.67 (exact for independent weekly demand).
    const rng = createRng(7);
    const reps = 200_000;
    let s1 = 0;
    let s2 = 0;
    for (let r = 0; r < reps; r++) {
      const L = 2 + 2 * Math.floor(rng.uniform() * 3);
      let sum = 0;
      for (let h = 0; h < L; h++) sum += 10 + 2 * rng.normal();
      s1 += sum;
      s2 += sum * sum;
    }
    const simulated = s2 / reps - (s1 / reps) ** 2;
    const path = new Float64Array(8).fill(10);
    const ours = intervalDemand(armaSumMoments(psiWeights([], [], 8), 4, path), 4, Math.sqrt(8 / 3), 0);
    expect(ours.demandVariance).toBeCloseTo(16, 10);
    expect(ours.leadTimeVariance).toBeCloseTo(800 / 3, 10);
    expect(Math.abs(ours.variance / simulated - 1)).toBeLessThan(0.02);
    expect(ours.approximation).toMatch(/lead time that varies/);
  });

  it('periodic review adds R to the interval; a fractional interval interpolates between whole weeks', () => {
    const psi = psiWeights([0.5], [], 10);
    const path = Float64Array.from({ length: 10 }, (_, i) => 10 + i);
    const m = armaSumMoments(psi, 2, path);
    const periodic = intervalDemand(m, 2, 0, 1);
    expect(periodic.weeks).toBe(3);
    expect(periodic.mean).toBe(10 + 11 + 12); // forecast of steps 1..3
    const half = intervalDemand(m, 2.5, 0, 0);
    expect(half.mean).toBeCloseTo(21 + 0.5 * 12, 12); // 10 + 11, plus half of step 3's 12
    const v2 = m(1, 2).variance;
    const v3 = m(1, 3).variance;
    expect(half.demandVariance).toBeCloseTo(v2 + 0.5 * (v3 - v2), 12);
  });

  it('zero-length interval (continuous review, lead time 0) has no demand and no variance', () => {
    const m = armaSumMoments(psiWeights([], [], 2), 1, [5, 5]);
    const r = intervalDemand(m, 0, 0, 0);
    expect(r.mean).toBe(0);
    expect(r.variance).toBe(0);
  });
});
