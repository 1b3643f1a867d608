/**
 * The version of the planning code, part of every item's input fingerprint so that a change of
 * the statistics re-plans every item instead of reusing results the old code made. From a source
 * checkout it is a SHA-256 over the text of every file under core/ and of the worker's task module
 * (any edit counts); in a bundled build, where those files are absent, the package version.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | null = null;

function listFiles(dir: string, out: string[]): void {
  for (const name of readdirSync(dir).sort()) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) listFiles(p, out);
    else if (/\.(ts|js|mjs)$/.test(name) && !/\.test\.ts$/.test(name)) out.push(p);
  }
}

export function planningCodeVersion(): string {
  if (cached) return cached;
  const root = fileURLToPath(new URL('../../', import.meta.url));
  const core = join(root, 'core');
  const task = fileURLToPath(new URL('./planTask.ts', import.meta.url));
  if (existsSync(core)) {
    const files: string[] = [];
    listFiles(core, files);
    if (existsSync(task)) files.push(task);
    const h = createHash('sha256');
    for (const f of files) {
      h.update(relative(root, f));
      h.update('\0');
      h.update(readFileSync(f));
      h.update('\0');
    }
    cached = `src:${h.digest('hex').slice(0, 16)}`;
  } else {
    const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string };
    cached = `pkg:${pkg.version}`;
  }
  return cached;
}
