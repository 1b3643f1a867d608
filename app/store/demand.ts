/**
 * Weekly demand (table weekly_demand): one row per item and week start, the quantity (NULL when the
 * export left it empty), the stockout mark and the import batch that wrote it. Read back as the
 * contiguous `WeeklyHistory` the engine takes: a week that is missing, or was stocked out (its sales
 * understate demand), is null there.
 */
import type { WeeklyHistory } from '../../core/plan/types';
import { formatIsoDate, parseIsoDate } from '../../core/series/calendar';
import { fillWeeklyGaps, type WeekObservation } from '../../core/series/gaps';
import type { Store } from './store';

export interface DemandRow {
  weekStart: string;
  qty: number | null;
  stockout: boolean;
}

/** A history plus the weeks that were marked stocked out (null in `qty`). */
export type ItemHistory = WeeklyHistory & { stockoutWeeks: string[] };

/** The latest week start in the store, or null when it holds no demand. */
export function lastDemandWeek(store: Store): string | null {
  const r = store.db.prepare('SELECT max(week_start) AS w FROM weekly_demand').get() as { w: string | null };
  return r.w;
}

/** The stored rows of one SKU in week order (no gap filling). */
export function getDemandRows(store: Store, sku: string): DemandRow[] {
  const rows = store.db
    .prepare(
      'SELECT d.week_start, d.qty, d.stockout FROM weekly_demand d JOIN items i ON i.id = d.item_id WHERE i.sku = ? ORDER BY d.week_start',
    )
    .all(sku) as { week_start: string; qty: number | null; stockout: number }[];
  return rows.map((r) => ({ weekStart: r.week_start, qty: r.qty, stockout: r.stockout === 1 }));
}

/**
 * Rows stored under another week start day (the workspace setting changed after they were imported)
 * are laid on the calendar of the item's latest week: each row goes to the week that holds its
 * start, quantities of one week are summed (missing if any part is), stockout marks combined.
 */
function onOneCalendar(rows: DemandRow[]): DemandRow[] {
  if (rows.length < 2) return rows;
  const days = rows.map((r) => parseIsoDate(r.weekStart)!);
  const anchor = days[days.length - 1];
  if (days.every((d) => (anchor - d) % 7 === 0)) return rows;
  const merged = new Map<number, DemandRow>();
  rows.forEach((r, i) => {
    const week = days[i] - ((((days[i] - anchor) % 7) + 7) % 7);
    const prev = merged.get(week);
    if (!prev) merged.set(week, { weekStart: formatIsoDate(week), qty: r.qty, stockout: r.stockout });
    else {
      prev.qty = prev.qty === null || r.qty === null ? null : prev.qty + r.qty;
      prev.stockout ||= r.stockout;
    }
  });
  return [...merged.entries()].sort((a, b) => a[0] - b[0]).map(([, r]) => r);
}

function toHistory(stored: DemandRow[], to: string | null): ItemHistory {
  const rows = onOneCalendar(stored);
  const obs: WeekObservation[] = rows.map((r) => ({
    weekStart: r.weekStart,
    qty: r.qty,
    stockout: r.stockout,
  }));
  // Extend to `to` only along this item's calendar (its last week at or before `to`).
  let span: { to?: string } = {};
  if (to !== null && rows.length > 0 && to > rows[rows.length - 1].weekStart) {
    const last = parseIsoDate(rows[rows.length - 1].weekStart)!;
    const end = parseIsoDate(to);
    if (end !== null) span = { to: formatIsoDate(last + 7 * Math.floor((end - last) / 7)) };
  }
  const h = fillWeeklyGaps(obs, span);
  return { ...h, stockoutWeeks: rows.filter((r) => r.stockout).map((r) => r.weekStart) };
}

/**
 * Weekly history of one SKU from its first stored week to `to` (default: the store's latest week,
 * so an item that stopped selling shows its recent silence as missing weeks). Null for an unknown SKU.
 */
export function getWeeklyHistory(
  store: Store,
  sku: string,
  options: { to?: string | null } = {},
): ItemHistory | null {
  const known = store.db.prepare('SELECT id FROM items WHERE sku = ?').get(sku);
  if (!known) return null;
  return toHistory(getDemandRows(store, sku), options.to === undefined ? lastDemandWeek(store) : options.to);
}

/**
 * Histories of many SKUs in one pass over the table (the planning run's bulk read); every selected
 * item is present, an item with no demand as an empty history.
 */
export function getAllWeeklyHistories(
  store: Store,
  options: { activeOnly?: boolean; skus?: readonly string[]; to?: string | null } = {},
): Map<string, ItemHistory> {
  const to = options.to === undefined ? lastDemandWeek(store) : options.to;
  const wanted = options.skus ? new Set(options.skus) : null;
  const items = store.db
    .prepare(`SELECT id, sku FROM items${options.activeOnly ? ' WHERE active = 1' : ''}`)
    .all() as {
    id: number;
    sku: string;
  }[];
  const skuOf = new Map<number, string>();
  for (const it of items) if (!wanted || wanted.has(it.sku)) skuOf.set(it.id, it.sku);
  const rowsOf = new Map<number, DemandRow[]>();
  for (const id of skuOf.keys()) rowsOf.set(id, []);
  const iter = store.db
    .prepare('SELECT item_id, week_start, qty, stockout FROM weekly_demand ORDER BY item_id, week_start')
    .iterate() as Iterable<{ item_id: number; week_start: string; qty: number | null; stockout: number }>;
  for (const r of iter) {
    const list = rowsOf.get(r.item_id);
    if (list) list.push({ weekStart: r.week_start, qty: r.qty, stockout: r.stockout === 1 });
  }
  const out = new Map<string, ItemHistory>();
  for (const [id, sku] of skuOf) out.set(sku, toHistory(rowsOf.get(id) ?? [], to));
  return out;
}

/**
 * Writing side for the import: read what an item has, then insert or replace its weeks. Rows are
 * sent to SQLite 250 at a time (one multi-row INSERT … ON CONFLICT), which halves the cost of a
 * large import against one statement per row; call `flush()` before the transaction ends.
 */
export interface DemandWriter {
  existing(itemId: number): Map<string, { qty: number | null; stockout: boolean }>;
  upsert(itemId: number, weekStart: string, qty: number | null, stockout: boolean, batchId: number): void;
  /** Delete an item's weeks from `from` to `to` (inclusive week starts), before rewriting all of them. */
  clearRange(itemId: number, from: string, to: string): void;
  flush(): void;
}

const BATCH_ROWS = 250;
const UPSERT_TAIL =
  ' ON CONFLICT (item_id, week_start) DO UPDATE SET qty = excluded.qty, stockout = excluded.stockout, batch_id = excluded.batch_id';

export function demandWriter(store: Store): DemandWriter {
  const select = store.db.prepare('SELECT week_start, qty, stockout FROM weekly_demand WHERE item_id = ?');
  const clear = store.db.prepare(
    'DELETE FROM weekly_demand WHERE item_id = ? AND week_start BETWEEN ? AND ?',
  );
  const insert = (rows: number) =>
    store.db.prepare(
      `INSERT INTO weekly_demand (item_id, week_start, qty, stockout, batch_id) VALUES ${Array(rows).fill('(?, ?, ?, ?, ?)').join(', ')}${UPSERT_TAIL}`,
    );
  const full = insert(BATCH_ROWS);
  const pending: unknown[] = [];
  const flush = () => {
    if (pending.length === 0) return;
    if (pending.length === BATCH_ROWS * 5) full.run(pending);
    else insert(pending.length / 5).run(pending);
    pending.length = 0;
  };
  return {
    existing(itemId) {
      flush();
      const out = new Map<string, { qty: number | null; stockout: boolean }>();
      for (const r of select.iterate(itemId) as Iterable<{
        week_start: string;
        qty: number | null;
        stockout: number;
      }>) {
        out.set(r.week_start, { qty: r.qty, stockout: r.stockout === 1 });
      }
      return out;
    },
    upsert(itemId, weekStart, qty, stockout, batchId) {
      pending.push(itemId, weekStart, qty, stockout ? 1 : 0, batchId);
      if (pending.length === BATCH_ROWS * 5) flush();
    },
    clearRange(itemId, from, to) {
      flush();
      clear.run(itemId, from, to);
    },
    flush,
  };
}

export function countDemandRows(store: Store): number {
  return (store.db.prepare('SELECT count(*) AS n FROM weekly_demand').get() as { n: number }).n;
}
