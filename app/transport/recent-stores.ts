/**
 * The shell's list of recently opened stores (File → Open recent): newest first, no duplicates,
 * at most ten, kept as JSON in the shell's user-data folder. Plain Node, tested without Electron.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';

export const MAX_RECENT = 10;

export function readRecent(file: string): string[] {
  try {
    const v = JSON.parse(readFileSync(file, 'utf8')) as unknown;
    return Array.isArray(v) ? v.filter((p): p is string => typeof p === 'string').slice(0, MAX_RECENT) : [];
  } catch {
    return [];
  }
}

/** Put `storePath` first and save; returns the new list (stores that no longer exist are dropped). */
export function rememberStore(file: string, storePath: string): string[] {
  const abs = resolve(storePath);
  const list = [abs, ...readRecent(file).filter((p) => p !== abs && existsSync(p))].slice(0, MAX_RECENT);
  mkdirSync(dirname(file), { recursive: true });
  const tmp = `${file}.tmp`;
  writeFileSync(tmp, JSON.stringify(list, null, 2));
  renameSync(tmp, file);
  return list;
}
