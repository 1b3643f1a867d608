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

export interface HistoryOptions {
  activeOnly?: boolean;
  skus?: readonly string[];
  /** Extend each history to this week (default: the store's latest week; null: no extension). */
  to?: string | null;
}

/**
 * Histories of many items in one grouped query: SQLite builds each item's week list and quantity
 * array (group_concat, json_group_array), so one row per item crosses into JavaScript instead of
 * one per week, and the items are laid on one shared weekly calendar (anchored at the store's
 * latest week), so all histories share the same week-start strings. The result is the same as
 * `getWeeklyHistory` item by item: an item with a week off that calendar (stored under another
 * week start day) is read through the per-item path instead. Every selected item is present, an
 * item with no demand as an empty history. Keyed by item id.
 */
export function getWeeklyHistoriesById(store: Store, options: HistoryOptions = {}): Map<number, ItemHistory> {
  const to = options.to === undefined ? lastDemandWeek(store) : options.to;
  const wanted = options.skus ? new Set(options.skus) : null;
  const items = store.db
    .prepare(`SELECT id, sku FROM items${options.activeOnly ? ' WHERE active = 1' : ''}`)
    .all() as { id: number; sku: string }[];
  const selected = new Set<number>();
  for (const it of items) if (!wanted || wanted.has(it.sku)) selected.add(it.id);
  const out = new Map<number, ItemHistory>();
  const span = store.db
    .prepare('SELECT min(week_start) AS lo, max(week_start) AS hi FROM weekly_demand')
    .get() as {
    lo: string | null;
    hi: string | null;
  };
  const lo = span.lo === null ? null : parseIsoDate(span.lo);
  const hi = span.hi === null ? null : parseIsoDate(span.hi);
  if (selected.size > 0 && lo !== null && hi !== null) {
    // Shared calendar: every week start on the latest week's weekday from the earliest stored week
    // to the later of the latest stored week and `to`.
    const start = hi - 7 * Math.floor((hi - lo) / 7);
    const toDay = to === null ? null : parseIsoDate(to);
    const endDay = toDay !== null && toDay > hi ? hi + 7 * Math.floor((toDay - hi) / 7) : hi;
    const calendar = new Array<string>((endDay - start) / 7 + 1);
    const index = new Map<string, number>();
    for (let i = 0; i < calendar.length; i++) {
      calendar[i] = formatIsoDate(start + 7 * i);
      index.set(calendar[i], i);
    }
    // The calendar index of the last week at or before `to` (-1: no extension).
    const toIndex = toDay === null || toDay < start ? -1 : Math.floor((Math.min(toDay, endDay) - start) / 7);
    const perItem = store.db.prepare(
      'SELECT week_start, qty, stockout FROM weekly_demand WHERE item_id = ? ORDER BY week_start',
    );
    const grouped = store.db
      .prepare(
        `SELECT item_id, group_concat(week_start), json_group_array(CASE WHEN stockout = 1 THEN NULL ELSE qty END),
                group_concat(stockout, '')
         FROM weekly_demand GROUP BY item_id`,
      )
      .raw()
      .iterate() as Iterable<[number, string, string, string]>;
    for (const [itemId, weeksText, qtyJson, stockouts] of grouped) {
      if (!selected.has(itemId)) continue;
      const weeks = weeksText.split(',');
      const at = new Int32Array(weeks.length);
      let first = calendar.length;
      let last = -1;
      let onCalendar = true;
      for (let k = 0; k < weeks.length; k++) {
        const i = index.get(weeks[k]);
        if (i === undefined) {
          onCalendar = false;
          break;
        }
        at[k] = i;
        if (i < first) first = i;
        if (i > last) last = i;
      }
      if (!onCalendar) {
        const rows = (
          perItem.all(itemId) as { week_start: string; qty: number | null; stockout: number }[]
        ).map((r) => ({ weekStart: r.week_start, qty: r.qty, stockout: r.stockout === 1 }));
        out.set(itemId, toHistory(rows, to));
        continue;
      }
      const values = JSON.parse(qtyJson) as (number | null)[];
      const end = Math.max(last, toIndex);
      const qty = new Array<number | null>(end - first + 1).fill(null);
      const marked: number[] = [];
      for (let k = 0; k < weeks.length; k++) {
        qty[at[k] - first] = values[k];
        if (stockouts.charCodeAt(k) === 49) marked.push(at[k]);
      }
      marked.sort((a, b) => a - b);
      out.set(itemId, {
        weekStart: calendar.slice(first, end + 1),
        qty,
        stockoutWeeks: marked.map((i) => calendar[i]),
      });
    }
  }
  for (const id of selected) if (!out.has(id)) out.set(id, { weekStart: [], qty: [], stockoutWeeks: [] });
  return out;
}

/** `getWeeklyHistoriesById` keyed by SKU. */
export function getAllWeeklyHistories(store: Store, options: HistoryOptions = {}): Map<string, ItemHistory> {
  const byId = getWeeklyHistoriesById(store, options);
  const out = new Map<string, ItemHistory>();
  for (const it of store.db.prepare('SELECT id, sku FROM items').all() as { id: number; sku: string }[]) {
    const h = byId.get(it.id);
    if (h) out.set(it.sku, h);
  }
  return out;
}

/**
 * Writing side for the import: read what an item has, then insert or replace its weeks. Rows are
 * sent to SQLite 250 at a time (one multi-row INSERT … ON CONFLICT), which halves the cost of a
 * large import against one statement per row; call `flush()` before the transaction ends. Rows
 * still pending are flushed before a read or a delete only when they belong to that item (the
 * import writes item after item, so this is rare), and the statement for a short final batch is
 * prepared once per size: a flush per item with a fresh statement each time cost more than the
 * inserts themselves on a re-import.
 */
export interface DemandWriter {
  /** An item's stored weeks, in week order. */
  existing(itemId: number): StoredWeeks;
  upsert(itemId: number, weekStart: string, qty: number | null, stockout: boolean, batchId: number): void;
  /** Delete an item's weeks from `from` to `to` (inclusive week starts), before rewriting all of them. */
  clearRange(itemId: number, from: string, to: string): void;
  flush(): void;
}

/** An item's stored weeks as parallel arrays in week order (stockout: 1 = marked). */
export interface StoredWeeks {
  weeks: string[];
  qty: (number | null)[];
  stockout: Uint8Array;
}

const BATCH_ROWS = 250;
const UPSERT_TAIL =
  ' ON CONFLICT (item_id, week_start) DO UPDATE SET qty = excluded.qty, stockout = excluded.stockout, batch_id = excluded.batch_id';

export function demandWriter(store: Store): DemandWriter {
  // One row per item (SQLite builds the lists), about half the cost of one row per week. The
  // aggregate's order is not guaranteed, so it is checked and the weeks sorted when needed.
  const select = store.db
    .prepare(
      "SELECT group_concat(week_start), json_group_array(qty), group_concat(stockout, '') FROM weekly_demand WHERE item_id = ?",
    )
    .raw();
  const read = (itemId: number): StoredWeeks => {
    const [weeksText, qtyJson, marks] = select.get(itemId) as [string | null, string, string | null];
    if (weeksText === null || marks === null) return { weeks: [], qty: [], stockout: new Uint8Array(0) };
    const weeks = weeksText.split(',');
    const qty = JSON.parse(qtyJson) as (number | null)[];
    const stockout = new Uint8Array(weeks.length);
    let sorted = true;
    for (let k = 0; k < weeks.length; k++) {
      stockout[k] = marks.charCodeAt(k) === 49 ? 1 : 0;
      if (k > 0 && weeks[k - 1] >= weeks[k]) sorted = false;
    }
    if (sorted) return { weeks, qty, stockout };
    const order = weeks
      .map((_, k) => k)
      .sort((a, b) => (weeks[a] < weeks[b] ? -1 : weeks[a] > weeks[b] ? 1 : 0));
    return {
      weeks: order.map((k) => weeks[k]),
      qty: order.map((k) => qty[k]),
      stockout: Uint8Array.from(order, (k) => stockout[k]),
    };
  };
  const clear = store.db.prepare(
    'DELETE FROM weekly_demand WHERE item_id = ? AND week_start BETWEEN ? AND ?',
  );
  const statements = new Map<number, ReturnType<typeof store.db.prepare>>();
  const insert = (rows: number) => {
    let st = statements.get(rows);
    if (!st) {
      st = store.db.prepare(
        `INSERT INTO weekly_demand (item_id, week_start, qty, stockout, batch_id) VALUES ${Array(rows).fill('(?, ?, ?, ?, ?)').join(', ')}${UPSERT_TAIL}`,
      );
      statements.set(rows, st);
    }
    return st;
  };
  const pending: unknown[] = [];
  const pendingItems = new Set<number>();
  const flush = () => {
    if (pending.length === 0) return;
    insert(pending.length / 5).run(pending);
    pending.length = 0;
    pendingItems.clear();
  };
  return {
    existing(itemId) {
      if (pendingItems.has(itemId)) flush();
      return read(itemId);
    },
    upsert(itemId, weekStart, qty, stockout, batchId) {
      pending.push(itemId, weekStart, qty, stockout ? 1 : 0, batchId);
      pendingItems.add(itemId);
      if (pending.length === BATCH_ROWS * 5) flush();
    },
    clearRange(itemId, from, to) {
      if (pendingItems.has(itemId)) flush();
      clear.run(itemId, from, to);
    },
    flush,
  };
}

export function countDemandRows(store: Store): number {
  return (store.db.prepare('SELECT count(*) AS n FROM weekly_demand').get() as { n: number }).n;
}
