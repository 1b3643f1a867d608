import { afterAll, describe, expect, it } from 'vitest';
import { previewImport } from '../../../app/import/import';
import { listAudit } from '../../../app/store/audit';
import { listBatches } from '../../../app/store/batches';
import { getDemandRows, getWeeklyHistory } from '../../../app/store/demand';
import { dumpStore } from '../../../app/store/dump';
import { getItemSettings, getStoredItem } from '../../../app/store/items';
import { putWorkspaceSettings } from '../../../app/store/settings';
import { getPosition } from '../../../app/store/stock';
import { imp, newStore, tempDir, writeCsv } from './helpers';

const { dir, cleanup } = tempDir('provision-import-');
afterAll(cleanup);

const rows = (store: ReturnType<typeof newStore>, sku: string) =>
  getDemandRows(store, sku).map((r) => [r.weekStart, r.qty, r.stockout]);

describe('messy sales exports', () => {
  it('reads semicolons, a BOM, decimal commas, thousands separators, quotes and padded headers', async () => {
    const s = newStore(dir);
    const f = writeCsv(
      dir,
      'semi.csv',
      '\ufeff Week Start ; ITEM CODE;Quantity ;Out of Stock\r\n' +
        '2026-11-02;FLR-101;1.234,5;no\r\n' +
        '2026-11-02;"SUG;7";" 12,25 ";yes\r\n' +
        ' 2026-11-09 ; FLR-101 ;7;0\r\n',
    );
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.status).toBe('imported');
    expect(r.mapping).toEqual({
      'Week Start': 'week',
      'ITEM CODE': 'sku',
      Quantity: 'qty',
      'Out of Stock': 'stockout',
    });
    expect(r).toMatchObject({ rowsRead: 3, items: 2, weeks: 2 });
    expect(rows(s, 'FLR-101')).toEqual([
      ['2026-11-02', 1234.5, false],
      ['2026-11-09', 7, false],
    ]);
    expect(rows(s, 'SUG;7')).toEqual([['2026-11-02', 12.25, true]]);
    // The stocked-out week is a missing observation for the engine.
    expect(getWeeklyHistory(s, 'SUG;7')!.qty).toEqual([null, null]);
    // In a decimal-comma file a point separates thousands.
    const th = writeCsv(dir, 'th.csv', 'week;sku;qty\n2026-11-16;FLR-101;1.234\n');
    expect((await imp(s, th, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'FLR-101')[2]).toEqual(['2026-11-16', 1234, false]);
    s.close();
  });

  it('reads quoted fields with spaces around the quotes', async () => {
    const s = newStore(dir);
    const f = writeCsv(dir, 'spq.csv', 'week;sku;qty\n2026-11-02; "B;2" ; "3,5" \n');
    expect((await imp(s, f, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'B;2')).toEqual([['2026-11-02', 3.5, false]]);
    s.close();
  });

  it('reads tab-separated files and comma files with quoted thousands', async () => {
    const s = newStore(dir);
    const tab = writeCsv(dir, 'tab.tsv', 'wk\tsku\tunits\n2026-11-02\tA\t3\n2026-11-02\tB\t4.5\n');
    expect((await imp(s, tab, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'B')).toEqual([['2026-11-02', 4.5, false]]);
    const comma = writeCsv(dir, 'comma.csv', 'week,sku,qty\n2026-11-09,A,"1,250"\n2026-11-09,B,"2,000.5"\n');
    expect((await imp(s, comma, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'A')[1]).toEqual(['2026-11-09', 1250, false]);
    expect(rows(s, 'B')[1]).toEqual(['2026-11-09', 2000.5, false]);
    s.close();
  });

  it('refuses a decimal comma in a decimal-point file, and takes --decimal comma', async () => {
    const s = newStore(dir);
    const f = writeCsv(dir, 'dc.csv', 'week,sku,qty\n2026-11-02,A,"12,5"\n');
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.status).toBe('rejected');
    expect(r.errors[0]).toEqual({
      line: 2,
      column: 'qty',
      value: '12,5',
      message: `${f.split('/').pop()} line 2, column 'qty': '12,5' is not a number (a decimal comma? this file is read with decimal point '.'; pass --decimal comma)`,
    });
    const ok = await imp(s, f, { kind: 'sales', decimal: 'comma' });
    expect(ok.status).toBe('imported');
    expect(rows(s, 'A')).toEqual([['2026-11-02', 12.5, false]]);
    s.close();
  });

  it('takes the delimiter from a "sep=" line and tolerates a delimiter at the end of each data line', async () => {
    const s = newStore(dir);
    const f = writeCsv(dir, 'sep.csv', 'sep=;\r\nweek;sku;qty\r\n2026-11-02;A;1,5;\r\n2026-11-02;B;x;\r\n');
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.errors.map((e) => [e.line, e.value])).toEqual([[4, 'x']]); // physical lines: sep=1, header=2
    const ok = writeCsv(dir, 'sep2.csv', 'sep=;\nweek;sku;qty\n2026-11-02;A;1,5;\n');
    expect((await imp(s, ok, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'A')).toEqual([['2026-11-02', 1.5, false]]);
    s.close();
  });

  it('maps columns by --map and echoes the mapping; reports bad --map entries', async () => {
    const s = newStore(dir);
    const f = writeCsv(dir, 'map.csv', 'Period,Article,Pcs,Comment\n2026-11-02,A,3,fine\n');
    const missing = await imp(s, f, { kind: 'sales' });
    expect(missing.status).toBe('rejected');
    expect(missing.errors.map((e) => e.message)).toEqual([
      expect.stringContaining(
        'line 1: no column for qty (looked for: qty, quantity, units, units_sold, qty_sold, quantity_sold, …); name one with --map COLUMN=qty',
      ),
      expect.stringContaining('no week or date column'),
    ]);
    const r = await imp(s, f, { kind: 'sales', map: { period: 'week', Pcs: 'qty' } });
    expect(r.status).toBe('imported');
    expect(r.mapping).toEqual({ Period: 'week', Article: 'sku', Pcs: 'qty', Comment: null });
    const bad = await imp(s, f, { kind: 'sales', map: { Colour: 'qty', Pcs: 'amount' }, force: true });
    expect(bad.errors.map((e) => e.message.replace(/^\S+ line 1(, column '[^']*')?: /, ''))).toEqual([
      "--map Colour=qty: the file has no column 'Colour' (its columns: Period, Article, Pcs, Comment)",
      "--map Pcs=amount: 'amount' is not a field of a sales file (fields: week, date, sku, qty, stockout, order, or ignore)",
      expect.stringContaining('no column for qty'),
      expect.stringContaining('no week or date column'),
    ]);
    const two = writeCsv(dir, 'two.csv', 'week,sku,qty,units\n2026-11-02,A,3,3\n');
    const dup = await imp(s, two, { kind: 'sales' });
    expect(dup.errors[0].message).toContain(
      "columns 'qty' and 'units' both map to qty; choose one, e.g. --map \"units=ignore\"",
    );
    expect((await imp(s, two, { kind: 'sales', map: { units: 'ignore' } })).status).toBe('imported');
    // Naming a column for a field explicitly takes it from the header that would match by synonym.
    const explicit = await imp(s, two, { kind: 'sales', map: { units: 'qty' }, force: true });
    expect(explicit.mapping).toEqual({ week: 'week', sku: 'sku', qty: null, units: 'qty' });
    s.close();
  });
});

describe('dates', () => {
  it('reads ISO dates, ISO week dates, and day/month/year when the file proves it', async () => {
    const s = newStore(dir);
    const iso = writeCsv(dir, 'isow.csv', 'week,sku,qty\n2026-W45,A,1\n2026-11-09T00:00:00,A,2\n');
    expect((await imp(s, iso, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'A')).toEqual([
      ['2026-11-02', 1, false],
      ['2026-11-09', 2, false],
    ]);
    const dmy = writeCsv(dir, 'dmy.csv', 'date,sku,qty\n03/11/2026,B,1\n16/11/2026,B,2\n');
    expect((await imp(s, dmy, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'B')).toEqual([
      ['2026-11-02', 1, false],
      ['2026-11-09', 0, false], // no line that week: zero sales within the file's span
      ['2026-11-16', 2, false],
    ]);
    const mdy = writeCsv(dir, 'mdy.csv', 'date,sku,qty\n11/03/2026,C,1\n11/16/2026,C,2\n');
    expect((await imp(s, mdy, { kind: 'sales' })).status).toBe('imported');
    expect(rows(s, 'C').map((r) => r[0])).toEqual(['2026-11-02', '2026-11-09', '2026-11-16']);
    s.close();
  });

  it('asks to choose when the order is ambiguous, and follows --date-order', async () => {
    const s = newStore(dir);
    const f = writeCsv(dir, 'amb.csv', 'date,sku,qty\n03/11/2026,A,1\n04/11/2026,A,1\n');
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.status).toBe('rejected');
    expect(r.errors).toEqual([
      {
        line: 2,
        column: 'date',
        value: '03/11/2026',
        message: `${f.split('/').pop()} line 2, column 'date': dates such as '03/11/2026' can be read as day/month/year or month/day/year and the file does not tell which; say which with --date-order dmy or --date-order mdy`,
      },
    ]);
    const m = await imp(s, f, { kind: 'sales', dateOrder: 'mdy' });
    expect(m.status).toBe('imported');
    // 11 March and 11 April 2026 (month first); the weeks between had no lines: zero sales.
    expect(rows(s, 'A').map((x) => [x[0], x[1]])).toEqual([
      ['2026-03-09', 1],
      ['2026-03-16', 0],
      ['2026-03-23', 0],
      ['2026-03-30', 0],
      ['2026-04-06', 1],
    ]);
    s.close();
  });

  it('rejects mixed orders, two-digit years and impossible dates', async () => {
    const s = newStore(dir);
    const mixed = writeCsv(dir, 'mixed.csv', 'date,sku,qty\n13/01/2026,A,1\n01/13/2026,A,1\n');
    const r = await imp(s, mixed, { kind: 'sales' });
    expect(r.errors[0].message).toContain(
      "the dates mix orders: '13/01/2026' (line 2) can only be day/month/year, '01/13/2026' (line 3) only month/day/year; fix the file",
    );
    const yy = writeCsv(dir, 'yy.csv', 'date,sku,qty\n2026-01-05,A,1\n5/1/26,A,1\n');
    expect((await imp(s, yy, { kind: 'sales' })).errors[0]).toMatchObject({
      line: 3,
      value: '5/1/26',
      message: expect.stringContaining('has a two-digit year; write the year with four digits'),
    });
    const bad = writeCsv(dir, 'bad.csv', 'week,sku,qty\n2026-02-30,A,1\n2025-W53,A,1\n');
    expect(
      (await imp(s, bad, { kind: 'sales' })).errors.map((e) => [e.line, e.message.split(': ').pop()]),
    ).toEqual([
      [2, "'2026-02-30' is not a real date"],
      [3, "'2025-W53' ISO year 2025 has no week 53"],
    ]);
    s.close();
  });
});

describe('duplicates, re-imports, stockouts, negatives, unknown SKUs', () => {
  it('keeps weeks apart whatever their order and span (decades apart, backwards)', async () => {
    const s = newStore(dir);
    const lines = [
      'week,sku,qty',
      '2026-11-02,A,1',
      '1970-01-05,A,2',
      '2026-10-26,A,3',
      '2000-01-03,A,4',
      '2026-11-02,B,5',
      '2026-09-07,B,6',
    ];
    const r = await imp(s, writeCsv(dir, 'span.csv', `${lines.join('\n')}\n`), { kind: 'sales' });
    expect(r.status).toBe('imported');
    expect(rows(s, 'A').map((x) => [x[0], x[1]])).toEqual([
      ['1970-01-05', 2],
      ['2000-01-03', 4],
      ['2026-10-26', 3],
      ['2026-11-02', 1],
    ]);
    expect(rows(s, 'B').map((x) => [x[0], x[1]])).toEqual([
      ['2026-09-07', 6],
      ['2026-11-02', 5],
    ]);
    const dup = writeCsv(dir, 'span2.csv', 'week,sku,qty\n2026-11-02,A,1\n1970-01-05,A,2\n2026-11-02,A,3\n');
    expect((await imp(s, dup, { kind: 'sales' })).errors[0].message).toContain('(first on line 2)');
    s.close();
  });

  it('sums dated lines, rejects repeated weekly buckets with both lines named', async () => {
    const s = newStore(dir);
    const dated = writeCsv(
      dir,
      'dated.csv',
      'date,sku,qty,order\n2026-11-02,A,2,SO-1\n2026-11-04,A,3,SO-2\n2026-11-08,A,-1,CN-1\n',
    );
    const r = await imp(s, dated, { kind: 'sales' });
    expect(r.status).toBe('imported');
    expect(rows(s, 'A')).toEqual([['2026-11-02', 4, false]]);
    expect(r.warnings).toContain('1 rows have negative quantities (returns), kept as net demand (line 4)');
    const weekly = writeCsv(
      dir,
      'dupw.csv',
      'week,sku,qty\n2026-11-02,B,1\n2026-11-09,B,1\n2026-11-04,B,5\n',
    );
    const d = await imp(s, weekly, { kind: 'sales' });
    expect(d.status).toBe('rejected');
    expect(d.errors[0].message).toContain(
      "line 4, column 'week': '2026-11-04' repeats SKU B, week 2026-11-02 (first on line 2); a weekly file lists each item and week once",
    );
    s.close();
  });

  it('replaces weeks already in the store and says what changed; skips the same file; --force re-imports', async () => {
    const s = newStore(dir);
    const first = writeCsv(dir, 'w1.csv', 'week,sku,qty,stockout\n2026-11-02,A,10,0\n2026-11-09,A,11,0\n');
    expect((await imp(s, first, { kind: 'sales' })).status).toBe('imported');
    const again = await imp(s, first, { kind: 'sales' });
    expect(again.status).toBe('skipped');
    expect(again.warnings[0]).toMatch(
      /the same file \(SHA-256 [0-9a-f]{12}…\) was imported on .* as batch 1 .*Use --force to import it again\./,
    );
    const second = writeCsv(dir, 'w2.csv', 'week,sku,qty,stockout\n2026-11-09,A,12,1\n2026-11-16,A,9,0\n');
    const r = await imp(s, second, { kind: 'sales' });
    expect(r.warnings).toContain(
      '1 item-weeks were already in the store and were replaced; 1 of them changed (A 2026-11-09: 11 → 12 (stockout))',
    );
    expect(rows(s, 'A')).toEqual([
      ['2026-11-02', 10, false],
      ['2026-11-09', 12, true],
      ['2026-11-16', 9, false],
    ]);
    const forced = await imp(s, first, { kind: 'sales', force: true });
    expect(forced.status).toBe('imported');
    expect(listBatches(s).length).toBe(3);
    expect(listAudit(s).filter((e) => e.action === 'import-sales').length).toBe(3);
    s.close();
  });

  it("gives zero weeks over a dated file's span to known items that had no line in it", async () => {
    const s = newStore(dir);
    await imp(s, writeCsv(dir, 'hist.csv', 'week,sku,qty\n2026-10-26,A,5\n2026-10-26,B,2\n'), {
      kind: 'sales',
    });
    const r = await imp(s, writeCsv(dir, 'lines.csv', 'date,sku,qty\n2026-11-02,A,1\n2026-11-15,A,2\n'), {
      kind: 'sales',
    });
    expect(r.warnings).toContain(
      "2 item-weeks within the file's span had no lines and were stored as 0 sales (1 of the items had no line in this file at all)",
    );
    expect(rows(s, 'B')).toEqual([
      ['2026-10-26', 2, false],
      ['2026-11-02', 0, false],
      ['2026-11-09', 0, false],
    ]);
    s.close();
  });

  it('creates placeholder items on the workspace defaults for unknown SKUs, with a warning', async () => {
    const s = newStore(dir);
    putWorkspaceSettings(s, { leadTimeWeeks: 3 });
    const f = writeCsv(dir, 'unk.csv', 'week,sku,qty\n2026-11-02,NEW-1,4\n2026-11-02,NEW-2,\n');
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.warnings).toEqual([
      '1 rows have an empty quantity, stored as missing weeks (line 3)',
      '2 SKUs were not in the item master and were added as placeholder items on the workspace defaults (lead time 3 weeks, service level of the ABC class or 0.95, case pack 1, no MOQ) with a zero inventory position until a stock file says otherwise: NEW-1, NEW-2',
    ]);
    expect(getStoredItem(s, 'NEW-1')).toMatchObject({ placeholder: true, active: true });
    expect(getItemSettings(s, 'NEW-1')).toMatchObject({ leadTimeWeeks: 3, casePack: 1, moq: 0 });
    expect(getPosition(s, 'NEW-2')).toEqual({ onHand: 0, onOrder: 0, backorders: 0, asOf: null });
    expect(rows(s, 'NEW-2')).toEqual([['2026-11-02', null, false]]);
    s.close();
  });
});

describe('errors', () => {
  it('gives the physical line (header = 1) across quoted line breaks and blank lines', async () => {
    const s = newStore(dir);
    const f = writeCsv(
      dir,
      'lines.csv',
      'week,sku,qty\n2026-11-02,A,1\n\n"2026-11-02","B\nwith break",2\n\n2026-11-02,C,x\n2026-11-02,,1\n2026-11-02,D\n',
    );
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.errors.map((e) => [e.line, e.column, e.value])).toEqual([
      [7, 'qty', 'x'],
      [8, 'sku', null],
      [9, null, null],
    ]);
    expect(r.errors[1].message).toBe(`${f.split('/').pop()} line 8, column 'sku': the SKU is empty`);
    expect(r.errors[2].message).toBe(
      `${f.split('/').pop()} line 9: has 2 fields, the header has 3; check for an unquoted ',' inside a value`,
    );
    s.close();
  });

  it('caps the list at 50 with the total, and writes nothing', async () => {
    const s = newStore(dir);
    const ok = writeCsv(dir, 'seed.csv', 'week,sku,qty\n2026-11-02,A,1\n');
    await imp(s, ok, { kind: 'sales' });
    const lines = ['week,sku,qty'];
    for (let i = 0; i < 120; i++) lines.push(`2026-11-09,A${i},${i % 2 ? 'n/a' : '1'}`);
    const f = writeCsv(dir, 'many.csv', `${lines.join('\n')}\n`);
    const r = await imp(s, f, { kind: 'sales' });
    expect(r.status).toBe('rejected');
    expect(r.errors.length).toBe(51);
    expect(r.errors[50].message).toBe(
      `${f.split('/').pop()}: … and 10 more errors (60 in total); nothing was written`,
    );
    s.close();
  });

  it('rejects broken CSV, empty files, header-only files and UTF-16', async () => {
    const s = newStore(dir);
    const cases: [string, string | Buffer, string][] = [
      ['quote.csv', 'week,sku,qty\n2026-11-02,"A"x,1\n', 'the CSV cannot be read: Invalid Closing Quote'],
      ['empty.csv', '', 'the file is empty'],
      ['header.csv', 'week,sku,qty\n', 'has a header but no data rows'],
      [
        'utf16.csv',
        Buffer.from('\ufeffweek,sku,qty\n', 'utf16le'),
        'the file is UTF-16 encoded; save it as UTF-8',
      ],
    ];
    for (const [name, content, message] of cases) {
      const r = await imp(s, writeCsv(dir, name, content), { kind: 'sales' });
      expect(r.status, name).toBe('rejected');
      expect(r.errors[0].message, name).toContain(message);
    }
    s.close();
  });
});

describe('item master and stock files', () => {
  it('reads every item setting, percentages and marks; empty cells take the defaults', async () => {
    const s = newStore(dir);
    const f = writeCsv(
      dir,
      'items.csv',
      'SKU,Description,Vendor,UoM,Case Pack,MOQ,Lead Time (weeks),Lead Time SD,Review Period,Service Level,Service Kind,Unit Cost,Holding Rate,Order Cost,Shelf Life,Active\n' +
        'FLR-101,"Strong White Bread Flour, 25 kg",Hollowbrook Mill,sack,4,10,2,0.5,1,97%,Fill Rate,18.40,25%,35,,yes\n' +
        'YST-301,Fresh Yeast Block,Quillfield Cultures,block,12,,,,0,0.99,cycle,3.10,0.25,25,3,no\n',
    );
    const r = await imp(s, f, { kind: 'items' });
    expect(r.status).toBe('imported');
    expect(getItemSettings(s, 'FLR-101')).toEqual({
      sku: 'FLR-101',
      description: 'Strong White Bread Flour, 25 kg',
      supplier: 'Hollowbrook Mill',
      unit: 'sack',
      casePack: 4,
      moq: 10,
      leadTimeWeeks: 2,
      leadTimeSdWeeks: 0.5,
      reviewPeriodWeeks: 1,
      serviceLevel: 0.97,
      serviceKind: 'fill',
      unitCost: 18.4,
      holdingRate: 0.25,
      orderCost: 35,
      shelfLifeWeeks: null,
      active: true,
    });
    expect(getItemSettings(s, 'YST-301')).toMatchObject({
      moq: 0,
      leadTimeWeeks: 2,
      reviewPeriodWeeks: 0,
      active: false,
      shelfLifeWeeks: 3,
    });
    s.close();
  });

  it('rejects out-of-range settings with the value and what to write instead', async () => {
    const s = newStore(dir);
    const f = writeCsv(
      dir,
      'baditems.csv',
      'sku,service_level,case_pack,service_kind,active\nA,95,1,cycle,yes\nB,0.9,0,cycle,yes\nC,0.9,1,sometimes,yes\nD,0.9,1,fill,maybe\nA,0.9,1,cycle,yes\n',
    );
    const r = await imp(s, f, { kind: 'items' });
    expect(r.errors.map((e) => e.message.replace(/^\S+ /, ''))).toEqual([
      "line 2, column 'service_level': '95' is not a fraction; write a service level as 0.95 or 95%",
      "line 3, column 'case_pack': '0' is out of range: a case pack must be above 0",
      "line 4, column 'service_kind': 'sometimes' is not a service kind (cycle or fill)",
      "line 5, column 'active': 'maybe' is not an active mark (use 1/0, yes/no or true/false)",
      "line 6, column 'sku': 'A' appears again (first on line 2); an item master lists each SKU once",
    ]);
    s.close();
  });

  it('reads positions, defaults empty on-order to 0, and refuses negatives', async () => {
    const s = newStore(dir);
    const f = writeCsv(
      dir,
      'stock.csv',
      'Item No;On Hand;On Order;Backorders;As Of\nA;12,5;;0;29.11.2026\nB;-2;5;1;29.11.2026\n',
    );
    const r = await imp(s, f, { kind: 'stock' });
    expect(r.status).toBe('imported');
    expect(getPosition(s, 'A')).toEqual({ onHand: 12.5, onOrder: 0, backorders: 0, asOf: '2026-11-29' });
    expect(r.warnings[0]).toBe('1 items have a negative on-hand quantity, kept as it is (B)');
    const bad = writeCsv(dir, 'badstock.csv', 'sku,on_hand,on_order\nA,1,-3\n');
    expect((await imp(s, bad, { kind: 'stock' })).errors[0].message).toContain(
      "column 'on_order': '-3' cannot be negative",
    );
    s.close();
  });
});

describe('previewImport', () => {
  it('shows the first rows, the mapping and every problem without writing', async () => {
    const s = newStore(dir);
    const before = dumpStore(s);
    const f = writeCsv(dir, 'preview.csv', 'Week;Item;Qty\n2026-11-02;A;1,5\n2026-11-02;B;zz\n');
    const p = await previewImport(f, { kind: 'sales', store: s });
    expect(p).toMatchObject({
      status: 'rejected',
      delimiter: ';',
      decimal: ',',
      header: ['Week', 'Item', 'Qty'],
      mapping: { Week: 'week', Item: 'sku', Qty: 'qty' },
      rows: [
        { line: 2, cells: ['2026-11-02', 'A', '1,5'] },
        { line: 3, cells: ['2026-11-02', 'B', 'zz'] },
      ],
      unknownSkus: ['A'], // B's only row has an error
      alreadyImported: null,
    });
    expect(p.errors).toHaveLength(1);
    expect(dumpStore(s)).toBe(before);
    s.close();
  });
});
