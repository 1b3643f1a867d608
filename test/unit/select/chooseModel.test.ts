import { describe, expect, it } from 'vitest';
import { leadTimeMoments } from '../../../core/arma/forecast';
import { simulateArma } from '../../../core/arma/simulate';
import { diagnoseChoice } from '../../../core/diagnose/diagnoseChoice';
import { chooseModel, MIN_ROOT_MODULUS, NEAR_TIE } from '../../../core/select/chooseModel';
import { minRootModulus } from '../../../core/select/engine';
import {
  estimationAllowance,
  forecastChoice,
  leadTimeMomentsChoice,
} from '../../../core/select/forecastChoice';

const weeks = (n: number, start = Date.UTC(2022, 0, 3)): string[] =>
  Array.from({ length: n }, (_, i) => new Date(start + i * 7 * 86_400_000).toISOString().slice(0, 10));

describe('chooseModel: the selection rules', () => {
  const y = simulateArma({ ar: [0.6], ma: [], sigma2: 4, mean: 40 }, 156, 12);
  // Seasonal step off here: these tests are about the ARMA order rules (seasonality is tested below).
  const c = chooseModel(y, weeks(156), { seasonal: false });

  it('records every candidate with its AICc and picks by the stated rule', () => {
    expect(c.kind).toBe('arma');
    expect(c.order.d).toBe(0);
    const cands = c.selection.candidates;
    expect(cands.length).toBeGreaterThanOrEqual(4);
    const chosen = cands.find(
      (k) =>
        k.order.p === c.order.p &&
        k.order.q === c.order.q &&
        k.seasonalHarmonics === c.seasonalHarmonics &&
        k.includeMean === c.includeMean,
    );
    expect(chosen?.aicc).toBeCloseTo(c.fit!.aicc, 10);
    // No other candidate beats the winner by NEAR_TIE or more without a recorded reason.
    for (const k of cands) {
      if (k === chosen || k.aicc === null) continue;
      if (k.aicc < (chosen?.aicc ?? Number.NEGATIVE_INFINITY)) expect(k.passedOver).toBeTruthy();
    }
    // The winner is sound: converged and every root modulus ≥ 1.01.
    expect(c.fit!.converged).toBe(true);
    expect(minRootModulus(c.fit!.ar)).toBeGreaterThanOrEqual(MIN_ROOT_MODULUS);
    expect(minRootModulus(c.fit!.ma)).toBeGreaterThanOrEqual(MIN_ROOT_MODULUS);
    expect(NEAR_TIE).toBe(0.1);
  });

  it('finds the AR(1) on a 156-week AR(1) with φ = 0.6 and an AICc grid agrees on the best', () => {
    expect(c.order.p + c.order.q).toBeGreaterThanOrEqual(1);
    const g = chooseModel(y, weeks(156), { search: 'grid', maxOrder: 2, seasonal: false });
    expect(g.selection.candidates.length).toBe(9);
    expect(g.fit!.aicc).toBeLessThanOrEqual(c.fit!.aicc + NEAR_TIE);
  });

  it('differences a random walk (KPSS) and considers a drift', () => {
    const rw = simulateArma({ ar: [], ma: [], sigma2: 1, d: 1 }, 120, 3);
    const r = chooseModel(rw, weeks(120));
    expect(r.order.d).toBe(1);
    const means = new Set(r.selection.candidates.map((k) => k.includeMean));
    expect(means.size).toBe(2);
  });

  it('fits exactly the forced model, with no search', () => {
    const f = chooseModel(y, weeks(156), {
      forced: { order: { p: 0, d: 0, q: 1 }, seasonalHarmonics: 0, includeMean: true },
    });
    expect(f.order).toEqual({ p: 0, d: 0, q: 1 });
    expect(f.selection.search).toBe('forced');
    expect(f.selection.candidates.length).toBe(1);
    expect(estimationAllowance(f)).toBe(1);
  });

  it('lead-time moments from week 1 equal the engine; a later window is consistent with its weeks', () => {
    const m = leadTimeMomentsChoice(c, 1, 4);
    const e = leadTimeMoments(c.fit!, 4);
    expect(m.mean).toBeCloseTo(e.mean, 8);
    // Automatic choices widen the engine's variance by Akaike's FPE factor (n + k)/(n − k).
    const k = c.fit!.nparams - 1;
    const n = c.fit!.nobs;
    expect(estimationAllowance(c)).toBeCloseTo((n + k) / (n - k), 12);
    expect(m.variance).toBeCloseTo(e.variance * ((n + k) / (n - k)), 8);
    const f = forecastChoice(c, 6);
    const w = leadTimeMomentsChoice(c, 3, 6);
    expect(w.mean).toBeCloseTo(f.mean[2] + f.mean[3] + f.mean[4] + f.mean[5], 8);
    // With positive autocorrelation the sum's variance exceeds the sum of the weeks' variances.
    let sumVar = 0;
    for (let h = 2; h < 6; h++) sumVar += f.se[h] ** 2;
    expect(w.variance).toBeGreaterThan(sumVar);
  });
});

describe('chooseModel: unsound candidates are passed over', () => {
  it('never picks a model with a root modulus below 1.01 over a sound one, and says why', () => {
    // A noise-free sequence of period 11: ARMA fits to it end on the MA unit circle (modulus 1.000…)
    // with a far lower AICc, the situation the issue describes for general-purpose fitters.
    const y = Array.from({ length: 156 }, (_, i) => 50 + ((i * 37) % 11));
    const c = chooseModel(y, weeks(156), { seasonal: false });
    expect(c.kind).toBe('arma');
    expect(minRootModulus(c.fit!.ma)).toBeGreaterThanOrEqual(MIN_ROOT_MODULUS);
    expect(minRootModulus(c.fit!.ar)).toBeGreaterThanOrEqual(MIN_ROOT_MODULUS);
    const passed = c.selection.candidates.filter((k) => k.passedOver && /root modulus/.test(k.passedOver));
    expect(passed.length).toBeGreaterThan(0);
    for (const k of passed) expect(k.aicc!).toBeLessThan(c.fit!.aicc);
  });
});

describe('chooseModel: annual cycle', () => {
  it('chooses Fourier terms on a 3-year series with a strong annual cycle and continues it', () => {
    const n = 156;
    const ws = weeks(n);
    const noise = simulateArma({ ar: [0.4], ma: [], sigma2: 1, mean: 30 }, n + 13, 8);
    const cycle = (i: number): number => 6 * Math.sin((2 * Math.PI * i * 7) / 365.25);
    const y = Float64Array.from({ length: n }, (_, i) => noise[i] + cycle(i));
    const c = chooseModel(y, ws);
    expect(c.seasonalHarmonics).toBeGreaterThan(0);
    const f = forecastChoice(c, 13);
    let err = 0;
    for (let h = 0; h < 13; h++) err += Math.abs(f.mean[h] - (30 + cycle(n + h)));
    expect(err / 13).toBeLessThan(1.5);
  });
});

describe('chooseModel: awkward series never crash', () => {
  const cases: [string, number[]][] = [
    ['empty', []],
    ['one point', [5]],
    ['constant', new Array(40).fill(7)],
    ['all zeros', new Array(40).fill(0)],
    ['single spike', Array.from({ length: 60 }, (_, i) => (i === 30 ? 100 : 0))],
    ['five points', [3, 4, 2, 5, 3]],
    ['values of 1e7', Array.from(simulateArma({ ar: [0.3], ma: [], sigma2: 1e10, mean: 1e7 }, 80, 5))],
    ['with gaps', Array.from({ length: 80 }, (_, i) => (i % 7 === 3 ? Number.NaN : 10 + Math.sin(i)))],
  ];
  for (const [name, y] of cases) {
    it(name, () => {
      const ws = weeks(y.length);
      const c = chooseModel(y, ws);
      const f = forecastChoice(c, 8);
      for (let h = 0; h < 8; h++) {
        expect(Number.isFinite(f.mean[h])).toBe(true);
        expect(Number.isFinite(f.se[h])).toBe(true);
      }
      const lt = leadTimeMomentsChoice(c, 1, 4);
      expect(Number.isFinite(lt.mean) && Number.isFinite(lt.variance)).toBe(true);
      const d = diagnoseChoice(c, ws);
      expect(Array.isArray(d.flags)).toBe(true);
      if (y.length < 52) expect(d.flags.map((x) => x.code)).toContain('short-history');
      for (const fl of d.flags) expect(fl.reason.length).toBeGreaterThan(10);
    });
  }

  it('sends sparse non-negative demand to SBA with a flag', () => {
    const y = Array.from({ length: 120 }, (_, i) => ((i * 7919) % 5 === 0 ? 3 + (i % 4) : 0));
    const c = chooseModel(y, weeks(120));
    expect(c.kind).toBe('intermittent');
    expect(c.demandClass).toBe('intermittent');
    const d = diagnoseChoice(c, weeks(120));
    expect(d.flags.map((f) => f.code)).toContain('sparse-demand');
  });
});
