import gammainc from '@stdlib/math-base-special-gammainc';
import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { chiSquareUpperTail } from '../../../core/diagnose/chiSquare';
import { jarqueBera } from '../../../core/diagnose/jarqueBera';
import { levelShift } from '../../../core/diagnose/levelShift';
import { ljungBox, ljungBoxLags } from '../../../core/diagnose/ljungBox';

// R's datasets::lh (Diggle 1990, luteinizing hormone, 48 samples), shipped with base R.
const LH = [
  2.4, 2.4, 2.4, 2.2, 2.1, 1.5, 2.3, 2.3, 2.5, 2, 1.9, 1.7, 2.2, 1.8, 3.2, 3.2, 2.7, 2.2, 2.2, 1.9, 1.9, 1.8,
  2.7, 3, 2.3, 2, 2, 2.9, 2.9, 2.7, 2.7, 2.3, 2.6, 2.4, 1.8, 1.7, 1.5, 1.4, 2.1, 3.3, 3.5, 3.5, 3.1, 2.6, 2.1,
  3.4, 3, 2.9,
];

describe('chi-square upper tail', () => {
  it('gives 5% and 1% at the published quantiles', () => {
    // χ² quantiles from base R qchisq (agree with standard tables, e.g. Abramowitz & Stegun Table 26.8).
    expect(chiSquareUpperTail(3.8414588, 1)).toBeCloseTo(0.05, 6);
    expect(chiSquareUpperTail(11.0704977, 5)).toBeCloseTo(0.05, 6);
    expect(chiSquareUpperTail(18.3070381, 10)).toBeCloseTo(0.05, 6);
    expect(chiSquareUpperTail(31.4104328, 20)).toBeCloseTo(0.05, 6);
    expect(chiSquareUpperTail(23.209251, 10)).toBeCloseTo(0.01, 6);
  });
  it('does not underflow in the far tail', () => {
    const p = chiSquareUpperTail(400, 10);
    expect(p).toBeGreaterThan(0);
    expect(p).toBeLessThan(1e-70);
    // Q(1/2, 600) ≈ 1.5e-262 and Q(24, 750) ≈ 1e-294: still doubles, not 0.
    expect(chiSquareUpperTail(1200, 1)).toBeGreaterThan(0);
    expect(chiSquareUpperTail(1500, 48)).toBeGreaterThan(0);
  });
  it("agrees with the library's regularised incomplete gamma Q(k/2, x/2) for whole k", () => {
    // The closed forms (even and odd k) against @stdlib's general algorithm, over k = 1…200 and
    // x from 1e-3 to 1.5e3, wherever the tail is a normal double.
    let worst = 0;
    let at = '';
    let compared = 0;
    for (let k = 1; k <= 200; k++) {
      for (let e = -3; e <= 3.18; e += 0.02) {
        const x = 10 ** e;
        const ref = gammainc(x / 2, k / 2, true, true);
        if (!(ref > 1e-290)) continue;
        compared++;
        const rel = Math.abs(chiSquareUpperTail(x, k) - ref) / ref;
        if (rel > worst) {
          worst = rel;
          at = `k = ${k}, x = ${x}`;
        }
      }
    }
    expect(compared).toBeGreaterThan(50_000);
    expect(worst, at).toBeLessThan(1e-11);
    // Non-whole k still goes to the library.
    expect(chiSquareUpperTail(3, 2.5)).toBe(gammainc(1.5, 1.25, true, true));
  });
});

describe('Ljung–Box', () => {
  it('matches base R Box.test(lh, lag = 10, type = "Ljung-Box")', () => {
    // base R 4.x: X-squared = 25.35093036050023, p-value = 0.00471855659526 (df = 10).
    const r = ljungBox(LH, 10, 0);
    expect(r.statistic).toBeCloseTo(25.35093036050023, 9);
    expect(r.pValue).toBeCloseTo(0.00471855659526, 9);
    expect(r.df).toBe(10);
  });
  it('reduces the degrees of freedom by p + q (Ljung & Box 1978)', () => {
    const r = ljungBox(LH, 10, 2);
    expect(r.df).toBe(8);
    expect(r.pValue).toBeCloseTo(chiSquareUpperTail(25.35093036050023, 8), 12);
  });
  it('states its lag rule: min(10, n/5), or min(2m, n/5) with period m', () => {
    expect(ljungBoxLags(156)).toBe(10);
    expect(ljungBoxLags(30)).toBe(6);
    expect(ljungBoxLags(156, 52)).toBe(31);
  });
  it('is near its nominal size on white noise', () => {
    const rng = createRng(11);
    let rejects = 0;
    for (let i = 0; i < 300; i++) {
      const e = new Float64Array(156);
      for (let t = 0; t < 156; t++) e[t] = rng.normal();
      if (ljungBox(e, 10, 0).pValue < 0.05) rejects++;
    }
    expect(rejects / 300).toBeGreaterThan(0.01);
    expect(rejects / 300).toBeLessThan(0.1);
  });
});

describe('Jarque–Bera', () => {
  it('matches the definition by hand on 0, 0, 0, 1', () => {
    // mean 1/4; m2 = 3/16, m3 = 3/32, m4 = 21/256 (moments about the mean over n = 4)
    // S = m3 / m2^1.5 = 1.1547005, K = m4 / m2² = 2.3333333; JB = 4/6 (S² + (K−3)²/4) = 0.9629630.
    const r = jarqueBera([0, 0, 0, 1]);
    expect(r.skewness).toBeCloseTo(1.1547005, 6);
    expect(r.kurtosis).toBeCloseTo(7 / 3, 10);
    expect(r.statistic).toBeCloseTo((4 / 6) * (4 / 3 + 4 / 9 / 4), 10);
    expect(r.pValue).toBeCloseTo(Math.exp(-r.statistic / 2), 14);
  });
  it('rejects heavy tails and not normal draws', () => {
    const rng = createRng(5);
    const normal = new Float64Array(500);
    const heavy = new Float64Array(500);
    for (let i = 0; i < 500; i++) {
      normal[i] = rng.normal();
      heavy[i] = rng.normal() / Math.max(0.05, Math.abs(rng.normal()));
    }
    expect(jarqueBera(normal).pValue).toBeGreaterThan(0.01);
    expect(jarqueBera(heavy).pValue).toBeLessThan(1e-6);
  });
});

describe('level shift', () => {
  it('finds a recent 30% step and gives its size; none on pure noise', () => {
    const n = 104;
    const rng = createRng(9);
    const y = new Float64Array(n);
    const fitted = new Float64Array(n).fill(100);
    const z = new Float64Array(n);
    for (let t = 0; t < n; t++) {
      y[t] = 100 + 5 * rng.normal() + (t >= n - 12 ? 30 : 0);
      z[t] = (y[t] - fitted[t]) / 5;
    }
    const r = levelShift(y, fitted, z, 12);
    expect(r.detected).toBe(true);
    expect(r.relativeGap).toBeGreaterThan(0.25);
    expect(r.relativeGap).toBeLessThan(0.35);
    for (let t = n - 12; t < n; t++) {
      y[t] -= 30;
      z[t] = (y[t] - fitted[t]) / 5;
    }
    expect(levelShift(y, fitted, z, 12).detected).toBe(false);
  });
});
