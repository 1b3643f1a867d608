/**
 * The walk with annual terms screens neighbours by a two-stage fit (ARMA part fitted to the series
 * less the current model's regression). Holding the regression coefficients at any value cannot
 * raise the maximised likelihood (definition of the maximum), so with the same parameter count the
 * screened AICc must be at least the joint fit's AICc: checked here against the engine's joint fit.
 */
import { describe, expect, it } from 'vitest';
import { createRng } from '../../../core/arma/random';
import { chooseModel } from '../../../core/select/chooseModel';
import { fitArma } from '../../../core/select/engine';
import { fourierColumns, weekTimes } from '../../../core/select/fourier';
import { weeklySeries, weeksFrom } from './seriesGenerators';

describe('two-stage screening of seasonal neighbours', () => {
  it('records screened candidates with an AICc no lower than their joint fit (upper bound)', () => {
    const rng = createRng(515);
    let screenedSeen = 0;
    for (let s = 0; s < 4; s++) {
      const n = 156;
      const w = weeksFrom(n);
      const y = weeklySeries(rng, n, true);
      const c = chooseModel(y, w);
      expect(c.seasonalHarmonics).toBeGreaterThan(0);
      const x = fourierColumns(weekTimes(w), 4);
      for (const k of c.selection.candidates) {
        if (k.aiccFrom !== 'two-stage' || k.aicc === null) continue;
        screenedSeen++;
        expect(k.seasonalHarmonics).toBeGreaterThan(0);
        expect(k.passedOver).toContain('screened only');
        const joint = fitArma(y, {
          p: k.order.p,
          d: k.order.d,
          q: k.order.q,
          includeMean: k.includeMean,
          xreg: x.slice(0, 2 * k.seasonalHarmonics),
        });
        // Optimiser tolerance: 1e-3 AICc units (the engine's stopping rule, not the bound, is the limit).
        expect(joint.aicc).toBeLessThanOrEqual(k.aicc + 1e-3);
        // A screened-only candidate never beats the chosen model by the near-tie margin or more.
        expect(k.aicc).toBeGreaterThan(c.fit!.aicc);
      }
    }
    expect(screenedSeen).toBeGreaterThan(0);
  });
});
