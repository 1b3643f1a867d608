import { describe, expect, it } from 'vitest';
import {
  forecastErrorCovariance,
  leadTimeSumVariance,
  windowSumVariance,
} from '../../../core/arma/leadTimeSum';
import { integratedAr, psiWeights } from '../../../core/arma/psi';
import { createRng } from '../../../core/arma/random';
import { simulateArma } from '../../../core/arma/simulate';

describe('ψ-weights', () => {
  it('AR(1): ψ_j = φ^j (textbook definition)', () => {
    const psi = psiWeights([0.8], [], 6);
    for (let j = 0; j < 6; j++) expect(psi[j]).toBeCloseTo(0.8 ** j, 14);
  });
  it('MA(1) in the ma-minus convention: ψ_1 = −θ, then zero (definition)', () => {
    expect(Array.from(psiWeights([], [0.5], 4))).toEqual([1, -0.5, 0, 0]);
  });
  it('random walk (d = 1): every ψ_j = 1 (definition)', () => {
    expect(Array.from(psiWeights([], [], 5, 1))).toEqual([1, 1, 1, 1, 1]);
  });
  it('(1 − 0.5B)(1 − B) = 1 − 1.5B + 0.5B², so φ* = [1.5, −0.5] (polynomial product)', () => {
    expect(Array.from(integratedAr([0.5], 1))).toEqual([1.5, -0.5]);
  });
  it('continuing from index k gives the same weights as one pass (the recursion reads only earlier ones)', () => {
    const whole = psiWeights([1.2, -0.5], [0.3], 40, 1);
    const part = new Float64Array(40);
    psiWeights([1.2, -0.5], [0.3], 17, 1, part);
    psiWeights([1.2, -0.5], [0.3], 40, 1, part, 17);
    expect(Array.from(part)).toEqual(Array.from(whole));
  });
});

describe('variance of a sum of forecast errors', () => {
  it('white noise: Var(sum of L weeks) = L σ² (definition)', () => {
    expect(leadTimeSumVariance(psiWeights([], [], 8), 2, 8)).toBeCloseTo(16, 12);
  });

  it('AR(1) φ = 0.8, L = 4: σ²·Σ(1, 1.8, 2.44, 2.952)² = 18.908 σ², 4.73 × the L·σ² of the √L rule', () => {
    // Hand arithmetic from ψ = 1, 0.8, 0.64, 0.512: partial sums 1, 1.8, 2.44, 2.952;
    // squares 1 + 3.24 + 5.9536 + 8.714304 = 18.907904.
    const v = leadTimeSumVariance(psiWeights([0.8], [], 4), 1, 4);
    expect(v).toBeCloseTo(18.907904, 10);
    expect(v / 4).toBeCloseTo(4.726976, 6);
  });

  it('agrees with the covariances summed one by one (definition of Var of a sum)', () => {
    const psi = psiWeights([0.6, -0.2], [0.4], 10);
    let direct = 0;
    for (let a = 3; a <= 9; a++)
      for (let b = 3; b <= 9; b++) direct += forecastErrorCovariance(psi, 1.7, a, b);
    expect(windowSumVariance(psi, 1.7, 3, 9)).toBeCloseTo(direct, 10);
  });

  it('matches the simulated variance of 4-week sums of AR(1) φ = 0.8 errors within 2%', () => {
    // Simulate the future: start each replicate from the same known state, draw 4 shocks, sum the
    // deviation from the conditional mean. 200,000 replicates give a relative s.e. of about 0.3%.
    const rng = createRng(20261201);
    const reps = 200_000;
    let sum2 = 0;
    for (let r = 0; r < reps; r++) {
      let dev = 0;
      let total = 0;
      for (let h = 0; h < 4; h++) {
        dev = 0.8 * dev + rng.normal();
        total += dev;
      }
      sum2 += total * total;
    }
    const simulated = sum2 / reps;
    const theory = leadTimeSumVariance(psiWeights([0.8], [], 4), 1, 4);
    expect(Math.abs(simulated / theory - 1)).toBeLessThan(0.02);
    expect(Math.abs(4 / simulated - 1)).toBeGreaterThan(0.7);
  });
});

describe('seeded simulation', () => {
  it('the same seed gives the same series, another seed another one', () => {
    const m = { ar: [0.5], ma: [0.3], sigma2: 1, mean: 10 };
    expect(Array.from(simulateArma(m, 50, 7))).toEqual(Array.from(simulateArma(m, 50, 7)));
    expect(simulateArma(m, 50, 8)[0]).not.toBe(simulateArma(m, 50, 7)[0]);
  });

  it('normal draws have mean 0 and variance 1 (definition), within 4 standard errors', () => {
    const rng = createRng(1);
    const n = 100_000;
    let s = 0;
    let s2 = 0;
    for (let i = 0; i < n; i++) {
      const z = rng.normal();
      s += z;
      s2 += z * z;
    }
    expect(Math.abs(s / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(s2 / n - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
  });

  it('AR(1) φ = 0.7 has lag-1 sample autocorrelation near 0.7 and variance near σ²/(1 − φ²) (definition)', () => {
    const y = simulateArma({ ar: [0.7], ma: [], sigma2: 1 }, 20_000, 3);
    let m = 0;
    for (const v of y) m += v;
    m /= y.length;
    let c0 = 0;
    let c1 = 0;
    for (let t = 0; t < y.length; t++) {
      c0 += (y[t] - m) ** 2;
      if (t > 0) c1 += (y[t] - m) * (y[t - 1] - m);
    }
    expect(c1 / c0).toBeCloseTo(0.7, 1);
    expect(c0 / y.length / (1 / (1 - 0.49))).toBeGreaterThan(0.93);
    expect(c0 / y.length / (1 / (1 - 0.49))).toBeLessThan(1.07);
  });
});
