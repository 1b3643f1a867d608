/**
 * Property-style tests with a seeded generator: random valid exports (delimiters, BOM, CRLF,
 * quoting, decimal commas, thousands separators, header synonyms in random case) round-trip to the
 * same numbers; random corruptions of a data line are either rejected whole (store unchanged, checked
 * by `imp`) or imported with every other row exactly as in the original file.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { getDemandRows } from '../../../app/store/demand';
import { listStoredItems } from '../../../app/store/items';
import type { Store } from '../../../app/store/store';
import { aggregateToWeeks } from '../../../core/series/aggregate';
import { formatIsoDate, parseIsoDate } from '../../../core/series/calendar';
import { imp, newStore, tempDir, writeCsv } from './helpers';

const { dir, cleanup } = tempDir('provision-prop-');
afterAll(cleanup);

/** Small seeded generator for the tests (mulberry32, Ettinger 2017). */
function rng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    int: (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1)),
    pick: <T>(xs: T[]) => xs[Math.floor(next() * xs.length)],
  };
}

type Cell = { qty: number; stockout: boolean };

function storedCells(store: Store): Map<string, Cell | null> {
  const out = new Map<string, Cell | null>();
  for (const it of listStoredItems(store)) {
    for (const r of getDemandRows(store, it.sku))
      out.set(`${it.sku}|${r.weekStart}`, r.qty === null ? null : { qty: r.qty, stockout: r.stockout });
  }
  return out;
}

function formatQty(v: number, decimal: '.' | ',', thousands: boolean): string {
  const [i, f] = Math.abs(v).toFixed(2).split('.');
  const int = thousands ? i.replace(/\B(?=(\d{3})+(?!\d))/g, decimal === '.' ? ',' : '.') : i;
  const frac = f === '00' ? '' : `${decimal}${f.replace(/0$/, '')}`;
  return `${v < 0 ? '-' : ''}${int}${frac}`;
}

function caseOf(r: ReturnType<typeof rng>, s: string): string {
  const k = r.int(0, 2);
  return k === 0
    ? s
    : k === 1
      ? s.toUpperCase()
      : s.replace(/(^|_)([a-z])/g, (_m, p, c) => `${p ? ' ' : ''}${c.toUpperCase()}`);
}

interface Generated {
  text: string;
  /** Physical line (1-based) of each data row, and what the row holds. */
  rows: { line: number; sku: string; week: string; qty: number; stockout: boolean }[];
  delimiter: string;
}

function generateWeekly(r: ReturnType<typeof rng>): Generated {
  const delimiter = r.pick([',', ';', '\t']);
  const decimal: '.' | ',' = delimiter === ';' ? ',' : '.';
  const eol = r.pick(['\n', '\r\n']);
  const quoteAll = r.next() < 0.3;
  const thousands = delimiter !== '\t' && r.next() < 0.5;
  const headers = [
    caseOf(r, r.pick(['week', 'week_start', 'wk'])),
    caseOf(r, r.pick(['sku', 'item_code', 'article'])),
    caseOf(r, r.pick(['qty', 'quantity', 'units'])),
    caseOf(r, r.pick(['stockout', 'out_of_stock'])),
  ];
  const cell = (v: string) =>
    quoteAll || v.includes(delimiter) || v.includes('"') ? `"${v.replace(/"/g, '""')}"` : v;
  const skus = Array.from({ length: r.int(1, 6) }, (_, k) =>
    r.pick([`SKU-${k}`, `Mix${delimiter}${k}`, `"Q"${k}`, `Flour ${k}`]),
  );
  const uniq = [...new Set(skus)];
  const firstMonday = parseIsoDate('2025-01-06')! + 7 * r.int(0, 50);
  const weeks = r.int(1, 6);
  const lines = [headers.map(cell).join(delimiter)];
  const rows: Generated['rows'] = [];
  for (let w = 0; w < weeks; w++) {
    for (const sku of uniq) {
      if (r.next() < 0.2) continue;
      const qty =
        Math.round((r.next() < 0.1 ? -1 : 1) * r.next() * (r.next() < 0.3 ? 500000 : 200) * 100) / 100;
      const stockout = r.next() < 0.15;
      const week = formatIsoDate(firstMonday + 7 * w);
      const pad = r.next() < 0.2 ? ' ' : '';
      lines.push(
        [
          cell(week),
          cell(`${pad}${sku}${pad}`),
          cell(formatQty(qty, decimal, thousands && Math.abs(qty) >= 1000)),
          cell(stockout ? r.pick(['1', 'yes', 'TRUE']) : r.pick(['0', 'no', ''])),
        ].join(delimiter),
      );
      rows.push({ line: lines.length, sku, week, qty, stockout });
    }
  }
  const bom = r.next() < 0.3 ? '\ufeff' : '';
  return { text: `${bom}${lines.join(eol)}${eol}`, rows, delimiter };
}

describe('random valid files round-trip', () => {
  it('weekly buckets: every cell read back as written', async () => {
    const r = rng(4242);
    for (let k = 0; k < 30; k++) {
      const g = generateWeekly(r);
      if (g.rows.length === 0) continue;
      const s = newStore(dir);
      const res = await imp(s, writeCsv(dir, 'rt.csv', g.text), { kind: 'sales' });
      expect(res.status, `${k}: ${JSON.stringify(res.errors)}\n${g.text}`).toBe('imported');
      const stored = storedCells(s);
      expect(stored.size, g.text).toBe(g.rows.length);
      for (const row of g.rows)
        expect(stored.get(`${row.sku.trim()}|${row.week}`), `${k} line ${row.line}`).toEqual({
          qty: row.qty,
          stockout: row.stockout,
        });
      s.close();
    }
  });

  it('dated lines: weekly sums and zero weeks as the calendar says', async () => {
    const r = rng(777);
    for (let k = 0; k < 25; k++) {
      const start = parseIsoDate('2025-03-01')! + r.int(0, 300);
      const lines = ['Order Date;Item No;Qty'];
      const bySku = new Map<string, { day: number; qty: number }[]>();
      let maxDay = -1;
      for (let i = r.int(1, 40); i > 0; i--) {
        const sku = `S${r.int(1, 4)}`;
        const day = start + r.int(0, 40);
        const qty = r.int(-5, 300) / 10;
        lines.push(`${formatIsoDate(day)};${sku};${String(qty).replace('.', ',')}`);
        if (!bySku.has(sku)) bySku.set(sku, []);
        bySku.get(sku)!.push({ day, qty });
        maxDay = Math.max(maxDay, day);
      }
      const s = newStore(dir);
      const res = await imp(s, writeCsv(dir, 'dl.csv', `${lines.join('\n')}\n`), { kind: 'sales' });
      expect(res.status, JSON.stringify(res.errors)).toBe('imported');
      const lastWeek = aggregateToWeeks([{ day: maxDay, qty: 0 }])[0].weekStart;
      for (const [sku, ls] of bySku) {
        const weeks = aggregateToWeeks(ls);
        const expected: [string, number][] = [];
        for (let d = parseIsoDate(weeks[0].weekStart)!; formatIsoDate(d) <= lastWeek; d += 7) {
          const w = weeks.find((x) => x.weekStart === formatIsoDate(d));
          expected.push([formatIsoDate(d), w ? w.qty : 0]);
        }
        const got = getDemandRows(s, sku).map((x) => [x.weekStart, x.qty] as [string, number]);
        expect(got.map((g) => g[0])).toEqual(expected.map((e) => e[0]));
        // sums of tenths: floating-point addition, so close to 1e-9 rather than equal
        for (let i = 0; i < got.length; i++) expect(got[i][1]).toBeCloseTo(expected[i][1], 9);
      }
      s.close();
    }
  });
});

describe('random corruptions', () => {
  it('are rejected whole, or imported with every untouched row exactly as written', async () => {
    const r = rng(99);
    const s = newStore(dir);
    // Existing content, so that "unchanged" is a real check.
    await imp(s, writeCsv(dir, 'base.csv', 'week,sku,qty\n2024-06-03,BASE,5\n2024-06-10,BASE,6\n'), {
      kind: 'sales',
    });
    let rejected = 0;
    let imported = 0;
    for (let k = 0; k < 120; k++) {
      const g = generateWeekly(r);
      if (g.rows.length < 2) continue;
      const physical = g.text.split(/(?<=\n)/);
      const target = g.rows[r.int(0, g.rows.length - 1)];
      const idx = target.line - 1;
      let line = physical[idx];
      const pos = r.int(0, Math.max(0, line.length - 2));
      const junk = r.pick([',', ';', '\t', '"', 'x', '7', '.', ' ', '\n', '-']);
      const kind = r.int(0, 4);
      if (kind === 0) line = line.slice(0, pos) + line.slice(pos + 1);
      else if (kind === 1) line = line.slice(0, pos) + junk + line.slice(pos);
      else if (kind === 2) line = line.slice(0, pos) + junk + line.slice(pos + 1);
      else if (kind === 3) line = line + line; // the row twice
      const text =
        kind === 4
          ? physical.slice(0, idx).join('') + line.slice(0, pos)
          : [...physical.slice(0, idx), line, ...physical.slice(idx + 1)].join('');
      const before = storedCells(s);
      const res = await imp(s, writeCsv(dir, 'bad.csv', text), { kind: 'sales', force: true });
      if (res.status === 'rejected') {
        rejected++;
        continue;
      }
      imported++;
      const after = storedCells(s);
      const untouched =
        kind === 4 ? g.rows.filter((x) => x.line < target.line) : g.rows.filter((x) => x !== target);
      for (const row of untouched) {
        expect(after.get(`${row.sku.trim()}|${row.week}`), `${k}: ${JSON.stringify(text)}`).toEqual({
          qty: row.qty,
          stockout: row.stockout,
        });
      }
      // Nothing beyond the file's rows (and the one damaged row) changed.
      const allowed = new Set(untouched.map((x) => `${x.sku.trim()}|${x.week}`));
      let extra = 0;
      for (const [key, v] of after)
        if (!allowed.has(key) && JSON.stringify(before.get(key)) !== JSON.stringify(v)) extra++;
      expect(extra, `${k}: ${JSON.stringify(text)}`).toBeLessThanOrEqual(kind === 1 && junk === '\n' ? 2 : 1);
    }
    expect(rejected).toBeGreaterThan(20);
    expect(imported).toBeGreaterThan(5);
    s.close();
  });
});
