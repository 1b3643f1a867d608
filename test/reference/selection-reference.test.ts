/**
 * Acceptance check 1 of the selection issue: on 200 simulated stationary ARMA series with known
 * orders (1,0,0)…(2,0,2), our automatic choice with d fixed at 0 finds the true (p, q) at least as
 * often as base R's exhaustive AICc grid over p, q ≤ 3 (stats::arima, method "ML", fits that warned
 * or have a root modulus ≤ 1.01 excluded), read from test/reference/fixtures/selection-grid.json
 * (made by test/reference/scripts/r-selection-grid.R). The full 200 run in `npm run bench -- select`;
 * here every third series (67; the true orders cycle with period 8, so every order is represented) keeps the test fast, with the full set when SELECTION_FULL=1.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { chooseModel } from '../../core/select/chooseModel';

interface FixtureSeries {
  name: string;
  data: number[];
  trueOrder: { p: number; d: number; q: number };
  rChoiceCorrect: boolean;
}

const fixture = JSON.parse(
  readFileSync(join(import.meta.dirname, 'fixtures', 'selection-grid.json'), 'utf8'),
) as { series: FixtureSeries[]; summary: { rCorrect: number } };

const weeks = (n: number): string[] =>
  Array.from({ length: n }, (_, i) =>
    new Date(Date.UTC(2020, 0, 6) + i * 7 * 86_400_000).toISOString().slice(0, 10),
  );

describe('order selection against base R’s exhaustive AICc grid', () => {
  it('finds the true order at least as often as R on the same series', () => {
    const stride = process.env.SELECTION_FULL === '1' ? 1 : 3;
    let ours = 0;
    let r = 0;
    let count = 0;
    for (let i = 0; i < fixture.series.length; i += stride) {
      const s = fixture.series[i];
      const c = chooseModel(s.data, weeks(s.data.length), { d: 0, seasonal: false });
      expect(c.kind).toBe('arma');
      if (c.order.p === s.trueOrder.p && c.order.q === s.trueOrder.q) ours++;
      if (s.rChoiceCorrect) r++;
      count++;
    }
    // The fixture's own summary: base R right on 102 of 200 (51%).
    if (stride === 1) expect(r).toBe(fixture.summary.rCorrect);
    console.log(`selection reference: ours ${ours}/${count}, base R grid ${r}/${count}`);
    // On all 200 (SELECTION_FULL=1, and the benchmark) the rule holds as stated: ours ≥ R.
    // On the 67-series subset the two counts are close (37 vs 36 when written), so a margin of two
    // series keeps the fast test from flipping on a one-series change in the engine's optimum.
    expect(ours).toBeGreaterThanOrEqual(stride === 1 ? r : r - 2);
  });
});
