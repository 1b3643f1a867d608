/**
 * The analytic gradient of the concentrated objective (core/arma/likelihoodGradient.ts) against
 * its definition: central differences of the same function (profile(), with the steady-state
 * switch steps frozen as the search freezes them), on every kind of step the filter takes (full,
 * steady, missing, missing right after a steady stretch), with and without a mean, pure AR, pure
 * MA and near the MA unit circle. And the Jacobian of the partial-autocorrelation map against
 * differences of the map.
 */
import { describe, expect, it } from 'vitest';
import { createRng, simulateArma } from '../../../core/arma';
import { ArmaLikelihood } from '../../../core/arma/kalmanLikelihood';
import {
  unconstrainedJacobian,
  unconstrainedToCoefficients,
} from '../../../core/arma/partialAutocorrelations';

interface Case {
  ar: number[];
  ma: number[];
  mean: boolean;
  missing: number[];
}

const CASES: Case[] = [
  { ar: [0.5, 0.2], ma: [0.4, 0.2], mean: true, missing: [] },
  { ar: [0.6], ma: [-0.3], mean: true, missing: [] },
  { ar: [0.5, 0.2], ma: [0.4, 0.2], mean: false, missing: [] },
  { ar: [0.3, 0.2, -0.1], ma: [0.5, -0.2], mean: true, missing: [5, 6, 40, 100, 101, 102] },
  { ar: [0.5, 0.2], ma: [0.97, -0.01], mean: true, missing: [10, 70, 71] },
  { ar: [], ma: [0.4, 0.2], mean: true, missing: [] },
  { ar: [0.4, 0.3], ma: [], mean: true, missing: [3] },
  { ar: [0.4], ma: [], mean: false, missing: [] },
  { ar: [], ma: [0.5], mean: true, missing: [2, 100] },
];

function centralDifferences(lik: ArmaLikelihood, ar: Float64Array, ma: Float64Array): number[] {
  const p = ar.length;
  const h = 1e-6;
  const out: number[] = [];
  lik.freezeSwitches();
  for (let i = 0; i < p + ma.length; i++) {
    const ap = Float64Array.from(ar);
    const am = Float64Array.from(ar);
    const mp = Float64Array.from(ma);
    const mm = Float64Array.from(ma);
    if (i < p) {
      ap[i] += h;
      am[i] -= h;
    } else {
      mp[i - p] += h;
      mm[i - p] -= h;
    }
    out.push((lik.profile(ap, mp) - lik.profile(am, mm)) / (2 * h));
  }
  lik.releaseSwitches();
  return out;
}

describe('analytic gradient of the concentrated likelihood', () => {
  for (const c of CASES) {
    const name = `ARMA(${c.ar.length},${c.ma.length})${c.mean ? ' with a mean' : ''}, ${c.missing.length} missing weeks`;
    it(`${name}: equals central differences of the same function`, () => {
      const n = 156;
      const p = c.ar.length;
      const q = c.ma.length;
      const y = Float64Array.from(
        simulateArma({ ar: c.ar, ma: c.ma, sigma2: 1, mean: 0.3 }, n, createRng(7 * p + q)),
      );
      for (const t of c.missing) y[t] = Number.NaN;
      const lik = new ArmaLikelihood(y, c.mean ? [new Float64Array(n).fill(1)] : [], p, q);
      expect(lik.hasGradient).toBe(true);
      const ar = Float64Array.from(c.ar, (v) => 0.9 * v);
      const ma = Float64Array.from(c.ma, (v) => 0.9 * v);
      for (const exact of [false, true]) {
        if (exact) lik.disableSteadyState();
        else lik.releaseSwitches();
        expect(Number.isFinite(lik.profile(ar, ma))).toBe(true);
        if (!exact && !(c.ma[0] > 0.9)) expect(lik.switches.length).toBeGreaterThan(0);
        const gAr = new Float64Array(p);
        const gMa = new Float64Array(q);
        expect(lik.gradient(gAr, gMa)).toBe(true);
        const fd = centralDifferences(lik, ar, ma);
        [...gAr, ...gMa].forEach((g, i) => {
          expect(Math.abs(g - fd[i])).toBeLessThan(1e-8 * Math.max(1, Math.abs(fd[i])));
        });
      }
    });
  }

  it('a missing week exactly where the steady state is entered (an empty steady stretch)', () => {
    const n = 120;
    const y = Float64Array.from(
      simulateArma({ ar: [0.4], ma: [-0.3], sigma2: 1, mean: 0 }, n, createRng(11)),
    );
    const ones = [new Float64Array(n).fill(1)];
    const ar = Float64Array.from([0.4]);
    const ma = Float64Array.from([-0.3]);
    const complete = new ArmaLikelihood(y, ones, 1, 1);
    complete.profile(ar, ma);
    const s = complete.switches[0];
    y[s] = Number.NaN;
    y[s + 40] = Number.NaN;
    const lik = new ArmaLikelihood(y, ones, 1, 1);
    expect(Number.isFinite(lik.profile(ar, ma))).toBe(true);
    expect(Array.from(lik.switches)).toContain(s);
    const gAr = new Float64Array(1);
    const gMa = new Float64Array(1);
    expect(lik.gradient(gAr, gMa)).toBe(true);
    const fd = centralDifferences(lik, ar, ma);
    expect(Math.abs(gAr[0] - fd[0])).toBeLessThan(1e-8);
    expect(Math.abs(gMa[0] - fd[1])).toBeLessThan(1e-8);
  });

  it('is not offered where the filter has no recorded pass (several regressors)', () => {
    const n = 60;
    const y = Float64Array.from(simulateArma({ ar: [0.5], ma: [], sigma2: 1, mean: 0 }, n, createRng(3)));
    const lik = new ArmaLikelihood(
      y,
      [new Float64Array(n).fill(1), Float64Array.from({ length: n }, (_, t) => t)],
      1,
      0,
    );
    expect(lik.hasGradient).toBe(false);
    expect(lik.gradient(new Float64Array(1), new Float64Array(0))).toBe(false);
  });
});

describe('Jacobian of the partial-autocorrelation map', () => {
  for (const k of [1, 2, 3, 5]) {
    it(`k = ${k}: equals central differences of the map`, () => {
      const u = Array.from({ length: k }, (_, i) => 0.3 * (i + 1) * (i % 2 ? -1 : 1));
      const jac = new Float64Array(k * k);
      unconstrainedJacobian(u, 0, k, jac, new Float64Array(k * (k + 2)));
      const h = 1e-6;
      const plus = new Float64Array(k);
      const minus = new Float64Array(k);
      const work = new Float64Array(k);
      for (let l = 0; l < k; l++) {
        const up = [...u];
        const um = [...u];
        up[l] += h;
        um[l] -= h;
        unconstrainedToCoefficients(up, 0, k, plus, 0, work);
        unconstrainedToCoefficients(um, 0, k, minus, 0, work);
        for (let i = 0; i < k; i++) {
          expect(Math.abs((plus[i] - minus[i]) / (2 * h) - jac[i * k + l])).toBeLessThan(1e-8);
        }
      }
    });
  }
});
