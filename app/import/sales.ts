/**
 * Reading a sales file into weekly cells. Weekly buckets (week,sku,qty[,stockout]): one row per item
 * and week, a repeated pair is an error; a week value that is not the week's first day is taken as
 * the week that holds it. Dated lines (date,sku,qty[,order]): summed into the week of their date;
 * within the span of the file a week with no line had no sales and is stored as 0 (the span runs
 * from the file's first week for an item with earlier history, from its first line for a new one,
 * to the file's last week). An active item with earlier history and no line in the file at all
 * also sold nothing in the file's span, and gets zeros there too.
 *
 * Memory grows with distinct item-weeks, not with lines: cells live in typed arrays keyed by a
 * small integer (item index × 65536 + week index).
 */
import { formatIsoDate, weekStartOf } from '../../core/series/calendar';
import type { DemandWriter } from '../store/demand';
import type { RowContext } from './context';
import { parseFlag } from './numbers';

const WEEK_OFFSET = 10000;
/** Numbers Number() reads as the file means them, without the general parser (a '.' is a
 * decimal point only in decimal-point files; in decimal-comma files it separates thousands). */
const PLAIN_DOT = /^-?\d+(\.\d+)?$/;
const PLAIN_INT = /^-?\d+$/;
/** Widest span (in weeks, about 40 years) an item's dense slot array may cover. */
const DENSE_WEEKS = 2100;

export interface SalesWriteStats {
  inserted: number;
  replaced: number;
  changed: number;
  zeroFilled: number;
  /** Known items without any line in a dated file, given zero weeks over its span. */
  silentItems: number;
  changes: string[];
}

export class SalesCollector {
  readonly dated: boolean;
  readonly skuIndex = new Map<string, number>();
  readonly skus: string[] = [];
  private readonly slotOf = new Map<number, number>();
  /** Per item: slots by week offset from denseBase (undefined = none yet, null = uses slotOf). */
  private readonly dense: (Int32Array | null | undefined)[] = [];
  private readonly denseBase: number[] = [];
  private n = 0;
  private keys = new Float64Array(4096);
  private weekDay = new Int32Array(4096);
  private qty = new Float64Array(4096);
  private qtyNull = new Uint8Array(4096);
  private stockout = new Uint8Array(4096);
  private line = new Int32Array(4096);
  private readonly weekSet = new Set<number>();
  minDay = Number.POSITIVE_INFINITY;
  maxDay = Number.NEGATIVE_INFINITY;

  constructor(private readonly ctx: RowContext) {
    this.dated = ctx.has('date');
    this.hasStockout = ctx.has('stockout');
    this.plain = ctx.decimal === '.' ? PLAIN_DOT : PLAIN_INT;
    this.iSku = ctx.mapping.columnOf.get('sku')!;
    this.iDate = ctx.mapping.columnOf.get(this.dated ? 'date' : 'week')!;
    this.iQty = ctx.mapping.columnOf.get('qty')!;
  }

  private readonly plain: RegExp;
  private readonly iSku: number;
  private readonly iDate: number;
  private readonly iQty: number;

  private readonly hasStockout: boolean;

  private grow(): void {
    const size = this.keys.length * 2;
    const g = <T extends Float64Array | Int32Array | Uint8Array>(a: T, make: (n: number) => T): T => {
      const b = make(size);
      b.set(a);
      return b;
    };
    this.keys = g(this.keys, (k) => new Float64Array(k));
    this.weekDay = g(this.weekDay, (k) => new Int32Array(k));
    this.qty = g(this.qty, (k) => new Float64Array(k));
    this.qtyNull = g(this.qtyNull, (k) => new Uint8Array(k));
    this.stockout = g(this.stockout, (k) => new Uint8Array(k));
    this.line = g(this.line, (k) => new Int32Array(k));
  }

  /** Date text → week start × 8 + day offset, for texts already read (lines repeat a few hundred dates). */
  private readonly dayOf = new Map<string, number>();

  row(cells: string[], line: number): void {
    const ctx = this.ctx;
    const r = ctx.report;
    const sku = cells[this.iSku].trim();
    if (sku === '') r.error(line, ctx.header('sku'), null, 'the SKU is empty');
    const dateField = this.dated ? 'date' : 'week';
    const dateText = cells[this.iDate].trim();
    // One lookup gives the week start and the day (ws * 8 + day offset in the week).
    const packed = this.dayOf.get(dateText);
    let day: number | null | undefined;
    let ws = 0;
    if (packed !== undefined) {
      ws = Math.floor(packed / 8);
      day = ws + (packed - ws * 8);
    } else {
      day = ctx.date(cells, dateField, line);
      if (day === null) r.error(line, ctx.header(dateField), null, `the ${dateField} is empty`);
      else if (day !== undefined) {
        ws = weekStartOf(day, ctx.weekStartDay);
        this.dayOf.set(dateText, ws * 8 + (day - ws));
        this.weekSet.add(ws);
      }
    }
    const qtyText = cells[this.iQty].trim();
    let qty: number | null | undefined = this.plain.test(qtyText)
      ? Number(qtyText)
      : ctx.number(cells, 'qty', line);
    if (qty === null && this.dated) {
      r.error(line, ctx.header('qty'), null, 'the quantity is empty');
      qty = undefined;
    }
    let out = false;
    if (this.hasStockout) {
      const text = ctx.cell(cells, 'stockout');
      const f = parseFlag(text);
      if (f === null)
        r.error(line, ctx.header('stockout'), text, 'is not a stockout mark (use 1/0, yes/no or true/false)');
      else out = f;
    }
    if (sku === '' || day === null || day === undefined || qty === undefined) return;
    if (qty !== null && qty < 0) {
      r.warn(
        'negative',
        `line ${line}`,
        (n, ex) => `${n} rows have negative quantities (returns), kept as net demand (${ex})`,
      );
    }
    if (qty === null) {
      r.warn(
        'emptyqty',
        `line ${line}`,
        (n, ex) => `${n} rows have an empty quantity, stored as missing weeks (${ex})`,
      );
    }
    if (!this.dated && ws !== day) {
      r.warn(
        'weekday',
        `${formatIsoDate(day)} → ${formatIsoDate(ws)}`,
        (n, ex) =>
          `${n} week values are not on the week's first day; each was taken as the week that holds it (${ex})`,
      );
    }
    if (day < this.minDay) this.minDay = day;
    if (day > this.maxDay) this.maxDay = day;
    let idx = this.skuIndex.get(sku);
    if (idx === undefined) {
      idx = this.skus.length;
      this.skus.push(sku);
      this.skuIndex.set(sku, idx);
    }
    const wk = Math.floor(ws / 7) + WEEK_OFFSET;
    const key = idx * 65536 + wk;
    const slot = this.slotAt(idx, wk, key);
    if (slot >= 0) {
      if (!this.dated) {
        r.error(
          line,
          ctx.header('week'),
          ctx.cell(cells, 'week'),
          `repeats SKU ${sku}, week ${formatIsoDate(ws)} (first on line ${this.line[slot]}); a weekly file lists each item and week once`,
        );
        return;
      }
      this.qty[slot] += qty ?? 0;
      if (out) this.stockout[slot] = 1;
      return;
    }
    if (this.n === this.keys.length) this.grow();
    const s = this.n++;
    this.setSlot(idx, wk, key, s);
    this.keys[s] = key;
    this.weekDay[s] = ws;
    this.qty[s] = qty ?? 0;
    this.qtyNull[s] = qty === null ? 1 : 0;
    this.stockout[s] = out ? 1 : 0;
    this.line[s] = line;
  }

  /**
   * Slot of an item-week, or -1. Each item keeps a dense array over the weeks it spans (a plain
   * index, much cheaper than a hash map over a million keys); an item spanning more than
   * DENSE_WEEKS weeks falls back to the shared map.
   */
  private slotAt(idx: number, wk: number, key: number): number {
    const arr = this.dense[idx];
    if (arr === undefined) return -1;
    if (arr === null) return this.slotOf.get(key) ?? -1;
    const off = wk - this.denseBase[idx];
    return off >= 0 && off < arr.length ? arr[off] : -1;
  }

  private setSlot(idx: number, wk: number, key: number, slot: number): void {
    let arr = this.dense[idx];
    if (arr === null) {
      this.slotOf.set(key, slot);
      return;
    }
    if (arr === undefined) {
      arr = new Int32Array(64).fill(-1);
      this.dense[idx] = arr;
      this.denseBase[idx] = wk - 8;
    }
    let base = this.denseBase[idx];
    if (wk < base || wk >= base + arr.length) {
      const lo = Math.min(base, wk);
      const hi = Math.max(base + arr.length, wk + 1);
      if (hi - lo > DENSE_WEEKS) {
        // Too wide for a dense array: move this item's slots to the map.
        for (let o = 0; o < arr.length; o++) if (arr[o] >= 0) this.slotOf.set(idx * 65536 + base + o, arr[o]);
        this.dense[idx] = null;
        this.slotOf.set(key, slot);
        return;
      }
      const len = Math.min(DENSE_WEEKS, Math.max(arr.length * 2, hi - lo + 16));
      const newBase = wk < base ? hi - len : lo; // room on the side it grew to
      const grown = new Int32Array(len).fill(-1);
      grown.set(arr, base - newBase);
      arr = grown;
      base = newBase;
      this.dense[idx] = arr;
      this.denseBase[idx] = base;
    }
    arr[wk - base] = slot;
  }

  /** End-of-file remarks (partial edge weeks of dated lines). */
  finish(): void {
    if (!this.dated || this.n === 0) return;
    const wsd = this.ctx.weekStartDay;
    const lastWeek = weekStartOf(this.maxDay, wsd);
    if (this.maxDay !== lastWeek + 6) {
      this.ctx.report.warn(
        'partial-last',
        null,
        () =>
          `the file ends on ${formatIsoDate(this.maxDay)}, before the end of the week of ${formatIsoDate(lastWeek)}; that week holds only part of its sales`,
      );
    }
    const firstWeek = weekStartOf(this.minDay, wsd);
    if (this.minDay !== firstWeek) {
      this.ctx.report.warn(
        'partial-first',
        null,
        () =>
          `the file starts on ${formatIsoDate(this.minDay)}, after the start of the week of ${formatIsoDate(firstWeek)}; that week holds only part of its sales`,
      );
    }
  }

  get rowsCells(): number {
    return this.n;
  }

  /** Weeks the import covers: distinct weeks (buckets), or the whole span first–last week (dated lines). */
  get weekCount(): number {
    if (this.dated && this.n > 0) {
      const w = this.ctx.weekStartDay;
      return (weekStartOf(this.maxDay, w) - weekStartOf(this.minDay, w)) / 7 + 1;
    }
    return this.weekSet.size;
  }

  /**
   * Slots in key order (item index, then week). Each item's dense array already lists its slots
   * in week order, so walking the items in index order gives the order without a sort; only
   * items kept in the shared map are sorted.
   */
  private keyOrder(): Uint32Array {
    const order = new Uint32Array(this.n);
    const keys = this.keys;
    let mapped: Map<number, number[]> | null = null;
    if (this.slotOf.size > 0) {
      mapped = new Map();
      for (const [key, slot] of this.slotOf) {
        const idx = Math.floor(key / 65536);
        let list = mapped.get(idx);
        if (!list) mapped.set(idx, (list = []));
        list.push(slot);
      }
    }
    let at = 0;
    for (let idx = 0; idx < this.skus.length; idx++) {
      const arr = this.dense[idx];
      if (arr) {
        for (let o = 0; o < arr.length; o++) if (arr[o] >= 0) order[at++] = arr[o];
      } else if (arr === null) {
        const list = mapped!.get(idx)!;
        list.sort((a, b) => keys[a] - keys[b]);
        for (const slot of list) order[at++] = slot;
      }
    }
    if (at !== this.n) throw new Error(`sales collector: ${at} slots ordered, ${this.n} held`);
    return order;
  }

  /** Write every cell through the store's demand writer (inside the import's transaction). */
  write(
    ids: Map<string, number>,
    known: Set<string>,
    writer: DemandWriter,
    batchId: number,
    activeKnown: Map<string, number> = new Map(),
  ): SalesWriteStats {
    const order = this.keyOrder();
    const keys = this.keys;
    const isoOf = new Map<number, string>();
    const stats: SalesWriteStats = {
      inserted: 0,
      replaced: 0,
      changed: 0,
      zeroFilled: 0,
      silentItems: 0,
      changes: [],
    };
    const lastWeek = this.dated ? weekStartOf(this.maxDay, this.ctx.weekStartDay) : 0;
    const fileFirstWeek = this.dated ? weekStartOf(this.minDay, this.ctx.weekStartDay) : 0;
    const fileFirstWeekIso = formatIsoDate(fileFirstWeek);
    let i = 0;
    while (i < this.n) {
      const skuIdx = Math.floor(keys[order[i]] / 65536);
      const sku = this.skus[skuIdx];
      const itemId = ids.get(sku)!;
      const existing = known.has(sku) ? writer.existing(itemId) : null;
      // Weeks are put in increasing order, and the stored ones come in week order: one cursor
      // walks them (no map of an item's weeks).
      let cursor = 0;
      const put = (week: number, qty: number | null, out: boolean) => {
        let ws = isoOf.get(week);
        if (ws === undefined) isoOf.set(week, (ws = formatIsoDate(week)));
        let prev = -1;
        if (existing) {
          const weeks = existing.weeks;
          while (cursor < weeks.length && weeks[cursor] < ws) cursor++;
          if (cursor < weeks.length && weeks[cursor] === ws) prev = cursor;
        }
        if (prev >= 0) {
          stats.replaced++;
          const prevQty = existing!.qty[prev];
          const prevOut = existing!.stockout[prev] === 1;
          if (prevQty !== qty || prevOut !== out) {
            stats.changed++;
            if (stats.changes.length < 200) {
              stats.changes.push(
                `${sku} ${ws}: ${prevQty ?? 'empty'}${prevOut ? ' (stockout)' : ''} → ${qty ?? 'empty'}${out ? ' (stockout)' : ''}`,
              );
            }
          }
        } else stats.inserted++;
        writer.upsert(itemId, ws, qty, out, batchId);
      };
      // An item with history before this file had no sales in the file's weeks without lines; an
      // item new to the store starts at its first line.
      let nextWeek = this.weekDay[order[i]];
      if (this.dated && existing) {
        const stored = existing.weeks;
        if (stored.length > 0 && stored[0] < fileFirstWeekIso) nextWeek = fileFirstWeek;
        // Every week from here to the file's last week is written below, so the stored ones are
        // cleared first: plain inserts are about twice as fast as resolving a conflict per row.
        if (stored.length > 0) writer.clearRange(itemId, formatIsoDate(nextWeek), formatIsoDate(lastWeek));
      }
      while (i < this.n && Math.floor(keys[order[i]] / 65536) === skuIdx) {
        const s = order[i];
        if (this.dated) {
          for (let w = nextWeek; w < this.weekDay[s]; w += 7) {
            put(w, 0, false);
            stats.zeroFilled++;
          }
          nextWeek = this.weekDay[s] + 7;
        }
        put(this.weekDay[s], this.qtyNull[s] ? null : this.qty[s], this.stockout[s] === 1);
        i++;
      }
      if (this.dated) {
        for (let w = nextWeek; w <= lastWeek; w += 7) {
          put(w, 0, false);
          stats.zeroFilled++;
        }
      }
    }
    // Known active items with earlier history and no line at all in this file sold nothing in its span.
    if (this.dated && this.n > 0) {
      for (const [sku, itemId] of activeKnown) {
        if (this.skuIndex.has(sku)) continue;
        const stored = writer.existing(itemId).weeks;
        if (stored.length === 0 || stored[0] >= fileFirstWeekIso) continue;
        const existing = new Set(stored);
        let filled = false;
        for (let w = fileFirstWeek; w <= lastWeek; w += 7) {
          const ws = formatIsoDate(w);
          if (existing.has(ws)) continue;
          writer.upsert(itemId, ws, 0, false, batchId);
          stats.inserted++;
          stats.zeroFilled++;
          filled = true;
        }
        if (filled) stats.silentItems++;
      }
    }
    writer.flush();
    return stats;
  }
}
