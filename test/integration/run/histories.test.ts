/**
 * The run's bulk history read (getWeeklyHistoriesById, active items, to the last week) gives
 * exactly what the store's per-item reader (getWeeklyHistory, the reference here) gives: gaps and stocked-out weeks null, each item
 * from its first stored week to the store's last week, inactive items left out.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { compactHistory, expandHistory } from '../../../app/run/compactHistory';
import { insertBatch } from '../../../app/store/batches';
import {
  demandWriter,
  getWeeklyHistoriesById,
  getWeeklyHistory,
  lastDemandWeek,
} from '../../../app/store/demand';
import { createPlaceholderItems, upsertItems } from '../../../app/store/items';
import { nowIso, openStore } from '../../../app/store/store';
import { addWeeks, FIRST_WEEK } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-hist-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

it('matches the store reader on gaps, stockouts, late starts, empty and inactive items', () => {
  const store = openStore(join(dir, 'h.sqlite'), { create: true });
  store.transaction(() => {
    const b = insertBatch(store, {
      kind: 'sales',
      fileName: 'h',
      sha256: 'h',
      rowsRead: 0,
      actor: 't',
      startedAt: nowIso(),
    });
    const ids = createPlaceholderItems(store, ['A', 'B', 'C', 'D'], b);
    const w = demandWriter(store);
    for (let k = 0; k < 10; k++)
      if (k !== 4) w.upsert(ids.get('A')!, addWeeks(FIRST_WEEK, k), k + 1, false, b);
    for (let k = 3; k < 13; k++)
      w.upsert(ids.get('B')!, addWeeks(FIRST_WEEK, k), k === 7 ? null : 10 * k, k === 5, b);
    for (let k = 0; k < 13; k++) w.upsert(ids.get('D')!, addWeeks(FIRST_WEEK, k), 1, false, b);
    w.flush();
    upsertItems(store, [{ sku: 'D', active: false }], b);
  });
  const through = lastDemandWeek(store);
  const ours = getWeeklyHistoriesById(store, { activeOnly: true, to: through });
  const idOf = new Map(
    ['A', 'B', 'C'].map((sku) => [
      sku,
      store.db.prepare('SELECT id FROM items WHERE sku = ?').pluck().get(sku) as number,
    ]),
  );
  expect(ours.size).toBe(3);
  for (const [sku, id] of idOf) {
    expect(ours.get(id)).toEqual(getWeeklyHistory(store, sku, { to: through }));
  }
  // Spelled out for A: weeks 0…12, week 4 missing, 10…12 after its last sale.
  expect(ours.get(idOf.get('A')!)!.qty).toEqual([1, 2, 3, 4, null, 6, 7, 8, 9, 10, null, null, null]);
  // B: starts at week 3; week 5 stocked out and week 7 empty are both null.
  expect(ours.get(idOf.get('B')!)!.qty).toEqual([30, 40, null, 60, null, 80, 90, 100, 110, 120]);
  expect(ours.get(idOf.get('B')!)!.stockoutWeeks).toEqual([addWeeks(FIRST_WEEK, 5)]);
  expect(ours.get(idOf.get('C')!)).toEqual({ weekStart: [], qty: [], stockoutWeeks: [] });
  // What travels to a worker (first week + quantities) spells out to the same history.
  for (const h of ours.values()) {
    expect(expandHistory(compactHistory(h))).toEqual({ weekStart: h.weekStart, qty: h.qty });
  }
  store.close();
});
