/**
 * TSB (Teunter, Syntetos & Babai 2011) and the choice between it and SBA by one-step error.
 */
import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { fitSba } from '../../../core/intermittent/sba';
import { fitSparseDemand } from '../../../core/intermittent/sparseMethod';
import { runTsb } from '../../../core/intermittent/tsb';
import { chooseModel } from '../../../core/select/chooseModel';
import { forecastChoice, leadTimeMomentsChoice } from '../../../core/select/forecastChoice';
import { weeksFrom } from '../select/seriesGenerators';

describe('TSB', () => {
  it('follows the recursions of Teunter, Syntetos & Babai (2011)', () => {
    // y = 0 0 3 0 5, α = 0.1, β = 0.2 (hand computation from the paper's recursions):
    // start at the first demand (week 3): z = 3, p = 1/3;
    // week 4, no demand: p = (1 − 0.2)/3 = 0.26667; week 5, demand 5: p = 0.26667 + 0.2(1 − 0.26667)
    // = 0.41333, z = 3 + 0.1(5 − 3) = 3.2; forecast p·z = 1.32267.
    const s = runTsb([0, 0, 3, 0, 5], 0.1, 0.2);
    expect(s.method).toBe('tsb');
    expect(s.size).toBeCloseTo(3.2, 12);
    expect(1 / s.interval).toBeCloseTo(0.8 / 3 + 0.2 * (1 - 0.8 / 3), 12);
    expect(s.forecast).toBeCloseTo((0.8 / 3 + 0.2 * (1 - 0.8 / 3)) * 3.2, 12);
    // The in-sample forecast before each week: none until the first demand, then p·z.
    expect(Number.isNaN(s.fitted[2])).toBe(true);
    expect(s.fitted[3]).toBeCloseTo(1, 12);
    expect(s.fitted[4]).toBeCloseTo((0.8 / 3) * 3, 12);
  });

  it('falls during a run of zero weeks where SBA stays flat (the obsolescence case of the paper)', () => {
    const y = [0, 4, 0, 4, 0, 4, 0, 4, 0, 4, ...new Array(30).fill(0)];
    const tsb = runTsb(y, 0.1, 0.1);
    expect(tsb.forecast).toBeLessThan(0.1 * tsb.fitted[10]);
    // SBA updates only in weeks with demand: its forecast after the last demand does not move.
    expect(fitSba(y).fitted[39]).toBeCloseTo(fitSba(y).fitted[11], 12);
  });

  it('is chosen over SBA by one-step error when demand stops, SBA kept on steady sparse demand', () => {
    const rng = createRng(8);
    const steady = Array.from({ length: 200 }, () =>
      rng.uniform() < 0.3 ? 2 + Math.floor(4 * rng.uniform()) : 0,
    );
    const steadyFit = fitSparseDemand(steady);
    expect(steadyFit.chosen.errorVariance).toBe(
      Math.min(steadyFit.sba.errorVariance, steadyFit.tsb.errorVariance),
    );
    const stopping = [...steady.slice(0, 120), ...new Array(80).fill(0)];
    const s = fitSparseDemand(stopping);
    expect(s.tsb.errorVariance).toBeLessThan(s.sba.errorVariance);
    expect(s.chosen.method).toBe('tsb');
    // Through the automatic choice: a finite flat forecast from the chosen method, finite lead-time sums.
    const c = chooseModel(stopping, weeksFrom(200));
    expect(c.kind).toBe('intermittent');
    expect(c.intermittent?.method).toBe('tsb');
    expect(c.selection.reason).toContain('TSB with α');
    const f = forecastChoice(c, 6);
    for (let h = 0; h < 6; h++) {
      expect(f.mean[h]).toBeCloseTo(c.intermittent!.forecast, 12);
      expect(f.se[h]).toBeGreaterThan(0);
    }
    expect(Number.isFinite(leadTimeMomentsChoice(c, 1, 4).variance)).toBe(true);
  });

  it('never returns a zero or NaN variance', () => {
    for (const y of [
      [0, 0, 0, 0],
      [0, 0, 7],
      [0, 3, 0, 3, 0, 3],
      [Number.NaN, 0, 2],
    ]) {
      const s = fitSparseDemand(y).tsb;
      expect(s.errorVariance).toBeGreaterThan(0);
      expect(Number.isFinite(s.forecast)).toBe(true);
    }
  });
});
