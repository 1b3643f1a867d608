/**
 * Where the fit command's worker threads start. From source, a worker would load its ~350 modules
 * (core, csv-parse, @stdlib) one by one through tsx's loader, about 0.6 s per worker; instead the
 * worker's module graph is bundled once with esbuild into node_modules/.cache/provision/ and the
 * workers start on that one file (about 0.2 s). The bundle is rebuilt when any of its input files
 * changed (a manifest of their sizes and modification times sits beside it); it is written under a
 * temporary name and renamed, so a concurrent command never reads half a file. In a build (.js)
 * the sibling module is used as it is, and if bundling fails the worker runs from source through tsx.
 */
import { mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { siblingModule } from '../run/tsWorker';

type Manifest = Record<string, [number, number]>;

/** True when the bundle exists and every input in its manifest has the recorded size and mtime. */
export function bundleIsCurrent(manifestFile: string, bundle: string): boolean {
  try {
    statSync(bundle);
    const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest;
    for (const [file, [size, mtime]] of Object.entries(manifest)) {
      const st = statSync(file);
      if (st.size !== size || st.mtimeMs !== mtime) return false;
    }
    return true;
  } catch {
    return false;
  }
}

export async function fitWorkerEntry(): Promise<URL> {
  const source = siblingModule('fit-worker', import.meta.url);
  if (!source.pathname.endsWith('.ts')) return source;
  const entry = fileURLToPath(source);
  const root = resolve(dirname(entry), '..', '..');
  const cacheDir = join(root, 'node_modules', '.cache', 'provision');
  const bundle = join(cacheDir, 'fit-worker.mjs');
  const manifestFile = join(cacheDir, 'fit-worker.inputs.json');
  if (bundleIsCurrent(manifestFile, bundle)) return pathToFileURL(bundle);
  try {
    const esbuild = await import('esbuild');
    mkdirSync(cacheDir, { recursive: true });
    const tmp = `${bundle}.${process.pid}.tmp`;
    const result = await esbuild.build({
      entryPoints: [entry],
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      outfile: tmp,
      metafile: true,
      logLevel: 'silent',
      // CommonJS dependencies inside an ES module bundle need a require of their own.
      banner: {
        js: "import { createRequire as __provisionRequire } from 'node:module';\nconst require = __provisionRequire(import.meta.url);",
      },
    });
    const manifest: Manifest = {};
    for (const input of Object.keys(result.metafile.inputs)) {
      const file = resolve(root, input);
      const st = statSync(file);
      manifest[file] = [st.size, st.mtimeMs];
    }
    renameSync(tmp, bundle);
    writeFileSync(`${manifestFile}.${process.pid}.tmp`, JSON.stringify(manifest));
    renameSync(`${manifestFile}.${process.pid}.tmp`, manifestFile);
    return pathToFileURL(bundle);
  } catch {
    return source;
  }
}
