/**
 * The planning run end to end through the real command line and the REAL engine (core planItem):
 * a sales file imported with `import`, `run` (plain progress lines when stderr is not a terminal,
 * JSON summary last on stdout), a second `run` that reuses every unchanged item, `--items`, `plan`
 * exporting one line per item, and Ctrl-C (SIGINT) cancelling cleanly with exit code 130.
 */
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';
import { afterAll, describe, expect, it } from 'vitest';
import { dumpStore } from '../../../app/store/dump';
import { getItemRunResult, getLatestRun, listRuns } from '../../../app/store/runs';
import { openStore } from '../../../app/store/store';
import { addWeeks, FIRST_WEEK } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-cli-run-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const MAIN = fileURLToPath(new URL('../../../app/cli/main.ts', import.meta.url));
const cli = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', MAIN, ...args], { encoding: 'utf8' });
const lastJson = (s: string) => JSON.parse(s.trim().split('\n').pop()!);

/** week,sku,qty for `items` SKUs × `weeks` weeks: AR(1)-like numbers from an LCG (Numerical Recipes). */
function salesFile(path: string, items: number, weeks: number): void {
  let s = 42;
  const rand = () => {
    s = (Math.imul(1664525, s) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
  const lines = ['week,sku,qty'];
  for (let i = 0; i < items; i++) {
    let dev = 0;
    for (let k = 0; k < weeks; k++) {
      dev = 0.5 * dev + 10 * (rand() - 0.5);
      lines.push(`${addWeeks(FIRST_WEEK, k)},C-${i},${Math.max(0, Math.round(50 + dev))}`);
    }
  }
  writeFileSync(path, `${lines.join('\n')}\n`);
}

describe('run and plan through the CLI with the real engine', () => {
  it('plans, reuses, plans a subset, exports', () => {
    const db = join(dir, 'cli.sqlite');
    const sales = join(dir, 'sales.csv');
    salesFile(sales, 4, 60);
    expect(cli('import', sales, '--store', db, '--kind', 'sales').status).toBe(0);

    const r1 = cli('run', '--store', db);
    expect(r1.status, r1.stderr).toBe(0);
    const s1 = lastJson(r1.stdout);
    expect(s1).toMatchObject({ status: 'complete', planned: 4, reused: 0, failed: 0 });
    expect(r1.stderr).toMatch(/^planning \d+\/4 /m); // plain lines: stderr is a pipe here
    expect(r1.stderr).toMatch(/^done 4\/4 \(100%\)/m);

    const store = openStore(db);
    const res = getItemRunResult(store, 'C-0')!;
    expect(res.status).toBe('planned');
    expect(res.model).not.toBeNull();
    expect(res.forecast).toHaveLength(26); // DEFAULT_WORKSPACE.horizonWeeks
    expect(res.order).not.toBeNull();
    store.close();

    const r2 = cli('run', '--store', db);
    const s2 = lastJson(r2.stdout);
    // Unchanged inputs are reused — unless the planning code itself changed between the two runs
    // (the code version is part of the fingerprint; it moves while core/ is being edited).
    const versions = (() => {
      const st = openStore(db);
      const v = listRuns(st).map((r) => (r.settings as { codeVersion: string }).codeVersion);
      st.close();
      return v;
    })();
    if (versions[0] === versions[1]) expect(s2).toMatchObject({ status: 'complete', planned: 0, reused: 4 });
    else expect(s2).toMatchObject({ status: 'complete', planned: 4, reused: 0 });
    const r3 = cli('run', '--store', db, '--items', 'C-1,C-2', '--force');
    expect(lastJson(r3.stdout)).toMatchObject({ status: 'complete', planned: 2, reused: 2 });
    const bad = cli('run', '--store', db, '--workers', 'two');
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain("--workers must be a whole number ≥ 1, got 'two'");

    const out = join(dir, 'orders.csv');
    expect(cli('plan', '--store', db, '--out', out).status).toBe(0);
    const rows = parse(readFileSync(out, 'utf8'), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.sku)).toEqual(['C-0', 'C-1', 'C-2', 'C-3']);
    for (const r of rows) {
      expect(Number(r.order_qty)).toBeGreaterThanOrEqual(0);
      expect(Number(r.order_up_to)).toBeGreaterThan(0);
      expect(r.explanation.length).toBeGreaterThan(20);
    }
  });

  it('Ctrl-C cancels a run: exit 130, nothing written, the previous run stays the latest', async () => {
    const db = join(dir, 'sigint.sqlite');
    const sales = join(dir, 'sales-int.csv');
    salesFile(sales, 40, 60);
    expect(cli('import', sales, '--store', db, '--kind', 'sales').status).toBe(0);
    const before = (() => {
      const s = openStore(db);
      const d = dumpStore(s);
      s.close();
      return d;
    })();
    const child = spawn(process.execPath, ['--import', 'tsx', MAIN, 'run', '--store', db], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let err = '';
    let out = '';
    let sent = false;
    child.stdout.on('data', (d) => {
      out += d;
    });
    child.stderr.on('data', (d) => {
      err += d;
      if (!sent && /^planning /m.test(err)) {
        sent = true;
        child.kill('SIGINT');
      }
    });
    const code = await new Promise<number | null>((res) => child.on('exit', (c) => res(c)));
    expect(sent).toBe(true);
    expect(code).toBe(130);
    expect(err).toContain('run cancelled; the previous run is unchanged');
    expect(lastJson(out)).toMatchObject({ status: 'cancelled', planned: 0 });
    const s = openStore(db);
    expect(getLatestRun(s)).toBeNull();
    // Only the record of the cancelled attempt was added (one planning_runs row, no results).
    const after = dumpStore(s).split('\n');
    const added = after.filter((l) => !before.split('\n').includes(l));
    expect(added.filter((l) => !l.startsWith('## planning_runs'))).toHaveLength(1);
    expect(added.find((l) => l.startsWith('['))).toContain('"cancelled"');
    s.close();
  });
});
