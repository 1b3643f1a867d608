import { describe, expect, it } from 'vitest';
import { simulateArma } from '../../../core/arma/simulate';
import { backtestChoice } from '../../../core/backtest/backtestChoice';
import { backtestFlags, binomialUpperTail } from '../../../core/backtest/backtestFlags';
import { mase, naiveScale } from '../../../core/backtest/metrics';
import { chooseModel } from '../../../core/select/chooseModel';
import { weeksFrom } from '../select/seriesGenerators';

describe('MASE (Hyndman & Koehler 2006)', () => {
  it('scales by the in-sample mean absolute naive error (definition)', () => {
    // y = 1, 3, 2, 6: naive errors 2, 1, 4 → scale 7/3; errors 1, −2 → MAE 1.5 → MASE 1.5 / (7/3).
    expect(naiveScale([1, 3, 2, 6])).toBeCloseTo(7 / 3, 12);
    expect(mase([1, -2], 7 / 3)).toBeCloseTo(1.5 / (7 / 3), 12);
    // Seasonal naive with m = 2: |2 − 1|, |6 − 3| → 2.
    expect(naiveScale([1, 3, 2, 6], 2)).toBeCloseTo(2, 12);
  });
  it('handles a zero scale without NaN', () => {
    expect(mase([0, 0], 0)).toBe(0);
    expect(mase([1], 0)).toBe(Number.POSITIVE_INFINITY);
  });
});

describe('rolling-origin backtest', () => {
  it('scores 26 origins of an AR(1) with sane coverage, and the model beats naive on white-ish noise', () => {
    const n = 156;
    const y = simulateArma({ ar: [0.3], ma: [], sigma2: 4, mean: 60 }, n, 31);
    const w = weeksFrom(n);
    const c = chooseModel(y, w, { seasonal: false });
    const b = backtestChoice(y, w, c, { weeks: 26, lead: 4 });
    expect(b.origins).toBe(26);
    expect(b.horizons).toHaveLength(4);
    expect(b.horizons[0].count).toBe(26);
    expect(b.horizons[3].count).toBe(23);
    // Nominal 95%: with 26 + 25 + 24 + 23 outcomes anything below 80% would mean broken intervals.
    expect(b.coverage95!).toBeGreaterThan(0.8);
    expect(b.coverage80!).toBeGreaterThan(0.6);
    expect(b.mase!).toBeGreaterThan(0);
    // On a weakly autocorrelated series the mean forecast beats repeating last week (naive has
    // twice the error variance for white noise: definition).
    expect(b.losesToNaive).toBe(false);
    expect(b.mase!).toBeLessThan(b.naiveMase!);
  });
  it('works on short and sparse histories', () => {
    const y = [0, 0, 3, 0, 0, 0, 4, 0, 2, 0, 0, 5, 0, 0, 0, 3];
    const w = weeksFrom(y.length);
    const c = chooseModel(y, w);
    const b = backtestChoice(y, w, c, { lead: 2 });
    expect(b.origins).toBe(8);
    expect(Number.isFinite(b.mase ?? Number.NaN)).toBe(true);
  });
});

describe('flags from a backtest', () => {
  it('binomial upper tail matches the definition', () => {
    // P(X ≥ 1) for Binomial(10, 0.05) = 1 − 0.95^10 (definition).
    expect(binomialUpperTail(1, 10, 0.05)).toBeCloseTo(1 - 0.95 ** 10, 12);
    expect(binomialUpperTail(0, 10, 0.05)).toBe(1);
    // P(X ≥ 2) for Binomial(3, 0.5) = (3 + 1)/8.
    expect(binomialUpperTail(2, 3, 0.5)).toBeCloseTo(0.5, 12);
  });
  it('flags intervals that miss far more often than 5% and a model worse than naive', () => {
    const horizons = [1, 2].map((step) => ({
      step,
      count: 25,
      mase: 1.5,
      bias: 0,
      coverage80: 0.5,
      coverage95: 0.76,
      naiveMase: 1.0,
    }));
    const flags = backtestFlags({
      origins: 26,
      lead: 2,
      scale: 'naive',
      horizons,
      mase: 1.5,
      naiveMase: 1.0,
      bias: 0,
      coverage80: 0.5,
      coverage95: 0.76,
      losesToNaive: true,
    });
    const codes = flags.map((f) => f.code);
    expect(codes).toEqual(['intervals-too-narrow', 'loses-to-naive']);
    expect(flags[0].reason).toContain('12 of 50 actuals fell outside the 95% intervals');
  });
});
