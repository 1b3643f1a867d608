import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { ADI_CUTOFF, CV2_CUTOFF, classifyDemand } from '../../../core/intermittent/demandClass';
import { fitSba, runSba, sbaWindowVariance } from '../../../core/intermittent/sba';

describe('ADI / CV² classification', () => {
  it('uses the cut-offs of Syntetos, Boylan & Croston (2005): ADI 1.32, CV² 0.49', () => {
    expect(ADI_CUTOFF).toBe(1.32);
    expect(CV2_CUTOFF).toBe(0.49);
  });
  it('puts each quadrant in its class (definitions)', () => {
    // ADI = 1, CV² = 0: smooth.
    expect(classifyDemand([5, 5, 5, 5]).demandClass).toBe('smooth');
    // ADI = 1, sizes 1 and 9: mean 5, variance 16, CV² = 0.64: erratic.
    expect(classifyDemand([1, 9, 1, 9]).demandClass).toBe('erratic');
    // ADI = 2, sizes all 4: intermittent.
    const i = classifyDemand([0, 4, 0, 4, 0, 4]);
    expect(i.adi).toBe(2);
    expect(i.demandClass).toBe('intermittent');
    // ADI = 2, sizes 1 and 9: lumpy.
    expect(classifyDemand([0, 1, 0, 9]).demandClass).toBe('lumpy');
  });
  it('skips missing weeks', () => {
    expect(classifyDemand([0, 4, Number.NaN, 0, 4]).adi).toBe(2);
  });
});

describe('SBA', () => {
  it('follows the recursions of Croston (1972) with the (1 − α/2) correction (Syntetos & Boylan 2005)', () => {
    // y = 0 0 3 0 5, α = 0.1: first demand 3 after 3 weeks → z = 3, p = 3;
    // next demand 5 after 2 weeks → z = 3 + 0.1·2 = 3.2, p = 3 + 0.1·(2 − 3) = 2.9.
    const s = runSba([0, 0, 3, 0, 5], 0.1);
    expect(s.size).toBeCloseTo(3.2, 12);
    expect(s.interval).toBeCloseTo(2.9, 12);
    expect(s.forecast).toBeCloseTo((0.95 * 3.2) / 2.9, 12);
  });
  it('is close to unbiased for Bernoulli–constant demand and its variance comes from its errors', () => {
    const rng = createRng(21);
    const y = new Float64Array(300);
    for (let t = 0; t < 300; t++) y[t] = rng.uniform() < 0.25 ? 8 : 0;
    const s = fitSba(y);
    expect(s.forecast).toBeGreaterThan(1.4);
    expect(s.forecast).toBeLessThan(2.6);
    // The true per-week variance is 64·0.25·0.75 = 12 (Bernoulli definition).
    expect(s.errorVariance).toBeGreaterThan(9);
    expect(s.errorVariance).toBeLessThan(16);
    const v4 = sbaWindowVariance(s, 1, 4);
    expect(v4).toBeGreaterThanOrEqual(4 * s.errorVariance);
    expect(Number.isFinite(v4)).toBe(true);
  });
  it('never returns a zero or NaN variance', () => {
    for (const y of [
      [0, 0, 0, 0],
      [0, 0, 7],
      [0, 3, 0, 3, 0, 3],
    ]) {
      const s = fitSba(y);
      expect(s.errorVariance).toBeGreaterThan(0);
      expect(Number.isFinite(s.forecast)).toBe(true);
    }
  });
});
