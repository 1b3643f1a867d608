import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { simulateArma } from '../../../core/arma/simulate';
import { diagnoseChoice } from '../../../core/diagnose/diagnoseChoice';
import { makeFlag } from '../../../core/diagnose/flags';
import { chooseModel } from '../../../core/select/chooseModel';
import { weeksFrom } from '../select/seriesGenerators';

describe('diagnoseChoice', () => {
  it('gives a clean record for a well-specified AR(1) and lists the values behind each verdict', () => {
    const n = 156;
    const y = simulateArma({ ar: [0.5], ma: [], sigma2: 1, mean: 100 }, n, 41);
    const w = weeksFrom(n);
    // d fixed at 0: this series happens to be one of KPSS's 5% false rejections (η = 0.870).
    const { diagnostics, flags } = diagnoseChoice(chooseModel(y, w, { seasonal: false, d: 0 }), w);
    expect(diagnostics.ljungBox!.pValue).toBeGreaterThan(0.01);
    // Whatever low order AICc picks here (AR(1) or MA(1)), its roots are well away from the circle.
    for (const m of [...diagnostics.roots.ar, ...diagnostics.roots.ma]) expect(m).toBeGreaterThan(1.05);
    expect(diagnostics.roots.ar.length + diagnostics.roots.ma.length).toBeGreaterThan(0);
    expect(diagnostics.recent!.weeks).toBe(26);
    expect(diagnostics.converged).toBe(true);
    expect(flags.map((f) => f.code)).not.toContain('intervals-too-narrow');
  });

  it('lists an outlying week by date and a recent level shift with its size', () => {
    const n = 156;
    const rng = createRng(5);
    const y = simulateArma({ ar: [0.2], ma: [], sigma2: 1, mean: 100 }, n, rng);
    y[60] += 12;
    for (let t = n - 12; t < n; t++) y[t] += 8;
    const w = weeksFrom(n);
    const { diagnostics, flags } = diagnoseChoice(chooseModel(y, w, { seasonal: false }), w);
    const codes = flags.map((f) => f.code);
    expect(diagnostics.outliers.map((o) => o.week)).toContain(w[60]);
    expect(codes).toContain('outlier-weeks');
    expect(codes).toContain('level-shift');
    const shift = flags.find((f) => f.code === 'level-shift')!;
    expect(shift.reason).toMatch(/last 12 weeks run \d+% above/);
  });

  it('flags intervals too narrow when recent errors are far larger than σ', () => {
    const n = 156;
    const rng = createRng(6);
    const y = simulateArma({ ar: [], ma: [], sigma2: 1, mean: 50 }, n, rng);
    for (let t = n - 26; t < n; t++) y[t] = 50 + 3 * rng.normal();
    const w = weeksFrom(n);
    const { flags } = diagnoseChoice(chooseModel(y, w, { seasonal: false }), w);
    expect(flags.map((f) => f.code)).toContain('intervals-too-narrow');
  });

  it('flags a forecast that goes negative', () => {
    const n = 80;
    const y = Array.from({ length: n }, (_, t) => 100 - 1.5 * t + Math.sin(t));
    const w = weeksFrom(n);
    const { diagnostics, flags } = diagnoseChoice(chooseModel(y, w), w, { horizon: 26 });
    expect(diagnostics.negativeForecast).not.toBeNull();
    expect(flags.map((f) => f.code)).toContain('negative-forecast');
  });

  it('every flag has a code, a reason with its numbers, and an action', () => {
    const f = makeFlag('level-shift', { weeks: 12, gap: 0.3, z: 4.2 });
    expect(f.reason).toBe("The last 12 weeks run 30% above the model's fit (z = 4.2).");
    expect(f.action.length).toBeGreaterThan(10);
  });
});
