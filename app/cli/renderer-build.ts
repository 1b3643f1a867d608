/**
 * Builds the screens (vite, renderer/vite.config.ts → dist-renderer/) when the build is missing or
 * older than any source it comes from, so `npm run preview` works straight after `npm ci`.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

export const ROOT = join(import.meta.dirname, '..', '..');
export const RENDERER_DIR = join(ROOT, 'renderer');
export const RENDERER_OUT = join(ROOT, 'dist-renderer');

function newestMtime(dir: string): number {
  let newest = 0;
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    const s = statSync(p);
    newest = Math.max(newest, s.isDirectory() ? newestMtime(p) : s.mtimeMs);
  }
  return newest;
}

export function rendererIsStale(): boolean {
  const index = join(RENDERER_OUT, 'index.html');
  if (!existsSync(index)) return true;
  const built = statSync(index).mtimeMs;
  const sources = Math.max(
    newestMtime(RENDERER_DIR),
    statSync(join(ROOT, 'app', 'api', 'contract.ts')).mtimeMs,
  );
  return sources > built;
}

/** Build when stale; returns true when a build ran. Messages go to stderr (stdout carries the address). */
export async function ensureRendererBuilt(): Promise<boolean> {
  if (!rendererIsStale()) return false;
  process.stderr.write('Building the screens (renderer) …\n');
  const { build } = await import('vite');
  await build({ configFile: join(RENDERER_DIR, 'vite.config.ts'), logLevel: 'warn' });
  return true;
}
