/**
 * app/cli/bundledImport.ts: a command's module as one bundle, written once per content into a
 * cache directory, stale bundles of the same entry removed, and the plain module when the cache
 * cannot be written.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { afterEach, describe, expect, it } from 'vitest';
import { bundleOptions, importBundled } from '../../app/cli/bundledImport';

const root = join(import.meta.dirname, '..', '..');
const CSV_MODULE = join(root, 'app/cli/fit-csv.ts');
const dirs: string[] = [];
function scratch(): string {
  const d = mkdtempSync(join(tmpdir(), 'provision-bundle-'));
  dirs.push(d);
  return d;
}
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

type CsvModule = { parseWeek: (text: string) => number | null };

describe('importBundled', () => {
  it('imports the entry from one bundle, written once for the same sources', async () => {
    const cache = scratch();
    const mod = (await importBundled(CSV_MODULE, cache)) as CsvModule;
    // 2024-01-01 is day 19723 after 1970-01-01 (a Monday: ISO week 2024-W01).
    expect(mod.parseWeek('2024-01-01')).toBe(19723);
    expect(mod.parseWeek('2024-W01')).toBe(19723);
    const first = readdirSync(cache);
    expect(first).toHaveLength(1);
    expect(first[0]).toMatch(/^fit-csv-[0-9a-f]{16}\.mjs$/);
    await importBundled(CSV_MODULE, cache);
    expect(readdirSync(cache)).toEqual(first);
  });

  it('removes bundles of the same entry older than an hour, and nothing else', async () => {
    const cache = scratch();
    const stale = join(cache, 'fit-csv-0000000000000000.mjs');
    const recent = join(cache, 'fit-csv-1111111111111111.mjs');
    const other = join(cache, 'fit-2222222222222222.mjs');
    for (const f of [stale, recent, other]) writeFileSync(f, 'export {};\n');
    const twoHoursAgo = (Date.now() - 2 * 3600_000) / 1000;
    utimesSync(stale, twoHoursAgo, twoHoursAgo);
    utimesSync(other, twoHoursAgo, twoHoursAgo);
    await importBundled(CSV_MODULE, cache);
    const left = readdirSync(cache).sort();
    expect(left).not.toContain('fit-csv-0000000000000000.mjs');
    expect(left).toContain('fit-csv-1111111111111111.mjs');
    expect(left).toContain('fit-2222222222222222.mjs');
    expect(left).toHaveLength(3);
  });

  it('falls back to the module itself when the cache cannot be written', async () => {
    const blocker = join(scratch(), 'a-file');
    writeFileSync(blocker, 'not a directory');
    const mod = (await importBundled(CSV_MODULE, join(blocker, 'cache'))) as CsvModule;
    expect(mod.parseWeek('2024-01-01')).toBe(19723);
  });

  it("leaves out import.meta in every module of fit's bundle (the bundle lives in the cache)", async () => {
    const r = await build({ ...bundleOptions(join(root, 'app/cli/fit.ts')), metafile: true });
    const inputs = Object.keys(r.metafile.inputs);
    expect(inputs.length).toBeGreaterThan(20);
    const using = inputs.filter((f) => readFileSync(join(root, f), 'utf8').includes('import.meta'));
    expect(using).toEqual([]);
  });
});
