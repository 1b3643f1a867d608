/**
 * `npm run dist [-- --linux|--win|--mac …]`: package the desktop app with electron-builder
 * (electron-builder.yml: Linux AppImage + deb, Windows NSIS, macOS dmg; default: this platform).
 *
 * 1. build the screens (vite) and the shell (esbuild: dist-app/);
 * 2. stage the app in out/stage: package.json with the runtime dependencies only, the shell, the
 *    screens and the TypeScript sources the store process runs through tsx; `npm install
 *    --omit=dev` there;
 * 3. electron-builder, which rebuilds better-sqlite3 for Electron's ABI inside out/stage only —
 *    packaging time is the one moment the module is built for Electron, and the development tree
 *    (tests, CLI, preview) keeps its Node build.
 * It needs Electron's release download, so it cannot run on an offline machine.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ensureRendererBuilt, ROOT } from './renderer-build';
import { buildShell } from './shell-build';

const STAGE = join(ROOT, 'out', 'stage');

function run(cmd: string, args: string[], cwd: string): void {
  const r = spawnSync(cmd, args, { cwd, stdio: 'inherit', env: process.env });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (exit ${r.status ?? r.signal})`);
}

export function stagePackageJson(root: Record<string, unknown>): Record<string, unknown> {
  return {
    name: root.name,
    version: root.version,
    description: root.description,
    private: true,
    type: 'module',
    main: 'dist-app/main.js',
    author: 'Provision contributors',
    license: 'UNLICENSED',
    dependencies: root.dependencies,
  };
}

async function main(argv: string[]): Promise<void> {
  await ensureRendererBuilt();
  await buildShell();
  rmSync(STAGE, { recursive: true, force: true });
  mkdirSync(STAGE, { recursive: true });
  const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as Record<string, unknown>;
  writeFileSync(join(STAGE, 'package.json'), `${JSON.stringify(stagePackageJson(pkg), null, 2)}\n`);
  cpSync(join(ROOT, 'package-lock.json'), join(STAGE, 'package-lock.json'));
  for (const d of ['dist-app', 'dist-renderer', 'app', 'core', 'demo-store']) {
    cpSync(join(ROOT, d), join(STAGE, d), {
      recursive: true,
      filter: (src) =>
        !/\.sqlite(-wal|-shm)?$/.test(src) && !src.includes(`${join('demo-store', 'exports')}`),
    });
  }
  run('npm', ['install', '--omit=dev', '--no-audit', '--no-fund'], STAGE);
  const targets = argv.length > 0 ? argv : [];
  run(
    'npx',
    ['electron-builder', '--config', join(ROOT, 'electron-builder.yml'), '--publish', 'never', ...targets],
    ROOT,
  );
  process.stdout.write(`packages written to ${join(ROOT, 'out', 'dist')}\n`);
}

main(process.argv.slice(2)).catch((err: unknown) => {
  process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
