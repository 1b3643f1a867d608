/**
 * Forecast error tracking across runs with the REAL engine: the first run's forecasts, once their
 * weeks are observed, reach the engine in the next run, which computes bias and Trigg's (1964)
 * smoothed tracking signal and flags an item whose demand has run away from its forecasts.
 * The tracking maths itself is tested in core; here: that the run hands the right forecasts on.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { startRun } from '../../../app/run/startRun';
import { getItemRunResult } from '../../../app/store/runs';
import { addWeeks, FIRST_WEEK, makeStore, putWeek } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-track-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

it('flags an item whose demand has run far above the last run’s forecasts', async () => {
  // Two items, 60 weeks of demand between 20 and 30 (makeStore's seeded LCG).
  const store = makeStore(join(dir, 't.sqlite'), ['UP', 'SAME'], 60);
  const first = await startRun(store, { workers: 2 }).done;
  expect(first.status).toBe('complete');
  const f1 = getItemRunResult(store, 'UP')!.forecast;
  // Twelve new weeks: UP jumps to 3× its forecast, SAME lands on its forecast.
  const same1 = getItemRunResult(store, 'SAME')!.forecast;
  for (let k = 0; k < 12; k++) {
    putWeek(
      store,
      addWeeks(FIRST_WEEK, 60 + k),
      new Map([
        ['UP', Math.round(3 * f1[k].mean)],
        ['SAME', Math.round(same1[k].mean)],
      ]),
    );
  }
  const second = await startRun(store, { workers: 2 }).done;
  expect(second.planned).toBe(2);
  const up = getItemRunResult(store, 'UP')!;
  const tracking = (up.diagnostics as { tracking: { count: number; bias: number; trackingSignal: number } })
    .tracking;
  expect(tracking.count).toBe(12); // the twelve observed weeks, each matched with run 1's forecast
  expect(tracking.bias).toBeGreaterThan(0); // actual − forecast > 0: the forecasts ran low
  expect(up.flags.map((f) => f.code)).toContain('forecast-bias');
  const same = getItemRunResult(store, 'SAME')!;
  expect(same.flags.map((f) => f.code)).not.toContain('forecast-bias');
  store.close();
});
