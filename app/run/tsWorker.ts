/**
 * Start a worker thread on a TypeScript module. Node 20 does not apply the `--import tsx` hooks to
 * a worker's entry file, so the worker starts from a tiny evaluated bootstrap that registers tsx's
 * ESM loader inside the worker and then imports the real entry. This works the same under the CLI
 * (tsx) and under vitest, which both leave plain `.ts` files on disk. A `.js`/`.mjs` entry (a
 * bundled build) is started directly, without tsx.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker, type WorkerOptions } from 'node:worker_threads';

let tsxApiUrl: string | null = null;

/** file: URL of tsx's ESM register API (its "import" export; the CommonJS one fails in workers). */
function tsxRegisterUrl(): string {
  if (tsxApiUrl) return tsxApiUrl;
  const require = createRequire(import.meta.url);
  tsxApiUrl = pathToFileURL(
    join(dirname(require.resolve('tsx/package.json')), 'dist/esm/api/index.mjs'),
  ).href;
  return tsxApiUrl;
}

export function startTsWorker(entry: URL, options: Omit<WorkerOptions, 'eval'> = {}): Worker {
  if (!/\.(c|m)?ts$/.test(entry.pathname)) return new Worker(entry, options);
  const source = [
    `import(${JSON.stringify(tsxRegisterUrl())})`,
    `  .then((tsx) => { tsx.register(); return import(${JSON.stringify(entry.href)}); });`,
  ].join('\n');
  return new Worker(source, { ...options, eval: true });
}

/**
 * URL of a module beside `here` with the same extension as `here`: `.ts` from source, `.js` (or
 * `.mjs`) in a build that keeps the run's modules as separate files.
 */
export function siblingModule(name: string, here: string): URL {
  const ext = /\.(c|m)?(t|j)s$/.exec(new URL(here).pathname)?.[0] ?? '.ts';
  return new URL(`./${name}${ext}`, here);
}
