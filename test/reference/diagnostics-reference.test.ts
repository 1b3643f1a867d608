/**
 * Residual and stationarity diagnostics against base R and statsmodels 0.13.5
 * (fixture test/reference/fixtures/diagnostics.json, made by test/reference/scripts/regenerate.sh):
 * Ljung–Box Q with df = h − (p + q) (R's Box.test(type = "Ljung-Box", fitdf =) and statsmodels'
 * acorr_ljungbox(model_df =)), the KPSS level statistic (statsmodels' kpss(regression = "c", nlags =),
 * and base R from the 1992 definition), Jarque–Bera (statsmodels' jarque_bera, and base R from the
 * 1980 definition). The two references agree with each other to all stored digits.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { jarqueBera } from '../../core/diagnose/jarqueBera';
import { ljungBox } from '../../core/diagnose/ljungBox';
import { kpss, kpssLags } from '../../core/select/kpss';

interface Stat {
  statistic: number;
  pValue: number;
}
interface LbRow extends Stat {
  lags: number;
  df: number;
}
interface KpssRow {
  statistic: number;
  lags: number;
}
interface DiagCase {
  series: string;
  order: { p: number; d: number; q: number };
  data: number[];
  residuals: number[];
  r: {
    ljungBox: LbRow[];
    kpss: Record<'series' | 'diff1', Record<'l4' | 'l12', KpssRow>>;
    jarqueBera: Stat & { skewness: number; kurtosis: number };
  };
  statsmodels: {
    ljungBox: LbRow[];
    kpss: Record<'series' | 'diff1', Record<'l4' | 'l12', KpssRow & { pValue: number }>>;
    jarqueBera: Stat & { skewness: number; kurtosis: number };
  };
}

const fixture = JSON.parse(readFileSync(new URL('./fixtures/diagnostics.json', import.meta.url), 'utf8')) as {
  cases: DiagCase[];
};

const REL = 1e-9; // the fixture stores 15 significant digits; the statistics are smooth in the data
const P_ABS = 1e-8;

function relClose(a: number, b: number, tol = REL): boolean {
  return Math.abs(a - b) <= tol * Math.max(1e-12, Math.abs(b));
}

function diff(y: number[]): Float64Array {
  const out = new Float64Array(y.length - 1);
  for (let i = 1; i < y.length; i++) out[i - 1] = y[i] - y[i - 1];
  return out;
}

describe('diagnostics against base R and statsmodels (fixtures/diagnostics.json)', () => {
  it('has cases', () => {
    expect(fixture.cases.length).toBeGreaterThanOrEqual(6);
  });

  for (const c of fixture.cases) {
    const label = `${c.series} (${c.order.p},${c.order.d},${c.order.q})`;

    it(`Ljung–Box at lags 10 and 20, df reduced by p + q: ${label}`, () => {
      const fitted = c.order.p + c.order.q;
      for (const [i, h] of [10, 20].entries()) {
        const ours = ljungBox(Float64Array.from(c.residuals), h, fitted);
        const r = c.r.ljungBox[i]; // R: Box.test(res, lag = h, type = "Ljung-Box", fitdf = p + q)
        const sm = c.statsmodels.ljungBox[i]; // statsmodels: acorr_ljungbox(res, lags = [h], model_df = p + q)
        expect(r.lags).toBe(h);
        expect(ours.df).toBe(r.df);
        expect(relClose(ours.statistic, r.statistic)).toBe(true);
        expect(relClose(ours.statistic, sm.statistic)).toBe(true);
        expect(Math.abs(ours.pValue - r.pValue)).toBeLessThan(P_ABS);
        expect(Math.abs(ours.pValue - sm.pValue)).toBeLessThan(P_ABS);
      }
    });

    it(`KPSS level statistic, l4 and l12 lag rules, series and first difference: ${label}`, () => {
      for (const [which, x] of [
        ['series', Float64Array.from(c.data)],
        ['diff1', diff(c.data)],
      ] as const) {
        // the l4 rule ⌊4 (n/100)^¼⌋ (Kwiatkowski et al. 1992) is the engine's default
        expect(kpssLags(x.length)).toBe(c.statsmodels.kpss[which].l4.lags);
        for (const rule of ['l4', 'l12'] as const) {
          const sm = c.statsmodels.kpss[which][rule]; // statsmodels: kpss(x, regression = "c", nlags = lags)
          const r = c.r.kpss[which][rule]; // base R from the definition
          const ours = kpss(x, sm.lags);
          expect(ours.lags).toBe(sm.lags);
          expect(relClose(ours.statistic, sm.statistic)).toBe(true);
          expect(relClose(ours.statistic, r.statistic)).toBe(true);
          // 5% critical value 0.463 (Kwiatkowski et al. 1992, Table 1)
          expect(ours.rejects).toBe(sm.statistic > 0.463);
        }
      }
    });

    it(`Jarque–Bera on the residuals: ${label}`, () => {
      const ours = jarqueBera(Float64Array.from(c.residuals));
      const sm = c.statsmodels.jarqueBera; // statsmodels.stats.stattools.jarque_bera
      const r = c.r.jarqueBera; // base R from the definition, pchisq(JB, 2, lower.tail = FALSE)
      expect(relClose(ours.statistic, sm.statistic)).toBe(true);
      expect(relClose(ours.statistic, r.statistic)).toBe(true);
      expect(relClose(ours.skewness, sm.skewness, 1e-8)).toBe(true);
      expect(relClose(ours.kurtosis, sm.kurtosis)).toBe(true);
      expect(Math.abs(ours.pValue - sm.pValue)).toBeLessThan(P_ABS);
    });
  }
});
