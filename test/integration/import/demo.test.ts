import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { getAllWeeklyHistories } from '../../../app/store/demand';
import { getItemSettings, getStoredItem, listSuppliers } from '../../../app/store/items';
import { getPosition } from '../../../app/store/stock';
import { openStore } from '../../../app/store/store';
import { buildDemoStore } from '../../../demo-store/build';
import { writeDemoExports } from '../../../demo-store/exports';
import { DEMO_LAST_WEEK, DEMO_SEED, generateScenario } from '../../../demo-store/scenario';
import { tempDir } from './helpers';

const { dir, cleanup } = tempDir('provision-demo-');
afterAll(cleanup);

describe('demo store', () => {
  it('is deterministic: the same seed writes the same bytes', () => {
    const a = writeDemoExports(generateScenario(DEMO_SEED), join(dir, 'a'), DEMO_SEED);
    const b = writeDemoExports(generateScenario(DEMO_SEED), join(dir, 'b'), DEMO_SEED);
    for (const k of ['items', 'salesHistory', 'salesRecent', 'stock'] as const) {
      expect(readFileSync(a[k]).equals(readFileSync(b[k])), k).toBe(true);
    }
    const recent = readFileSync(a.salesRecent, 'utf8');
    expect(recent.startsWith('\ufeffOrder Date;Order No;Item No;Quantity')).toBe(true);
    expect(recent).toMatch(/;\d+,\d\r\n/); // decimal commas
  });

  it('builds through the import path and reads back the scenario, week for week', async () => {
    const path = join(dir, 'demo.sqlite');
    const summary = await buildDemoStore(path, { exportsDir: join(dir, 'exports') });
    expect(summary).toMatchObject({ items: 150, suppliers: 6, lastWeek: DEMO_LAST_WEEK });
    expect(DEMO_LAST_WEEK).toBe('2026-11-23'); // the last complete Monday-week before Monday 2026-11-30
    expect(summary.imports.map((i) => i.summary.status)).toEqual([
      'imported',
      'imported',
      'imported',
      'imported',
    ]);
    const scenario = generateScenario(DEMO_SEED);
    const store = openStore(path);
    const histories = getAllWeeklyHistories(store);
    for (const it of scenario.items) {
      const h = histories.get(it.sku)!;
      const first = it.qty.findIndex((q) => q !== null);
      const expected = it.qty.slice(first).map((q, t) => (it.stockout[first + t] ? null : q));
      expect(h.weekStart[0], it.sku).toBe(scenario.weeks[first]);
      // A discontinued item's silent weeks after its last sale read as missing.
      expect(h.qty.slice(0, expected.length), it.sku).toEqual(
        expected.map((q) => (q === null ? null : expect.closeTo(q, 9))),
      );
    }
    const byPattern = (p: string) => scenario.items.find((i) => i.pattern === p)!;
    expect(histories.get(byPattern('new').sku)!.qty.length).toBe(20);
    expect(getStoredItem(store, byPattern('discontinued').sku)!.active).toBe(false);
    expect(getStoredItem(store, 'SMP-900')!.placeholder).toBe(true);
    expect(listSuppliers(store).map((s) => s.name)).toContain('Tindale Pack Works');
    const yeast = scenario.items.find((i) => i.description.startsWith('Fresh Yeast Block'))!;
    expect(getItemSettings(store, yeast.sku)!.shelfLifeWeeks).toBe(3);
    expect(getPosition(store, yeast.sku).asOf).toBe('2026-11-29');
    const leadTimes = new Set(scenario.items.map((i) => i.leadTimeWeeks));
    expect(Math.min(...leadTimes)).toBe(1);
    expect(Math.max(...leadTimes)).toBe(8);
    store.close();
  });
});
