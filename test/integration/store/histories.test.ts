/**
 * The bulk history reader (getWeeklyHistoriesById / getAllWeeklyHistories, one grouped query on a
 * shared calendar) gives exactly what the per-item reader getWeeklyHistory gives (the reference
 * here, read row by row and gap-filled by core/series): on a seeded store with gaps, empty cells,
 * stockouts, items starting and stopping at different weeks, an item on another week start day
 * (mixed calendars), an item with no demand and an inactive item, for several `to` choices.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { insertBatch } from '../../../app/store/batches';
import {
  demandWriter,
  getAllWeeklyHistories,
  getWeeklyHistoriesById,
  getWeeklyHistory,
} from '../../../app/store/demand';
import { createPlaceholderItems, upsertItems } from '../../../app/store/items';
import { nowIso, openStore } from '../../../app/store/store';
import { formatIsoDate, parseIsoDate } from '../../../core/series/calendar';

const dir = mkdtempSync(join(tmpdir(), 'provision-bulkhist-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Park–Miller minimal standard generator (Park & Miller 1988), seeded, for a reproducible store. */
function rng(seed: number): () => number {
  let x = seed;
  return () => {
    x = (x * 16807) % 2147483647;
    return x / 2147483647;
  };
}

const MONDAY = parseIsoDate('2024-01-01')!; // 2024-01-01 is a Monday (ISO 8601 calendar)
const week = (k: number, shift = 0) => formatIsoDate(MONDAY + 7 * k + shift);

it('equals the per-item reader on gaps, stockouts, late starts, mixed calendars and inactive items', () => {
  const store = openStore(join(dir, 'bulk.sqlite'), { create: true });
  const rand = rng(20261201);
  const skus = Array.from({ length: 40 }, (_, i) => `S${i}`);
  store.transaction(() => {
    const b = insertBatch(store, {
      kind: 'sales',
      fileName: 'bulk',
      sha256: 'bulk',
      rowsRead: 0,
      actor: 't',
      startedAt: nowIso(),
    });
    const ids = createPlaceholderItems(store, [...skus, 'EMPTY', 'SUNDAY', 'OFF'], b);
    const w = demandWriter(store);
    for (const sku of skus) {
      const start = Math.floor(rand() * 30);
      const stop = start + 1 + Math.floor(rand() * (60 - start));
      for (let k = start; k < stop; k++) {
        const u = rand();
        if (u < 0.1) continue; // a gap
        const qty = u < 0.15 ? null : Math.round(rand() * 1000) / 10 + (u < 0.2 ? 0.1 + 0.2 : 0);
        w.upsert(ids.get(sku)!, week(k), qty, rand() < 0.08, b);
      }
    }
    // Monday weeks, then Sunday weeks after a change of week start day: merged by the per-item path.
    for (let k = 0; k < 5; k++) w.upsert(ids.get('SUNDAY')!, week(k), k + 1, k === 2, b);
    for (let k = 6; k < 9; k++) w.upsert(ids.get('SUNDAY')!, week(k, -1), 10 * k, false, b);
    for (let k = 10; k < 20; k++) w.upsert(ids.get('OFF')!, week(k), 2, false, b);
    w.flush();
    upsertItems(store, [{ sku: 'OFF', active: false }], b);
  });
  const ref = (sku: string, to?: string | null) =>
    getWeeklyHistory(store, sku, to === undefined ? {} : { to });
  const all = [...skus, 'EMPTY', 'SUNDAY', 'OFF'];
  for (const to of [undefined, null, week(40), week(59), week(75), week(70, 3), '2023-06-05']) {
    const bulk = getAllWeeklyHistories(store, to === undefined ? {} : { to });
    expect([...bulk.keys()].sort()).toEqual([...all].sort());
    for (const sku of all) expect(bulk.get(sku), `${sku} to ${to}`).toEqual(ref(sku, to));
  }
  // The run's form: active items only, keyed by id.
  const byId = getWeeklyHistoriesById(store, { activeOnly: true });
  const idOf = new Map(
    (store.db.prepare('SELECT id, sku FROM items').all() as { id: number; sku: string }[]).map((r) => [
      r.sku,
      r.id,
    ]),
  );
  expect(byId.size).toBe(all.length - 1);
  expect(byId.has(idOf.get('OFF')!)).toBe(false);
  for (const sku of all.filter((s) => s !== 'OFF')) expect(byId.get(idOf.get(sku)!)).toEqual(ref(sku));
  // A SKU subset.
  const some = getAllWeeklyHistories(store, { skus: ['S3', 'SUNDAY'] });
  expect([...some.keys()].sort()).toEqual(['S3', 'SUNDAY']);
  expect(some.get('SUNDAY')).toEqual(ref('SUNDAY'));
  // Spelled out: the empty item, and the mixed-calendar item on Sunday weeks ending 2024-02-18.
  expect(byId.get(idOf.get('EMPTY')!)).toEqual({ weekStart: [], qty: [], stockoutWeeks: [] });
  const sunday = byId.get(idOf.get('SUNDAY')!)!;
  expect(sunday.weekStart[0]).toBe('2023-12-31'); // Monday 2024-01-01 lies in the Sunday-week of 12-31
  expect(sunday.qty.slice(0, 5)).toEqual([1, 2, null, 4, 5]); // week 2 stocked out
  store.close();
});
