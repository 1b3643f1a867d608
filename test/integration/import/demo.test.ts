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

/** Sample autocorrelation at lag k (Box, Jenkins & Reinsel, Time Series Analysis, eq. 2.1.12). */
function acf(x: number[], k: number): number {
  const n = x.length;
  const m = x.reduce((a, b) => a + b, 0) / n;
  let c0 = 0;
  let ck = 0;
  for (let t = 0; t < n; t++) c0 += (x[t] - m) ** 2;
  for (let t = k; t < n; t++) ck += (x[t] - m) * (x[t - k] - m);
  return ck / c0;
}
const mean = (x: number[]) => x.reduce((a, b) => a + b, 0) / x.length;

describe('demo scenario patterns', () => {
  const sc = generateScenario(DEMO_SEED);
  const of = (p: string) => sc.items.filter((i) => i.pattern === p);
  const series = (i: (typeof sc.items)[number]) => i.qty.filter((q): q is number => q !== null);
  it('has about 150 items over 4–6 suppliers and every named pattern', () => {
    expect(sc.items.length).toBe(150);
    expect(new Set(sc.items.map((i) => i.supplier)).size).toBeGreaterThanOrEqual(4);
    for (const p of [
      'steady',
      'ar',
      'ma',
      'seasonal',
      'trend',
      'intermittent',
      'spike',
      'new',
      'discontinued',
      'break',
    ]) {
      expect(of(p).length, p).toBeGreaterThan(0);
    }
  });
  it('shows each pattern in the numbers', () => {
    // AR(1) with φ in [0.5, 0.8]: lag-1 autocorrelation φ (Box, Jenkins & Reinsel §3.2.4); sampling
    // error about 1/√156 ≈ 0.08, so above 0.25 on average.
    expect(mean(of('ar').map((i) => acf(series(i), 1)))).toBeGreaterThan(0.25);
    // MA(1): ρ1 = −θ/(1+θ²), |ρ1| in [0.34, 0.47] for |θ| in [0.4, 0.7]; ρ2 = 0 (same source, §3.3.3).
    expect(mean(of('ma').map((i) => Math.abs(acf(series(i), 1))))).toBeGreaterThan(0.2);
    expect(Math.abs(mean(of('ma').map((i) => acf(series(i), 2))))).toBeLessThan(0.1);
    for (const it of of('seasonal')) {
      const q = series(it);
      const dec = q.filter((_, t) => sc.weeks[t].slice(5, 7) === '12');
      expect(mean(dec), it.sku).toBeGreaterThan(1.3 * mean(q));
    }
    for (const it of of('trend'))
      expect(mean(series(it).slice(-52))).toBeGreaterThan(1.3 * mean(series(it).slice(0, 52)));
    for (const it of of('intermittent'))
      expect(series(it).filter((q) => q === 0).length / 156).toBeGreaterThan(0.6);
    const spike = series(of('spike')[0]);
    expect(Math.max(...spike)).toBeGreaterThan(4 * mean(spike));
    const br = series(of('break')[0]);
    expect(mean(br.slice(100))).toBeGreaterThan(1.5 * mean(br.slice(0, 80)));
    expect(series(of('new')[0]).length).toBe(20);
    expect(of('discontinued')[0].active).toBe(false);
  });
});

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
