/**
 * A command's module loaded as one bundle: esbuild joins the entry and everything it imports from
 * this repository into one ES module (packages stay imports), written once per distinct content
 * under node_modules/.cache/provision and imported from there. It is built on every call, from the
 * sources as they are (~55 ms), so it is never stale and needs no build step.
 * Why: `fit` runs the same code over thousands of files in one process, and the JIT optimises one
 * bundle sooner than the same code as 40 modules compiled one by one by tsx (which also names every
 * closure at run time): see DEVELOPERS.md for the figures. Where the cache cannot be written, the
 * module is imported as it is.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { BuildOptions } from 'esbuild';

const ROOT = join(import.meta.dirname, '..', '..');
const CACHE = join(ROOT, 'node_modules', '.cache', 'provision');
/** Older bundles of the same entry are removed after an hour (a call still running may use one). */
const KEEP_MS = 3600_000;

/** How a command's entry is bundled (also used by the test that checks what goes into it). */
export function bundleOptions(entry: string): BuildOptions {
  return {
    entryPoints: [entry],
    bundle: true,
    platform: 'node',
    format: 'esm',
    packages: 'external',
    // Stack traces name the TypeScript sources (tsx turns source maps on).
    sourcemap: 'inline',
    sourcesContent: false,
    write: false,
    logLevel: 'silent',
  };
}

/** entry: the module's absolute path. */
export async function importBundled(entry: string, cacheDir = CACHE): Promise<unknown> {
  let file: string;
  try {
    file = await writeBundle(entry, cacheDir);
  } catch {
    return import(pathToFileURL(entry).href);
  }
  return import(pathToFileURL(file).href);
}

async function writeBundle(entry: string, cacheDir: string): Promise<string> {
  const { build } = await import('esbuild');
  const result = await build(bundleOptions(entry));
  if (!result.outputFiles) throw new Error('esbuild wrote no output');
  const code = result.outputFiles[0].text;
  const name = basename(entry).replace(/\.[^.]+$/, '');
  const hash = createHash('sha256').update(code).digest('hex').slice(0, 16);
  const file = join(cacheDir, `${name}-${hash}.mjs`);
  if (statSync(file, { throwIfNoEntry: false })) return file;
  mkdirSync(cacheDir, { recursive: true });
  const now = Date.now();
  for (const old of readdirSync(cacheDir)) {
    if (!old.startsWith(`${name}-`)) continue;
    const path = join(cacheDir, old);
    const mtime = statSync(path, { throwIfNoEntry: false })?.mtimeMs ?? now;
    if (now - mtime > KEEP_MS) rmSync(path, { force: true });
  }
  // Written whole, then renamed into place, so a concurrent call never imports half a file.
  const tmp = `${file}.${process.pid}.tmp`;
  writeFileSync(tmp, code);
  renameSync(tmp, file);
  return file;
}
