/**
 * `npm start` where Electron's binary is missing (as here: ELECTRON_SKIP_BINARY_DOWNLOAD): one
 * line saying so, then the preview on demo-store/demo.sqlite with its address on stdout, guarded
 * by the token. Skipped when an Electron binary is installed (then `npm start` opens a window).
 */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { electronBinary } from '../../../app/cli/start';

const ROOT = join(import.meta.dirname, '..', '..', '..');

describe.skipIf(electronBinary() !== null)('npm start without the Electron binary', () => {
  it('says so in one line and serves the preview on the demo store', async () => {
    const child = spawn('npm', ['start', '--silent'], {
      cwd: ROOT,
      detached: true,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    let err = '';
    child.stderr.on('data', (c) => {
      err += c;
    });
    try {
      const url = await new Promise<string>((ok, ko) => {
        const timer = setTimeout(() => ko(new Error(`no address in 90 s; stderr: ${err}`)), 90_000);
        child.stdout.on('data', (c) => {
          out += c;
          const m = /^(http:\/\/127\.0\.0\.1:\d+\/\?token=[\w-]+#\/items)\n/m.exec(out);
          if (m) {
            clearTimeout(timer);
            ok(m[1]);
          }
        });
        child.on('exit', (code) => ko(new Error(`npm start exited with ${code}; stderr: ${err}`)));
      });
      const notice = err.split('\n').filter((l) => l.includes('Electron'));
      expect(notice).toEqual([
        "Electron's binary is not installed (ELECTRON_SKIP_BINARY_DOWNLOAD); starting the browser preview on demo-store/demo.sqlite instead.",
      ]);
      const base = url.slice(0, url.indexOf('/?'));
      const token = new URL(url).searchParams.get('token') ?? '';
      expect((await fetch(`${base}/api/storeInfo`, { method: 'POST', body: '[]' })).status).toBe(401);
      const info = await fetch(`${base}/api/storeInfo`, {
        method: 'POST',
        body: '[]',
        headers: { 'x-provision-token': token },
      });
      const body = (await info.json()) as { result: { path: string; items: number } };
      expect(body.result.path).toBe(join(ROOT, 'demo-store', 'demo.sqlite'));
      expect(body.result.items).toBeGreaterThan(100);
    } finally {
      // the process group this test started: npm → tsx → node
      if (child.pid && child.exitCode === null) process.kill(-child.pid, 'SIGTERM');
    }
  }, 120_000);
});
