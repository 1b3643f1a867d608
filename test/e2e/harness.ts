/**
 * What the end-to-end tests share: finding Debian's chromium, starting `npm run preview` on a store
 * and reading the one line it prints, and a browser with the flags a headless CI machine needs.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type BrowserContext, chromium } from 'playwright-core';

export const ROOT = join(import.meta.dirname, '..', '..');
export const SCREENSHOTS = join(ROOT, 'test', 'e2e', 'screenshots');

/** The chromium to drive: $CHROMIUM_PATH, else Debian's /usr/bin/chromium; null when neither exists. */
export function findChromium(): string | null {
  const candidates = [process.env.CHROMIUM_PATH, '/usr/bin/chromium'].filter((p): p is string => !!p);
  return candidates.find((p) => existsSync(p)) ?? null;
}

export interface Preview {
  url: string;
  token: string;
  base: string;
  process: ChildProcess;
  stop(): Promise<void>;
}

/** Start `npm run preview -- --store FILE` and wait for the address line. */
export function startPreview(storePath: string, port = 0): Promise<Preview> {
  return new Promise((ok, ko) => {
    const child = spawn('npm', ['run', '-s', 'preview', '--', '--store', storePath, '--port', String(port)], {
      cwd: ROOT,
      detached: true,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    let err = '';
    const timer = setTimeout(
      () => ko(new Error(`preview did not print its address in 60 s; stderr: ${err}`)),
      60_000,
    );
    child.stderr?.on('data', (c) => {
      err += c;
    });
    child.on('exit', (code) => {
      clearTimeout(timer);
      ko(new Error(`preview exited with ${code} before printing its address; stderr: ${err}`));
    });
    child.stdout?.on('data', (c) => {
      out += c;
      const line = out.split('\n')[0];
      if (!out.includes('\n')) return;
      clearTimeout(timer);
      const url = line.trim();
      const parsed = new URL(url);
      const stop = () =>
        new Promise<void>((done) => {
          if (child.exitCode !== null) return done();
          child.removeAllListeners('exit');
          child.on('exit', () => done());
          // The whole group npm → tsx → node, which this test started.
          if (child.pid) process.kill(-child.pid, 'SIGTERM');
        });
      ok({
        url,
        token: parsed.searchParams.get('token') ?? '',
        base: `${parsed.protocol}//${parsed.host}`,
        process: child,
        stop,
      });
    });
  });
}

/** A fresh profile each time (playwright passes it to chromium as --user-data-dir). */
export async function launchBrowser(
  executablePath: string,
  options: { colorScheme?: 'light' | 'dark' } = {},
): Promise<{ context: BrowserContext; profile: string }> {
  const profile = mkdtempSync(join(tmpdir(), 'provision-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath,
    headless: true,
    viewport: { width: 1440, height: 900 },
    colorScheme: options.colorScheme ?? 'light',
    acceptDownloads: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--no-first-run',
      '--disable-sync',
    ],
  });
  mkdirSync(SCREENSHOTS, { recursive: true });
  return { context, profile };
}
