/**
 * Awkward series never crash a fit (issue 2, acceptance 3): each returns flags and a fallback
 * forecast of the same shape with a finite standard error; nothing throws, no forecast is NaN.
 * A series with more observed points than p + q + 2 is fitted at the order asked for.
 */
import { describe, expect, it } from 'vitest';
import { type ArmaFit, fitArma, forecastArma, leadTimeMoments } from '../../../core/arma';

function expectUsableForecast(fit: ArmaFit, horizon = 12): void {
  const fc = forecastArma(fit, horizon);
  expect(fc.mean.length).toBe(horizon);
  expect(fc.se.length).toBe(horizon);
  for (let h = 0; h < horizon; h++) {
    expect(Number.isFinite(fc.mean[h])).toBe(true);
    expect(Number.isFinite(fc.se[h])).toBe(true);
  }
  const lt = leadTimeMoments(fit, 4);
  expect(Number.isFinite(lt.mean) && Number.isFinite(lt.variance)).toBe(true);
  expect(Number.isFinite(fit.sigma2)).toBe(true);
}

const orders = [
  { p: 1, d: 0, q: 1 },
  { p: 2, d: 0, q: 2 },
  { p: 1, d: 1, q: 1 },
  { p: 3, d: 0, q: 0 },
];

describe('awkward input', () => {
  for (const order of orders) {
    const label = `(${order.p},${order.d},${order.q})`;
    it(`constant series ${label}: flag 'constant', fallback at the level, se 0`, () => {
      const fit = fitArma(new Float64Array(52).fill(7), order);
      expect(fit.flags).toContain('constant');
      expect(fit.fallback).not.toBeNull();
      expectUsableForecast(fit);
      expect(forecastArma(fit, 3).mean[2]).toBe(7);
    });
    it(`all zeros ${label}: flag 'all-zero'`, () => {
      const fit = fitArma(new Float64Array(52), order);
      expect(fit.flags).toContain('all-zero');
      expectUsableForecast(fit);
      expect(forecastArma(fit, 1).mean[0]).toBe(0);
    });
    it(`too short ${label}: n ≤ p + q + 2 gives 'too-short'; one more point is fitted`, () => {
      const n = order.p + order.q + 2 + order.d;
      const y = Float64Array.from({ length: n }, (_, i) => 10 + ((i * 7) % 5));
      const fit = fitArma(y, order);
      expect(fit.flags).toContain('too-short');
      expect(fit.fallback).toBe(order.d === 0 ? 'mean' : 'last-value');
      expectUsableForecast(fit);
      const longer = Float64Array.from({ length: n + 1 }, (_, i) => 10 + ((i * 7) % 5));
      const fitted = fitArma(longer, order);
      expect(fitted.fallback).toBeNull();
      expect(fitted.ar.length).toBe(order.p);
      expect(fitted.ma.length).toBe(order.q);
      expectUsableForecast(fitted);
    });
    it(`single spike ${label}: fitted without throwing`, () => {
      const y = new Float64Array(104);
      y[50] = 400;
      const fit = fitArma(y, order);
      expectUsableForecast(fit);
      expect(Number.isFinite(fit.loglik)).toBe(true);
    });
    it(`values of 1e7 ${label}: same fit as the series scaled down`, () => {
      const base = Float64Array.from({ length: 156 }, (_, i) => Math.sin(i / 3) + ((i * 37) % 11) / 5);
      const big = base.map((v) => 1e7 + 1e3 * v);
      const fitBig = fitArma(big, order);
      const fitSmall = fitArma(base, order);
      expectUsableForecast(fitBig);
      expect(fitBig.fallback).toBeNull();
      // Shifting and scaling the data shifts the log-likelihood by −n log(1000) only.
      expect(fitBig.loglik - (fitSmall.loglik - fitSmall.nobs * Math.log(1e3))).toBeCloseTo(0, 4);
    });
    it(`NaN and ±Infinity ${label}: missing weeks, flag 'non-finite-input'`, () => {
      const y = Float64Array.from({ length: 80 }, (_, i) => 20 + ((i * 13) % 7));
      y[10] = Number.NaN;
      y[20] = Number.POSITIVE_INFINITY;
      y[30] = Number.NEGATIVE_INFINITY;
      const fit = fitArma(y, order);
      expect(fit.flags).toContain('non-finite-input');
      expect(fit.fallback).toBeNull();
      expectUsableForecast(fit);
    });
  }
  it('all missing: a fallback with a finite forecast', () => {
    const fit = fitArma(new Float64Array(20).fill(Number.NaN), { p: 1, d: 0, q: 1 });
    expect(fit.flags).toContain('too-short');
    expectUsableForecast(fit);
  });
  it('an order outside p, q ≤ 5, d ≤ 2 is a programming error and throws a RangeError', () => {
    expect(() => fitArma(new Float64Array(50), { p: 6, d: 0, q: 0 })).toThrow(RangeError);
  });
});
