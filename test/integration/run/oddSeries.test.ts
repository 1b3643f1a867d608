/**
 * The real engine over series that must not break a run (COMMON rules: constant, all zeros, ten
 * points, one spike, no history at all, mostly missing): every item ends with a stored result and an
 * order line, none of them aborts the run, and the stored numbers are finite.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { startRun } from '../../../app/run/startRun';
import { insertBatch } from '../../../app/store/batches';
import { demandWriter } from '../../../app/store/demand';
import { createPlaceholderItems } from '../../../app/store/items';
import { getItemRunResult, getOrderLinesBySupplier } from '../../../app/store/runs';
import { nowIso, openStore } from '../../../app/store/store';
import { addWeeks, FIRST_WEEK } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-odd-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const N = 80;
const SERIES: Record<string, (number | null)[]> = {
  CONSTANT: Array(N).fill(12),
  ZEROS: Array(N).fill(0),
  TEN: Array.from({ length: 10 }, (_, k) => 5 + (k % 3)),
  SPIKE: Array.from({ length: N }, (_, k) => (k === 40 ? 5000 : 20 + (k % 5))),
  SPARSE: Array.from({ length: N }, (_, k) => (k % 9 === 0 ? 3 : 0)),
  MISSING: Array.from({ length: N }, (_, k) => (k % 4 === 0 ? 10 + k : null)),
  NOHISTORY: [],
};

it('plans every odd series to a finite result without aborting the run', async () => {
  const store = openStore(join(dir, 'odd.sqlite'), { create: true });
  store.transaction(() => {
    const b = insertBatch(store, {
      kind: 'sales',
      fileName: 'o',
      sha256: 'o',
      rowsRead: 0,
      actor: 't',
      startedAt: nowIso(),
    });
    const ids = createPlaceholderItems(store, Object.keys(SERIES), b);
    const w = demandWriter(store);
    for (const [sku, ys] of Object.entries(SERIES)) {
      // TEN ends with the others (its 10 weeks are the last 10), so every item shares the last week.
      const start = N - ys.length;
      ys.forEach((y, k) => {
        w.upsert(ids.get(sku)!, addWeeks(FIRST_WEEK, start + k), y, false, b);
      });
    }
    w.flush();
  });
  const s = await startRun(store, { workers: 2 }).done;
  expect(s.status).toBe('complete');
  expect(s.planned).toBe(Object.keys(SERIES).length);
  const lines = getOrderLinesBySupplier(store).groups.flatMap((g) => g.lines);
  expect(lines.map((l) => l.sku).sort()).toEqual(Object.keys(SERIES).sort());
  for (const l of lines) {
    for (const v of [
      l.orderQty,
      l.reorderPoint,
      l.orderUpTo,
      l.safetyStock,
      l.intervalForecast,
      l.intervalSd,
    ]) {
      expect(Number.isFinite(v), `${l.sku}: ${JSON.stringify(l)}`).toBe(true);
    }
    expect(l.safetyStock).toBeGreaterThanOrEqual(0);
    expect(l.orderQty).toBeGreaterThanOrEqual(0);
  }
  for (const sku of Object.keys(SERIES)) {
    const r = getItemRunResult(store, sku)!;
    expect(r.status === 'planned' || r.status === 'fallback' || r.status === 'failed').toBe(true);
    for (const f of r.forecast) expect(Number.isFinite(f.mean) && Number.isFinite(f.se)).toBe(true);
  }
  store.close();
});
