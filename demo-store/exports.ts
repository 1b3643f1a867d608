/**
 * The scenario written as the exports a planner would get from the wholesaler's systems:
 *  - items.csv: the item master (comma-separated; some cells blank = workspace default);
 *  - sales-history.csv: weekly buckets for all but the last four weeks (comma-separated, stockout column);
 *  - sales-recent.csv: the last four weeks as dated order lines from the order system, with semicolons,
 *    decimal commas and day.month.year dates, one return among them;
 *  - stock.tsv: inventory positions at the end of the last week (tab-separated).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { civilDate, formatIsoDate, parseIsoDate } from '../core/series/calendar';
import { DemoRandom } from './rng';
import type { DemoScenario } from './scenario';

export const RECENT_WEEKS = 4;

export interface DemoFiles {
  items: string;
  salesHistory: string;
  salesRecent: string;
  stock: string;
}

function csvCell(v: string, delimiter: string): string {
  return v.includes(delimiter) || v.includes('"') || v.includes('\n') ? `"${v.replace(/"/g, '""')}"` : v;
}

const dmy = (day: number) => {
  const { year, month, day: d } = civilDate(day);
  return `${String(d).padStart(2, '0')}.${String(month).padStart(2, '0')}.${year}`;
};

export function writeDemoExports(s: DemoScenario, dir: string, seed: number): DemoFiles {
  mkdirSync(dir, { recursive: true });
  const rng = new DemoRandom(seed ^ 0x5eed);
  const files: DemoFiles = {
    items: join(dir, 'items.csv'),
    salesHistory: join(dir, 'sales-history.csv'),
    salesRecent: join(dir, 'sales-recent.csv'),
    stock: join(dir, 'stock.tsv'),
  };

  const itemLines = [
    'SKU,Description,Supplier,Unit,Case Pack,MOQ,Lead Time (weeks),Lead Time SD Weeks,Review Period Weeks,Service Level,Service Kind,Unit Cost,Holding Rate,Order Cost,Shelf Life Weeks,Active',
  ];
  for (const it of s.items) {
    if (it.missingFromMaster) continue;
    const cells = [
      it.sku,
      it.description,
      it.supplier,
      it.unit,
      String(it.casePack),
      it.moq === null ? '' : String(it.moq),
      String(it.leadTimeWeeks),
      String(it.leadTimeSdWeeks),
      it.reviewPeriodWeeks === null ? '' : String(it.reviewPeriodWeeks),
      it.serviceLevel,
      it.serviceKind,
      it.unitCost.toFixed(2),
      String(it.holdingRate),
      String(it.orderCost),
      it.shelfLifeWeeks === null ? '' : String(it.shelfLifeWeeks),
      it.active ? 'yes' : 'no',
    ];
    itemLines.push(cells.map((c) => csvCell(c, ',')).join(','));
  }
  writeFileSync(files.items, `${itemLines.join('\r\n')}\r\n`);

  const n = s.weeks.length;
  const hist = ['week,sku,qty,stockout'];
  for (let t = 0; t < n - RECENT_WEEKS; t++) {
    for (const it of s.items) {
      const q = it.qty[t];
      if (q === null) continue;
      hist.push(`${s.weeks[t]},${it.sku},${q},${it.stockout[t] ? 1 : 0}`);
    }
  }
  writeFileSync(files.salesHistory, `${hist.join('\n')}\n`);

  // Dated order lines: each week's quantity split over the days of the week, in tenths so the
  // parts add up exactly; one credit note (a negative line) offset by a larger order that week.
  const recent = ['Order Date;Order No;Item No;Quantity'];
  let orderNo = 480000;
  let returned = false;
  const lines: { day: number; sku: string; tenths: number }[] = [];
  for (let t = n - RECENT_WEEKS; t < n; t++) {
    const monday = parseIsoDate(s.weeks[t])!;
    for (const it of s.items) {
      const q = it.qty[t];
      if (q === null || q === 0) continue;
      let left = Math.round(q * 10);
      const parts = Math.min(1 + rng.int(0, 4), it.fractional ? 5 : Math.max(1, Math.round(q)));
      for (let k = 0; k < parts; k++) {
        const share =
          k === parts - 1
            ? left
            : it.fractional
              ? rng.int(1, Math.max(1, left - (parts - k - 1)))
              : 10 * rng.int(1, Math.max(1, Math.floor(left / 10) - (parts - k - 1)));
        lines.push({ day: monday + rng.int(0, 6), sku: it.sku, tenths: share });
        left -= share;
        if (left <= 0) break;
      }
      if (!returned && !it.fractional && q >= 5 && t === n - 2) {
        returned = true;
        lines.push({ day: monday + 2, sku: it.sku, tenths: -20 });
        lines.push({ day: monday + 3, sku: it.sku, tenths: 20 });
      }
    }
  }
  lines.sort((a, b) => a.day - b.day || (a.sku < b.sku ? -1 : a.sku > b.sku ? 1 : 0));
  for (const l of lines) {
    const v = (l.tenths / 10).toFixed(l.tenths % 10 === 0 ? 0 : 1).replace('.', ',');
    recent.push(`${dmy(l.day)};SO-${orderNo++};${l.sku};${v}`);
  }
  writeFileSync(files.salesRecent, `\ufeff${recent.join('\r\n')}\r\n`);

  const asOf = formatIsoDate(parseIsoDate(s.weeks[n - 1])! + 6);
  const stock = ['sku\ton_hand\ton_order\tbackorders\tas_of'];
  for (const it of s.items) {
    if (it.missingFromMaster) continue;
    stock.push(
      `${it.sku}\t${it.position.onHand}\t${it.position.onOrder}\t${it.position.backorders}\t${asOf}`,
    );
  }
  writeFileSync(files.stock, `${stock.join('\n')}\n`);
  return files;
}
