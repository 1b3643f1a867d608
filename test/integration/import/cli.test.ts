import { spawn, spawnSync } from 'node:child_process';
import { existsSync, statSync, truncateSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { dumpStore } from '../../../app/store/dump';
import { openStore } from '../../../app/store/store';
import { tempDir, writeCsv } from './helpers';

const root = join(import.meta.dirname, '..', '..', '..');
const { dir, cleanup } = tempDir('provision-cli-');
afterAll(cleanup);

function cli(args: string[]): {
  status: number | null;
  stdout: string;
  stderr: string;
  json: Record<string, unknown>;
} {
  const r = spawnSync(process.execPath, ['--import', 'tsx', join(root, 'app/cli/main.ts'), ...args], {
    cwd: root,
    encoding: 'utf8',
  });
  const lines = r.stdout.trim().split('\n');
  let json: Record<string, unknown> = {};
  try {
    json = JSON.parse(lines[lines.length - 1]);
  } catch {
    // usage errors print no summary
  }
  return { status: r.status, stdout: r.stdout, stderr: r.stderr, json };
}

describe('import command', () => {
  it('creates the store, echoes the mapping and ends stdout with the JSON summary', () => {
    const store = join(dir, 'new.sqlite');
    const f = writeCsv(dir, 'a.csv', 'Week,Item Code,Qty\n2026-11-02,A,3\n');
    const r = cli(['import', f, '--store', store, '--kind', 'sales']);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('mapping: "Item Code" → sku');
    expect(Object.keys(r.json)).toEqual([
      'status',
      'rowsRead',
      'items',
      'weeks',
      'warnings',
      'errors',
      'mapping',
    ]);
    expect(r.json).toMatchObject({ status: 'imported', rowsRead: 1, items: 1, weeks: 1, errors: [] });
    expect(existsSync(store)).toBe(true);
  });

  it('exits non-zero on any error, having written nothing', () => {
    const store = join(dir, 'rej.sqlite');
    const ok = writeCsv(dir, 'ok.csv', 'week,sku,qty\n2026-11-02,A,3\n');
    cli(['import', ok, '--store', store, '--kind', 'sales', '--map', 'qty=qty']);
    const s = openStore(store);
    const before = dumpStore(s);
    s.close();
    const bad = writeCsv(dir, 'bad.csv', 'week,sku,qty\n2026-11-09,A,3\n2026-11-09,B,lots\n');
    const r = cli(['import', bad, '--store', store, '--kind', 'sales']);
    expect(r.status).toBe(1);
    expect(r.json.status).toBe('rejected');
    expect(r.json.errors).toEqual([
      {
        line: 3,
        column: 'qty',
        value: 'lots',
        message: `${bad.split('/').pop()} line 3, column 'qty': 'lots' is not a number`,
      },
    ]);
    expect(r.stderr).toContain('rejected: nothing was written');
    const s2 = openStore(store);
    expect(dumpStore(s2)).toBe(before);
    s2.close();
  });

  it('gives a clear error for a non-SQLite or truncated --store, not a crash', () => {
    const f = writeCsv(dir, 'c.csv', 'week,sku,qty\n2026-11-02,A,3\n');
    const text = join(dir, 'text.sqlite');
    writeFileSync(text, 'this is a shopping list, not a database\n'.repeat(10));
    const r = cli(['import', f, '--store', text, '--kind', 'sales']);
    expect(r.status).toBe(1);
    expect((r.json.errors as { message: string }[])[0].message).toBe(
      `${text}: not a Provision store (the file is not a SQLite database). Choose a store file, or a new file name to create one.`,
    );
    expect(r.stderr).not.toMatch(/at .*\.ts:\d+/); // no stack trace
    const cut = join(dir, 'cut.sqlite');
    const made = openStore(cut, { create: true });
    made.db.exec("INSERT INTO suppliers (name, created_at) VALUES ('Hollowbrook Mill', 'now')");
    made.close();
    truncateSync(cut, Math.floor(statSync(cut).size * 0.6));
    const t = cli(['import', f, '--store', cut, '--kind', 'sales', '--force']);
    expect(t.status).toBe(1);
    expect((t.json.errors as { message: string }[])[0].message).toMatch(
      /cut\.sqlite: the store file is damaged/,
    );
  });

  it('refuses bad usage with exit code 2', () => {
    expect(cli(['import', 'x.csv', '--store', join(dir, 'u.sqlite')]).status).toBe(2);
    expect(cli(['import', 'x.csv', '--store', join(dir, 'u.sqlite'), '--kind', 'orders']).status).toBe(2);
    expect(
      cli(['import', 'x.csv', '--store', join(dir, 'u.sqlite'), '--kind', 'sales', '--date-order', 'ymd'])
        .status,
    ).toBe(2);
  });
});

describe('a killed import', () => {
  it('leaves the store exactly as it was, and the store opens again', async () => {
    const store = join(dir, 'kill.sqlite');
    const seed = writeCsv(dir, 'seed.csv', 'week,sku,qty\n2026-11-02,A,3\n2026-11-02,B,4\n');
    expect(cli(['import', seed, '--store', store, '--kind', 'sales']).status).toBe(0);
    const s = openStore(store);
    const before = dumpStore(s);
    s.close();
    // A file large enough that writing it takes a while: 3,000 SKUs × 100 weeks, weekly buckets.
    const lines = ['week,sku,qty'];
    for (let w = 0; w < 100; w++) {
      const week = new Date(Date.UTC(2024, 0, 1) + w * 7 * 86400000).toISOString().slice(0, 10);
      for (let k = 0; k < 3000; k++) lines.push(`${week},K${k},${(k * 7 + w) % 50}`);
    }
    const big = writeCsv(dir, 'big.csv', `${lines.join('\n')}\n`);
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', join(root, 'app/cli/main.ts'), 'import', big, '--store', store, '--kind', 'sales'],
      { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] },
    );
    let stdout = '';
    child.stdout.on('data', (d) => {
      stdout += d;
    });
    // The CLI says on stderr when its write transaction starts; kill it 30 ms into the write.
    child.stderr.on('data', (d: Buffer) => {
      if (d.toString().includes('writing to the store')) setTimeout(() => child.kill('SIGKILL'), 30);
    });
    const signal = await new Promise<NodeJS.Signals | null>((r) => child.on('exit', (_code, sig) => r(sig)));
    expect(signal).toBe('SIGKILL');
    expect(stdout).not.toContain('"status"'); // it died before finishing
    const after = openStore(store);
    expect(dumpStore(after)).toBe(before);
    after.close();
  }, 60_000);
});
