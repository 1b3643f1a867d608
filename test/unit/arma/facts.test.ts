/**
 * Facts of the trade (issue 2, acceptance 2), checked against their textbook definitions
 * (Box, Jenkins & Reinsel, "Time Series Analysis", ch. 3; ma-minus convention throughout).
 */
import { Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { fitArma, sampleAcf, simulateArma, theoreticalAcf } from '../../../core/arma';
import { ArmaLikelihood } from '../../../core/arma/kalmanLikelihood';

/** Exact Gaussian log-likelihood log N(y; 0, σ²Σ) with σ² at its maximum, by dense Cholesky. */
function denseConcentratedLoglik(y: Float64Array, cov: (i: number, j: number) => number): number {
  const n = y.length;
  const S = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) S.set(i, j, cov(i, j));
  const L = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = S.get(i, j);
      for (let k = 0; k < j; k++) s -= L.get(i, k) * L.get(j, k);
      L.set(i, j, i === j ? Math.sqrt(s) : s / L.get(j, j));
    }
  }
  const z = new Float64Array(n);
  let logdet = 0;
  for (let i = 0; i < n; i++) {
    let s = y[i];
    for (let k = 0; k < i; k++) s -= L.get(i, k) * z[k];
    z[i] = s / L.get(i, i);
    logdet += 2 * Math.log(L.get(i, i));
  }
  let q = 0;
  for (const v of z) q += v * v;
  const s2 = q / n;
  return -0.5 * (n * Math.log(2 * Math.PI * s2) + logdet + n);
}

describe('theoretical autocorrelation', () => {
  it('an MA(q) has ACF exactly zero beyond lag q (definition)', () => {
    const rho = theoreticalAcf([], [0.6, -0.3, 0.2], 12);
    for (let k = 4; k <= 12; k++) expect(rho[k]).toBe(0);
    expect(rho[3]).not.toBe(0);
  });

  it('MA(1): ρ_1 = −θ/(1 + θ²) in the ma-minus convention (definition)', () => {
    const rho = theoreticalAcf([], [0.5], 3);
    expect(rho[1]).toBeCloseTo(-0.5 / 1.25, 14);
    expect(rho[2]).toBe(0);
  });

  it('an AR(p) ACF decays geometrically but is never exactly zero (definition)', () => {
    const rho = theoreticalAcf([0.5, 0.3], [], 60);
    for (let k = 1; k <= 60; k++) {
      expect(rho[k]).not.toBe(0);
      expect(Math.abs(rho[k])).toBeLessThan(1);
    }
    expect(Math.abs(rho[60])).toBeLessThan(Math.abs(rho[10]));
  });

  it('AR(1): ρ_k = φ^k (definition)', () => {
    const rho = theoreticalAcf([0.8], [], 10);
    for (let k = 0; k <= 10; k++) expect(rho[k]).toBeCloseTo(0.8 ** k, 12);
  });

  it('ARMA(0,0) is white noise: ρ_0 = 1, every other lag 0 (definition)', () => {
    expect(Array.from(theoreticalAcf([], [], 5))).toEqual([1, 0, 0, 0, 0, 0]);
  });

  it('a long simulated ARMA(1,1) has sample ACF near the theoretical one (within 0.05)', () => {
    const y = simulateArma({ ar: [0.7], ma: [0.4], sigma2: 1 }, 20_000, 11);
    const r = sampleAcf(y, 5);
    const rho = theoreticalAcf([0.7], [0.4], 5);
    for (let k = 1; k <= 5; k++) expect(Math.abs(r[k] - rho[k])).toBeLessThan(0.05);
  });
});

describe('ARMA(1,0) and ARMA(0,1) reduce to AR(1) and MA(1)', () => {
  const y = simulateArma({ ar: [0.6], ma: [], sigma2: 2 }, 80, 5);
  it('ARMA(1,0) likelihood = the AR(1) Gaussian likelihood, γ_k = σ² φ^|k| / (1 − φ²) (definition)', () => {
    const lik = new ArmaLikelihood(y, [], 1, 0);
    lik.disableSteadyState(); // no steady-state shortcut
    const phi = 0.55;
    const ours = lik.loglikFromObjective(lik.profile([phi], []));
    const dense = denseConcentratedLoglik(y, (i, j) => phi ** Math.abs(i - j) / (1 - phi * phi));
    expect(ours).toBeCloseTo(dense, 9);
  });
  it('ARMA(0,1) likelihood = the MA(1) Gaussian likelihood, γ_0 = σ²(1 + θ²), γ_1 = −σ²θ (definition)', () => {
    const lik = new ArmaLikelihood(y, [], 0, 1);
    lik.disableSteadyState();
    const theta = -0.4;
    const ours = lik.loglikFromObjective(lik.profile([], [theta]));
    const dense = denseConcentratedLoglik(y, (i, j) =>
      i === j ? 1 + theta * theta : Math.abs(i - j) === 1 ? -theta : 0,
    );
    expect(ours).toBeCloseTo(dense, 9);
  });
  it('ARMA(2,1) likelihood = the dense Gaussian likelihood with the model ACF (definition)', () => {
    const lik = new ArmaLikelihood(y, [], 2, 1);
    lik.disableSteadyState();
    const ar = [0.5, -0.2];
    const ma = [0.3];
    const rho = theoreticalAcf(ar, ma, y.length);
    const ours = lik.loglikFromObjective(lik.profile(ar, ma));
    // Scale is concentrated out, so the correlations suffice.
    const dense = denseConcentratedLoglik(y, (i, j) => rho[Math.abs(i - j)]);
    expect(ours).toBeCloseTo(dense, 8);
  });
  it('fitArma of an AR(1) series at order (1,0,0) has no MA part and a stationary φ', () => {
    const fit = fitArma(y, { p: 1, d: 0, q: 0 });
    expect(fit.ma).toEqual([]);
    expect(Math.abs(fit.ar[0])).toBeLessThan(1);
    expect(fit.converged).toBe(true);
  });
});

describe('parameter recovery (simulated series of length 2,000 recover within three standard errors)', () => {
  const cases = [
    { name: 'AR(1)', ar: [0.7], ma: [], seed: 101 },
    { name: 'MA(1)', ar: [], ma: [0.5], seed: 102 },
    { name: 'ARMA(1,1)', ar: [0.6], ma: [-0.3], seed: 103 },
    { name: 'AR(2)', ar: [0.5, 0.3], ma: [], seed: 104 },
    { name: 'ARMA(2,2)', ar: [0.5, -0.3], ma: [0.4, 0.2], seed: 105 },
  ];
  for (const c of cases) {
    it(`${c.name} φ=${c.ar} θ=${c.ma}, mean 50, σ² = 4`, () => {
      const y = simulateArma({ ar: c.ar, ma: c.ma, sigma2: 4, mean: 50 }, 2000, c.seed);
      const fit = fitArma(y, { p: c.ar.length, d: 0, q: c.ma.length });
      expect(fit.fallback).toBeNull();
      c.ar.forEach((v, i) => {
        expect(Math.abs(fit.ar[i] - v)).toBeLessThan(3 * fit.stderr.ar[i]);
      });
      c.ma.forEach((v, i) => {
        expect(Math.abs(fit.ma[i] - v)).toBeLessThan(3 * fit.stderr.ma[i]);
      });
      expect(Math.abs((fit.mean ?? 0) - 50)).toBeLessThan(3 * (fit.stderr.mean ?? 0));
      expect(fit.sigma2 / 4).toBeGreaterThan(0.9);
      expect(fit.sigma2 / 4).toBeLessThan(1.1);
    });
  }
});
