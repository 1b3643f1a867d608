/**
 * The Electron shell's data path without Electron: the IPC handler (sender check, validation) in
 * front of the service host, a separate Node process holding the store, reached over a fork IPC
 * channel exactly as app/main.ts does in development. Also the recent-stores list.
 */
import { fork } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectHost, type HostClient } from '../../../app/transport/host-client';
import type { HostChannel } from '../../../app/transport/host-protocol';
import { handleIpcCall, isOwnPage } from '../../../app/transport/ipc';
import { MAX_RECENT, readRecent, rememberStore } from '../../../app/transport/recent-stores';
import { polynomialRoots } from '../../../core/arma/roots';
import { DEFAULT_WORKSPACE } from '../../../core/plan/types';

const ROOT = join(import.meta.dirname, '..', '..', '..');
const dir = mkdtempSync(join(tmpdir(), 'provision-host-'));

function startHost(storePath: string): HostChannel {
  const child = fork(join(ROOT, 'app', 'transport', 'service-host-entry.ts'), ['--store', storePath], {
    execArgv: ['--import', 'tsx'],
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  return {
    send: (m) => child.send(m as never),
    onMessage: (l) => child.on('message', l),
    onExit: (l) => child.on('exit', (code) => l(code)),
    kill: () => child.kill(),
  };
}

let host: HostClient;
const OWN = 'app://provision/index.html#/items';

beforeAll(async () => {
  host = await connectHost(startHost(join(dir, 'shell.sqlite')), join(dir, 'shell.sqlite'));
});

afterAll(async () => {
  await host?.close();
});

describe('IPC to the service host', () => {
  it('answers calls from our own page through the store process', async () => {
    const info = await handleIpcCall(host, OWN, 'storeInfo', []);
    expect(info.ok).toBe(true);
    expect(info.ok && (info.value as { items: number }).items).toBe(0);
    const saved = await handleIpcCall(host, OWN, 'saveSettings', [
      { ...DEFAULT_WORKSPACE, horizonWeeks: 30 },
    ]);
    expect(saved.ok && (saved.value as { horizonWeeks: number }).horizonWeeks).toBe(30);
    const again = await handleIpcCall(host, OWN, 'getSettings', []);
    expect(again.ok && (again.value as { horizonWeeks: number }).horizonWeeks).toBe(30);
  });

  it('refuses calls from any other page, unknown methods and bad arguments before the host sees them', async () => {
    for (const url of [
      'https://example.com/',
      'file:///etc/passwd',
      'app://other/index.html',
      'devtools://x',
      '',
    ]) {
      expect(isOwnPage(url)).toBe(false);
      expect(await handleIpcCall(host, url, 'storeInfo', [])).toEqual({
        ok: false,
        message: 'refused: the call did not come from Provision’s own page',
      });
    }
    expect(await handleIpcCall(host, OWN, 'require', ['fs'])).toMatchObject({
      ok: false,
      message: /unknown method/,
    });
    expect(await handleIpcCall(host, OWN, 'getItem', [{ sku: 1 }])).toMatchObject({
      ok: false,
      message: 'getItem: sku must be a string (got {"sku":1})',
    });
  });

  it('passes the service’s own refusals back in words', async () => {
    expect(await handleIpcCall(host, OWN, 'getItem', ['NO-SUCH'])).toEqual({
      ok: false,
      message: "unknown SKU 'NO-SUCH'",
    });
    expect(await handleIpcCall(null, OWN, 'storeInfo', [])).toEqual({
      ok: false,
      message: 'no store is open: use File → Open store…',
    });
  });

  it('reports a store that cannot be opened instead of hanging', async () => {
    const bad = join(dir, 'not-a-store.sqlite');
    writeFileSync(
      bad,
      'this is a text file, not SQLite, and long enough to have a header of 100 bytes ........................',
    );
    await expect(connectHost(startHost(bad), bad)).rejects.toThrow(/not a Provision store/);
  });
});

describe('recent stores', () => {
  it('keeps the newest first, without duplicates or vanished files, at most ten', () => {
    const file = join(dir, 'user', 'recent.json');
    expect(readRecent(file)).toEqual([]);
    const stores = Array.from({ length: 12 }, (_, i) => {
      const p = join(dir, `s${i}.sqlite`);
      writeFileSync(p, '');
      return p;
    });
    for (const p of stores) rememberStore(file, p);
    rememberStore(file, stores[5]);
    const list = readRecent(file);
    expect(list).toHaveLength(MAX_RECENT);
    expect(list[0]).toBe(stores[5]);
    expect(list[1]).toBe(stores[11]);
    expect(new Set(list).size).toBe(list.length);
    expect(existsSync(file)).toBe(true);
  });
});

describe('polynomialRoots (for the unit-circle chart)', () => {
  it('gives the roots of φ(z) = 1 − 0.5z + 0.3z² by the quadratic formula', () => {
    // 0.3z² − 0.5z + 1 = 0 → z = (0.5 ± i√(1.2 − 0.25)) / 0.6 (quadratic formula), |z| = √(1/0.3)
    const r = polynomialRoots([0.5, -0.3]).sort((a, b) => a.im - b.im);
    expect(r).toHaveLength(2);
    expect(r[0].re).toBeCloseTo(0.5 / 0.6, 10);
    expect(r[1].im).toBeCloseTo(Math.sqrt(0.95) / 0.6, 10);
    expect(Math.hypot(r[0].re, r[0].im)).toBeCloseTo(Math.sqrt(1 / 0.3), 10);
    // AR(1) φ = 0.8: root 1/0.8 = 1.25 on the real axis
    const ar1 = polynomialRoots([0.8]);
    expect(ar1).toHaveLength(1);
    expect(ar1[0].re).toBeCloseTo(1.25, 12);
    expect(Math.abs(ar1[0].im)).toBe(0);
    expect(polynomialRoots([])).toEqual([]);
  });
});
