import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { simulateArma } from '../../../core/arma/simulate';
import { chooseDifferencing, KPSS_CRITICAL_LEVEL, kpss, kpssLags } from '../../../core/select/kpss';

describe('KPSS level-stationarity test', () => {
  it('critical values are those of Kwiatkowski et al. (1992), Table 1, η_μ', () => {
    // Kwiatkowski, Phillips, Schmidt & Shin (1992), Table 1: 10% 0.347, 5% 0.463, 2.5% 0.574, 1% 0.739.
    expect(KPSS_CRITICAL_LEVEL).toEqual({ p10: 0.347, p05: 0.463, p025: 0.574, p01: 0.739 });
  });

  it('lag rule l4 = ⌊4 (n/100)^{1/4}⌋ (Kwiatkowski et al. 1992, §5)', () => {
    expect(kpssLags(100)).toBe(4);
    expect(kpssLags(156)).toBe(4); // 4·1.1176 = 4.47
    expect(kpssLags(500)).toBe(5); // 4·1.4953 = 5.98
  });

  it('matches the definition computed by hand on a 4-point series with l = 1', () => {
    // y = 1, 3, 2, 6: mean 3, e = −2, 0, −1, 3; S = −2, −2, −3, 0; Σ S² = 17.
    // s²(1) = (4 + 0 + 1 + 9)/4 + (2/4)(1 − 1/2)(0·(−2) + (−1)·0 + 3·(−1)) = 3.5 − 0.75 = 2.75.
    // η = 17 / 16 / 2.75 (textbook definition of the statistic).
    const r = kpss([1, 3, 2, 6], 1);
    expect(r.statistic).toBeCloseTo(17 / 16 / 2.75, 12);
  });

  it('rejects for a random walk and not for white noise, most of the time (size and power)', () => {
    const rng = createRng(7);
    let wnRejects = 0;
    let rwRejects = 0;
    for (let i = 0; i < 200; i++) {
      const wn = simulateArma({ ar: [], ma: [], sigma2: 1 }, 156, rng);
      const rw = simulateArma({ ar: [], ma: [], sigma2: 1, d: 1 }, 156, rng);
      if (kpss(wn).rejects) wnRejects++;
      if (kpss(rw).rejects) rwRejects++;
    }
    // At the 5% level the size on white noise should be near 5% (the test is a little conservative
    // in small samples with the l4 lag); power on a 156-week random walk is high.
    expect(wnRejects / 200).toBeLessThan(0.1);
    expect(rwRejects / 200).toBeGreaterThan(0.8);
  });

  it('mostly chooses d = 0, 1, 2 for white noise, a random walk and a doubly integrated walk', () => {
    const rng = createRng(3);
    const hits = [0, 0, 0];
    for (let i = 0; i < 50; i++) {
      for (let d = 0; d <= 2; d++) {
        if (chooseDifferencing(simulateArma({ ar: [], ma: [], sigma2: 1, d }, 200, rng)).d === d) hits[d]++;
      }
    }
    // Nominal size 5% at d = 0; the power thresholds are our own loose expectations at n = 200.
    expect(hits[0] / 50).toBeGreaterThan(0.85);
    expect(hits[1] / 50).toBeGreaterThan(0.7);
    expect(hits[2] / 50).toBeGreaterThan(0.7);
  });

  it('skips missing weeks and calls a constant series stationary', () => {
    expect(kpss([5, 5, 5, 5, 5, 5]).rejects).toBe(false);
    const withGap = Float64Array.from([1, 3, Number.NaN, 2, 6]);
    expect(kpss(withGap, 1).statistic).toBeCloseTo(17 / 16 / 2.75, 12);
  });
});
