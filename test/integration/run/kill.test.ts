/**
 * A planning run killed with SIGKILL (a child process, no chance to clean up) leaves the previous
 * run complete and readable and the store openable: the run's results are only ever written in
 * one SQLite transaction (atomic commit, https://sqlite.org/atomiccommit.html), so a kill before
 * or during that write loses the new run whole. Uses the TEST-ONLY stand-in per-item function.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { startRun } from '../../../app/run/startRun';
import { dumpStore } from '../../../app/store/dump';
import { getLatestRun, getOrderLinesBySupplier, listRuns } from '../../../app/store/runs';
import { openStore } from '../../../app/store/store';
import { makeStore } from './fixtures/makeStore';

const dir = mkdtempSync(join(tmpdir(), 'provision-kill-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const CHILD = fileURLToPath(new URL('./fixtures/runChild.ts', import.meta.url));
const STAND_IN = {
  taskModule: new URL('./fixtures/standInPlanTask.ts', import.meta.url),
  taskExport: 'standInPlan',
  workers: 2,
};

/** Start the child; kill it with SIGKILL as soon as `when` says so for a progress event. */
function killWhen(
  store: string,
  spinMs: number,
  when: (p: { phase: string; done: number; total: number }) => boolean,
) {
  return new Promise<{
    killedAt: { phase: string; done: number; total: number } | null;
    signal: string | null;
  }>((resolve, reject) => {
    const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', CHILD, store, String(spinMs)], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let buf = '';
    let killedAt: { phase: string; done: number; total: number } | null = null;
    let err = '';
    child.stderr!.on('data', (d) => {
      err += d;
    });
    child.stdout!.on('data', (d) => {
      buf += d;
      let nl = buf.indexOf('\n');
      while (nl >= 0) {
        const line = buf.slice(0, nl);
        buf = buf.slice(nl + 1);
        nl = buf.indexOf('\n');
        const p = JSON.parse(line);
        if (!killedAt && p.phase && when(p)) {
          killedAt = p;
          child.kill('SIGKILL');
        }
      }
    });
    child.on('exit', (_code, signal) => {
      if (!killedAt) reject(new Error(`child finished before the kill: ${err}`));
      else resolve({ killedAt, signal });
    });
  });
}

describe('planning run killed with SIGKILL (child process, stand-in task)', () => {
  it('halfway through planning: the store is exactly as before and the previous run readable', async () => {
    const path = join(dir, 'half.sqlite');
    const skus = Array.from({ length: 120 }, (_, i) => `K-${i}`);
    const store = makeStore(path, skus, 30);
    const first = await startRun(store, STAND_IN).done;
    expect(first.status).toBe('complete');
    const before = dumpStore(store);
    store.close();

    const { killedAt, signal } = await killWhen(
      path,
      15,
      (p) => p.phase === 'planning' && p.done >= p.total / 2,
    );
    expect(signal).toBe('SIGKILL');
    expect(killedAt!.done).toBeLessThan(killedAt!.total);

    const again = openStore(path);
    expect(dumpStore(again)).toBe(before);
    expect(getLatestRun(again)!.id).toBe(first.runId);
    const lines = getOrderLinesBySupplier(again).groups.flatMap((g) => g.lines);
    expect(lines).toHaveLength(120);
    expect(lines.every((l) => l.planned)).toBe(true);
    expect(again.db.pragma('integrity_check', { simple: true })).toBe('ok');
    // And the store still takes a run afterwards.
    const next = await startRun(again, { ...STAND_IN, force: true }).done;
    expect(next.status).toBe('complete');
    again.close();
  });

  it('while the results are being written: either the whole new run or none of it', async () => {
    const path = join(dir, 'writing.sqlite');
    const skus = Array.from({ length: 600 }, (_, i) => `W-${i}`);
    const store = makeStore(path, skus, 30);
    const first = await startRun(store, STAND_IN).done;
    const before = dumpStore(store);
    store.close();

    const { killedAt } = await killWhen(path, 0, (p) => p.phase === 'writing');
    expect(killedAt!.phase).toBe('writing');

    const again = openStore(path);
    expect(again.db.pragma('integrity_check', { simple: true })).toBe('ok');
    const latest = getLatestRun(again)!;
    if (latest.id === first.runId) expect(dumpStore(again)).toBe(before);
    else expect(latest.itemsTotal).toBe(600);
    expect(listRuns(again).every((r) => r.status !== 'running')).toBe(true);
    expect(getOrderLinesBySupplier(again).groups.flatMap((g) => g.lines)).toHaveLength(600);
    again.close();
  });
});
