/**
 * Building the demo store: generate the scenario, write its exports, and import them through the
 * real import path (items, then weekly history, then the recent dated lines, then stock), exactly as
 * a planner would. The desktop app's first start calls `buildDemoStore` when the demo store is missing.
 */
import { existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { type ImportSummary, importFile } from '../app/import/import';
import { countDemandRows, lastDemandWeek } from '../app/store/demand';
import { countItems, listSuppliers } from '../app/store/items';
import { openStore } from '../app/store/store';
import { writeDemoExports } from './exports';
import { DEMO_SEED, generateScenario } from './scenario';

export interface DemoSummary {
  path: string;
  exportsDir: string;
  items: number;
  suppliers: number;
  demandRows: number;
  lastWeek: string | null;
  imports: { file: string; kind: string; summary: ImportSummary }[];
}

export const DEFAULT_EXPORTS_DIR = join(import.meta.dirname, 'exports');

export async function buildDemoStore(
  path: string,
  options: { exportsDir?: string; seed?: number; replace?: boolean } = {},
): Promise<DemoSummary> {
  if (existsSync(path)) {
    if (!options.replace) throw new Error(`${path} already exists; choose another file or replace it`);
    for (const f of [path, `${path}-wal`, `${path}-shm`]) rmSync(f, { force: true });
  }
  const seed = options.seed ?? DEMO_SEED;
  const exportsDir = options.exportsDir ?? DEFAULT_EXPORTS_DIR;
  const files = writeDemoExports(generateScenario(seed), exportsDir, seed);
  const store = openStore(path, { create: true });
  try {
    const imports: DemoSummary['imports'] = [];
    const steps = [
      [files.items, 'items'],
      [files.salesHistory, 'sales'],
      [files.salesRecent, 'sales'],
      [files.stock, 'stock'],
    ] as const;
    for (const [file, kind] of steps) {
      const summary = await importFile(store, file, { kind, actor: 'demo', force: true });
      if (summary.status !== 'imported') {
        throw new Error(
          `demo: importing ${file} was ${summary.status}: ${summary.errors.map((e) => e.message).join('; ')}`,
        );
      }
      imports.push({ file, kind, summary });
    }
    return {
      path,
      exportsDir,
      items: countItems(store),
      suppliers: listSuppliers(store).length,
      demandRows: countDemandRows(store),
      lastWeek: lastDemandWeek(store),
      imports,
    };
  } catch (err) {
    store.close();
    for (const f of [path, `${path}-wal`, `${path}-shm`]) rmSync(f, { force: true });
    throw err;
  } finally {
    store.close();
  }
}
