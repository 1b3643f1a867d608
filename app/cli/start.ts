/**
 * `npm start`: the Electron window where Electron's binary is installed; otherwise one line saying
 * so, then the browser preview on demo-store/demo.sqlite (built first when missing), printing its
 * address. better-sqlite3 is never rebuilt here: in the window the store lives in a plain Node
 * child process (see app/main.ts), so `npm test` works the same before and after `npm start`.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ensureRendererBuilt, ROOT } from './renderer-build';
import { servePreview } from './serve-preview';

export const DEMO_STORE = join(ROOT, 'demo-store', 'demo.sqlite');

/** The Electron executable when its binary is installed (node_modules/electron/path.txt + dist/), else null. */
export function electronBinary(): string | null {
  const dir = join(ROOT, 'node_modules', 'electron');
  const pathFile = join(dir, 'path.txt');
  if (!existsSync(pathFile)) return null;
  const exe = join(dir, 'dist', readFileSync(pathFile, 'utf8').trim());
  return existsSync(exe) ? exe : null;
}

async function ensureDemoStore(): Promise<void> {
  if (existsSync(DEMO_STORE)) return;
  process.stderr.write(`Building the demo store ${DEMO_STORE} …\n`);
  const { buildDemoStore } = await import('../../demo-store/build');
  await buildDemoStore(DEMO_STORE);
}

async function main(): Promise<void> {
  const exe = electronBinary();
  await ensureDemoStore();
  if (!exe) {
    process.stderr.write(
      "Electron's binary is not installed (ELECTRON_SKIP_BINARY_DOWNLOAD); starting the browser preview on demo-store/demo.sqlite instead.\n",
    );
    await servePreview({ storePath: DEMO_STORE });
    return;
  }
  await ensureRendererBuilt();
  const { buildShell } = await import('./shell-build');
  await buildShell();
  const child = spawn(exe, [ROOT], {
    stdio: 'inherit',
    env: { ...process.env, PROVISION_DEMO_STORE: DEMO_STORE, PROVISION_NODE: process.execPath },
  });
  child.on('exit', (code) => process.exit(code ?? 0));
}

const isMain = process.argv[1] && import.meta.filename === process.argv[1];
if (isMain) {
  main().catch((err: unknown) => {
    process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(1);
  });
}
