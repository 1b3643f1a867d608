/** Shared set-up for the import tests: temporary folder, files, stores and whole-store dumps. */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import { type ImportOptions, type ImportSummary, importFile } from '../../../app/import/import';
import { dumpStore } from '../../../app/store/dump';
import { openStore, type Store } from '../../../app/store/store';

export function tempDir(prefix: string): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

let counter = 0;

export function writeCsv(dir: string, name: string, content: string | Buffer): string {
  const path = join(dir, `${++counter}-${name}`);
  writeFileSync(path, content);
  return path;
}

export function newStore(dir: string): Store {
  return openStore(join(dir, `store-${++counter}.sqlite`), { create: true });
}

/** Import, and when the result is not 'imported' check that the store did not change at all. */
export async function imp(store: Store, path: string, options: ImportOptions): Promise<ImportSummary> {
  const before = dumpStore(store);
  const s = await importFile(store, path, { actor: 'test', ...options });
  if (s.status !== 'imported') expect(dumpStore(store)).toBe(before);
  return s;
}
