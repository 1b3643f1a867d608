/**
 * The planning run's bookkeeping, with a TEST-ONLY stand-in per-item function (fixtures/
 * standInPlanTask.ts): reuse by input fingerprint, --force, --items, earlier forecasts handed on
 * for observed weeks, item isolation, cancel, and that a run is all-or-nothing. Expected values
 * follow from the stand-in's definition (forecast = mean of the last 8 observed weeks).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { type RunOptions, startRun } from '../../../app/run/startRun';
import { editOrderQty, setSafetyStock } from '../../../app/store/overrides';
import {
  getItemRunResult,
  getLatestRun,
  getOrderLinesBySupplier,
  getReviewQueue,
  listRuns,
} from '../../../app/store/runs';
import type { Store } from '../../../app/store/store';
import { addWeeks, FIRST_WEEK, makeStore, putWeek } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-run-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const STAND_IN: RunOptions = {
  taskModule: new URL('./fixtures/standInPlanTask.ts', import.meta.url),
  taskExport: 'standInPlan',
  workers: 2,
};

const run = (store: Store, extra: RunOptions = {}) => startRun(store, { ...STAND_IN, ...extra }).done;

const skus = (n: number, prefix = 'SKU') =>
  Array.from({ length: n }, (_, i) => `${prefix}-${String(i).padStart(3, '0')}`);

describe('planning run (stand-in per-item function, tests only)', () => {
  it('plans every active item, then reuses unchanged ones, re-plans changed ones, honours --force and --items', async () => {
    const store = makeStore(join(dir, 'reuse.sqlite'), skus(30), 40);
    const first = await run(store);
    expect(first.status).toBe('complete');
    expect([first.planned, first.reused, first.failed, first.total]).toEqual([30, 0, 0, 30]);
    const latest = getLatestRun(store)!;
    expect(latest.id).toBe(first.runId);
    expect(latest.itemsTotal).toBe(30);
    const r0 = getItemRunResult(store, 'SKU-000')!;
    expect(r0.status).toBe('planned');
    expect(r0.forecast).toHaveLength(26); // DEFAULT_WORKSPACE.horizonWeeks
    expect(r0.candidates).toHaveLength(2);
    expect(r0.model).toMatchObject({ p: 0, d: 0, q: 0 });

    editOrderQty(store, 'SKU-005', first.runId!, 123, { actor: 'test', reason: 'test' });
    const second = await run(store);
    expect([second.planned, second.reused]).toEqual([0, 30]);
    // The planner's edit travels with the reused line.
    const line5 = getOrderLinesBySupplier(store).groups[0].lines.find((l) => l.sku === 'SKU-005')!;
    expect([line5.orderQty, line5.edit?.qty]).toEqual([123, 123]);
    const r0b = getItemRunResult(store, 'SKU-000')!;
    expect(r0b.runId).toBe(second.runId);
    expect(r0b.status).toBe('reused');
    expect(r0b.reusedFromRunId).toBe(first.runId);
    expect(r0b.forecast).toEqual(r0.forecast);
    expect(r0b.order?.orderQty).toBe(r0.order?.orderQty);

    // Change one item's history and another's override: exactly those two are planned again.
    putWeek(store, addWeeks(FIRST_WEEK, 10), new Map([['SKU-003', 999]]));
    setSafetyStock(store, 'SKU-007', 40, { actor: 'test', reason: 'test' });
    const third = await run(store);
    expect([third.planned, third.reused]).toEqual([2, 28]);
    expect(getItemRunResult(store, 'SKU-003')!.status).toBe('planned');
    expect(getItemRunResult(store, 'SKU-007')!.order?.safetyStock).toBe(40);
    // A reused item keeps pointing at the run that computed it.
    expect(getItemRunResult(store, 'SKU-000')!.reusedFromRunId).toBe(first.runId);

    const forced = await run(store, { force: true });
    expect([forced.planned, forced.reused]).toEqual([30, 0]);
    // Planned afresh: a new suggestion, no edit.
    const fresh5 = getOrderLinesBySupplier(store).groups[0].lines.find((l) => l.sku === 'SKU-005')!;
    expect(fresh5.edit).toBeNull();

    const some = await run(store, { items: ['SKU-001', 'SKU-002'], force: true });
    expect([some.planned, some.reused, some.total]).toEqual([2, 28, 30]);
    await expect(run(store, { items: ['NOPE'] })).resolves.toMatchObject({
      status: 'failed',
      error: "--items: no active item with SKU 'NOPE'",
    });
    expect(getLatestRun(store)!.id).toBe(some.runId);
    store.close();
  });

  it('hands the earlier forecasts for now-observed weeks to the engine', async () => {
    const store = makeStore(join(dir, 'past.sqlite'), skus(4), 20);
    const first = await run(store);
    const f1 = getItemRunResult(store, 'SKU-000')!.forecast;
    // Two new weeks arrive: the first run's steps 1 and 2 are now observed.
    const w1 = addWeeks(FIRST_WEEK, 20);
    const w2 = addWeeks(FIRST_WEEK, 21);
    putWeek(store, w1, new Map(skus(4).map((s) => [s, 30])));
    putWeek(store, w2, new Map(skus(4).map((s) => [s, 31])));
    const second = await run(store);
    expect(second.planned).toBe(4);
    const flags = getItemRunResult(store, 'SKU-000')!.flags;
    expect(flags.map((f) => f.reason)).toEqual([`past:${w1}@1=${f1[0].mean},${w2}@2=${f1[1].mean}`]);
    // A third week: week w1 now has forecasts from two runs; the one made closest (run 2 has none
    // for w1, it was observed) stays the first run's step 1; w3 comes from run 2's step 1.
    const w3 = addWeeks(FIRST_WEEK, 22);
    putWeek(store, w3, new Map(skus(4).map((s) => [s, 32])));
    const f2 = getItemRunResult(store, 'SKU-000')!.forecast;
    await run(store);
    const reason = getItemRunResult(store, 'SKU-000')!.flags[0].reason;
    expect(reason).toBe(`past:${w1}@1=${f1[0].mean},${w2}@2=${f1[1].mean},${w3}@1=${f2[0].mean}`);
    expect(first.status).toBe('complete');
    store.close();
  });

  it('isolates items that throw or kill their worker: fallback line and flag, the others planned', async () => {
    const list = [...skus(20), 'BAD-THROW', 'BAD-EXIT', 'BAD-NAN'];
    const store = makeStore(join(dir, 'isolate.sqlite'), list, 30);
    const s = await run(store, { batchSize: 3 });
    expect(s.status).toBe('complete');
    expect([s.planned, s.failed]).toEqual([23, 3]);
    for (const sku of ['BAD-THROW', 'BAD-EXIT', 'BAD-NAN']) {
      const r = getItemRunResult(store, sku)!;
      expect(r.status).toBe('failed');
      expect(r.flags.map((f) => [f.code, f.severity])).toEqual([['plan-failed', 'critical']]);
      expect(r.order?.orderQty).toBe(0);
      expect(r.forecast).toEqual([]);
    }
    expect(getItemRunResult(store, 'BAD-THROW')!.error).toContain('stand-in cannot plan BAD-THROW');
    // A NaN forecast is refused by the store (NOT NULL); only that item pays for it.
    expect(getItemRunResult(store, 'BAD-NAN')!.error).toContain('the store refused its results');
    expect(skus(20).every((k) => getItemRunResult(store, k)!.status === 'planned')).toBe(true);
    const queue = getReviewQueue(store);
    expect(queue.slice(0, 3).map((q) => q.sku)).toEqual(['BAD-EXIT', 'BAD-NAN', 'BAD-THROW']); // critical first, then SKU
    const orders = getOrderLinesBySupplier(store);
    expect(orders.groups).toHaveLength(1);
    expect(orders.groups[0].supplier).toBeNull();
    expect(orders.groups[0].lines).toHaveLength(23);
    // Same inputs next time: the good items are reused, the failed ones tried again.
    const again = await run(store);
    expect([again.planned, again.reused, again.failed]).toEqual([3, 20, 3]);
    store.close();
  });

  it('a cancelled run writes no results and leaves the previous run in place', async () => {
    const store = makeStore(join(dir, 'cancel.sqlite'), skus(80), 30);
    const first = await run(store);
    const before = getOrderLinesBySupplier(store);
    process.env.STANDIN_SPIN_MS = '20';
    try {
      const handle = startRun(store, { ...STAND_IN, force: true, batchSize: 2 }, (p) => {
        if (p.phase === 'planning' && p.done >= 10) handle.cancel();
      });
      const s = await handle.done;
      expect(s.status).toBe('cancelled');
      expect(s.planned).toBe(0);
    } finally {
      delete process.env.STANDIN_SPIN_MS;
    }
    expect(getLatestRun(store)!.id).toBe(first.runId);
    expect(getOrderLinesBySupplier(store)).toEqual(before);
    expect(listRuns(store).map((r) => r.status)).toEqual(['cancelled', 'complete']);
    store.close();
  });
});
