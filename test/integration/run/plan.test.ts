/**
 * `plan` exports the latest run's order list through the real command line: exact columns, one
 * line per active item grouped by supplier, planner edits shown, RFC 4180 quoting read back by an
 * independent CSV parser (csv-parse), --supplier, and clear errors. The run itself is made with the
 * TEST-ONLY stand-in per-item function (the export does not depend on how lines were computed).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';
import { afterAll, describe, expect, it } from 'vitest';
import { startRun } from '../../../app/run/startRun';
import { insertBatch } from '../../../app/store/batches';
import { upsertItems } from '../../../app/store/items';
import { editOrderQty } from '../../../app/store/overrides';
import { getLatestRun } from '../../../app/store/runs';
import { nowIso } from '../../../app/store/store';
import { makeStore } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-plan-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const MAIN = fileURLToPath(new URL('../../../app/cli/main.ts', import.meta.url));
const cli = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', MAIN, ...args], { encoding: 'utf8' });

const COLUMNS =
  'supplier,sku,description,order_qty,case_packs,reorder_point,order_up_to,safety_stock,interval_forecast,interval_sd,service_level,service_kind,flags,explanation';

describe('plan: the order-list export', () => {
  const path = join(dir, 'plan.sqlite');
  const store = makeStore(path, ['A1', 'A2', 'B1', 'N1', 'X1'], 20);
  store.transaction(() => {
    const batch = insertBatch(store, {
      kind: 'items',
      fileName: 'items.csv',
      sha256: 'items',
      rowsRead: 5,
      actor: 'test',
      startedAt: nowIso(),
    });
    upsertItems(
      store,
      [
        { sku: 'A1', supplier: 'Zest Mills', description: 'Rye flour, "type 1150"' },
        { sku: 'A2', supplier: 'Zest Mills', description: 'Spelt flour\nstone-ground' },
        { sku: 'B1', supplier: 'Amber Sugars', description: ' leading space' },
        { sku: 'X1', active: false, description: 'discontinued' },
      ],
      batch,
    );
  });

  it('writes one line per active item, grouped by supplier, planner edits applied', async () => {
    const s = await startRun(store, {
      taskModule: new URL('./fixtures/standInPlanTask.ts', import.meta.url),
      taskExport: 'standInPlan',
      workers: 1,
    }).done;
    expect(s.status).toBe('complete');
    editOrderQty(store, 'A2', getLatestRun(store)!.id, 777, { actor: 'test', reason: 'promo' });
    const out = join(dir, 'orders.csv');
    const r = cli('plan', '--store', path, '--out', out);
    expect(r.status, r.stderr).toBe(0);
    const text = readFileSync(out, 'utf8');
    expect(text.split('\r\n')[0]).toBe(COLUMNS);
    const rows = parse(text, { columns: true }) as Record<string, string>[];
    // Suppliers by name (Amber before Zest), items without a supplier last; X1 is inactive.
    expect(rows.map((r) => [r.supplier, r.sku])).toEqual([
      ['Amber Sugars', 'B1'],
      ['Zest Mills', 'A1'],
      ['Zest Mills', 'A2'],
      ['', 'N1'],
    ]);
    expect(rows[1].description).toBe('Rye flour, "type 1150"');
    expect(rows[2].description).toBe('Spelt flour\nstone-ground');
    expect(rows[0].description).toBe(' leading space');
    expect(rows[2].order_qty).toBe('777');
    expect(rows[0].service_level).toBe('0.95'); // DEFAULT_WORKSPACE.serviceLevel, B1 has none of its own
    expect(rows[0].service_kind).toBe('cycle');
    expect(JSON.parse(r.stdout.trim().split('\n').pop()!)).toMatchObject({ lines: 4 });

    const only = join(dir, 'zest.csv');
    expect(cli('plan', '--store', path, '--out', only, '--supplier', 'Zest Mills').status).toBe(0);
    const zest = parse(readFileSync(only, 'utf8'), { columns: true }) as Record<string, string>[];
    expect(zest.map((r) => r.sku)).toEqual(['A1', 'A2']);
  });

  it('refuses an unknown supplier and a store without a run, writing no file', () => {
    const bad = cli('plan', '--store', path, '--out', join(dir, 'none.csv'), '--supplier', 'Nobody');
    expect(bad.status).toBe(1);
    expect(bad.stderr).toContain(
      "--supplier 'Nobody' is not a supplier of this store; known: Amber Sugars, Zest Mills",
    );
    const empty = join(dir, 'empty.sqlite');
    makeStore(empty, ['E1'], 5).close();
    const none = cli('plan', '--store', empty, '--out', join(dir, 'none.csv'));
    expect(none.status).toBe(1);
    expect(none.stderr).toContain('has no complete planning run yet');
    expect(() => readFileSync(join(dir, 'none.csv'))).toThrow();
    expect(cli('plan', '--store', path).stderr).toContain('--out FILE.csv is required');
    const missing = cli('plan', '--store', join(dir, 'nope.sqlite'), '--out', join(dir, 'none.csv'));
    expect(missing.status).toBe(1);
    expect(missing.stderr).toMatch(/^plan: .*nope\.sqlite: no such store/);
  });
});
