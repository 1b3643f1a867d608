/**
 * `fit` over many files on several threads (app/cli/fit-parallel.ts): the same lines in the same
 * order as on one thread, input errors still reported per file (in file order) and counted in
 * the exit code, the other files still fitted.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { MessageChannel } from 'node:worker_threads';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FitWorkerData, FitWorkerMessage } from '../../app/cli/fit-parallel';
import { fitFilesOnCores, PARALLEL_FROM } from '../../app/cli/fit-parallel';
import { bundleIsCurrent, fitWorkerEntry } from '../../app/cli/fit-worker-entry';
import { startTsWorker } from '../../app/run/tsWorker';
import { createRng, simulateArma } from '../../core/arma';

const root = join(import.meta.dirname, '..', '..');
let dir = '';
const files: string[] = [];
const BAD = new Map([
  [7, 'badnum'],
  [41, 'baddate'],
]);

function runFit(args: string[]) {
  return spawnSync(process.execPath, ['--import', 'tsx', join(root, 'app/cli/main.ts'), 'fit', ...args], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 1 << 28,
  });
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'provision-cli-threads-'));
  const rng = createRng(5);
  const start = Date.UTC(2024, 0, 1);
  for (let i = 0; i < PARALLEL_FROM + 6; i++) {
    const file = join(dir, `item${String(i).padStart(3, '0')}.csv`);
    const y = simulateArma({ ar: [0.5], ma: [0.2], sigma2: 9, mean: 40 }, 60, rng);
    const lines = ['week,qty'];
    for (let t = 0; t < y.length; t++) {
      lines.push(`${new Date(start + t * 7 * 86400000).toISOString().slice(0, 10)},${y[t].toFixed(1)}`);
    }
    if (BAD.get(i) === 'badnum') lines[12] = '2024-03-18,4O.5';
    if (BAD.get(i) === 'baddate') lines[30] = '2024-02-30,12';
    writeFileSync(file, `${lines.join('\n')}\n`);
    files.push(file);
  }
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('fit on several threads', () => {
  it('prints what one thread prints, in file order, with the bad files named on stderr', () => {
    const args = [...files, '--order', '1,0,1', '--horizon', '4'];
    const many = runFit([...args, '--threads', '2']);
    const one = runFit([...args, '--threads', '1']);
    expect(one.status).toBe(1);
    expect(many.status).toBe(1);
    expect(many.stdout).toBe(one.stdout);
    const lines = many.stdout.trim().split('\n');
    expect(lines.length).toBe(files.length - BAD.size);
    const good = files.filter((_, i) => !BAD.has(i));
    expect(lines.map((l) => JSON.parse(l).file)).toEqual(good);
    const errors = many.stderr.trim().split('\n');
    expect(errors).toEqual(one.stderr.trim().split('\n'));
    expect(errors.length).toBe(2);
    expect(errors[0]).toContain(`${files[7]}: line 13: field 'qty': '4O.5'`);
    expect(errors[1]).toContain(`${files[41]}: line 31: field 'week': '2024-02-30'`);
  }, 60_000);

  it('a worker (started from its bundle) takes files from the shared counter and posts each outcome', async () => {
    const counter = new SharedArrayBuffer(4);
    // The command's thread has taken the first 10 files already.
    Atomics.store(new Int32Array(counter), 0, 10);
    const { port1, port2 } = new MessageChannel();
    const data: FitWorkerData = {
      counter,
      port: port2,
      files: files.slice(0, 45),
      options: {
        order: { p: 1, d: 0, q: 1 },
        includeMean: undefined,
        horizon: 4,
        dateColumn: 'week',
        valueColumn: 'qty',
        search: 'stepwise',
        backtest: false,
        threads: null,
      },
    };
    const got: FitWorkerMessage[] = [];
    port1.on('message', (m: FitWorkerMessage) => got.push(m));
    const entry = await fitWorkerEntry();
    expect(entry.pathname.endsWith('/node_modules/.cache/provision/fit-worker.mjs')).toBe(true);
    const worker = startTsWorker(entry, { workerData: data, transferList: [port2] });
    await new Promise((resolve) => worker.once('exit', resolve));
    await new Promise((resolve) => setTimeout(resolve, 50));
    port1.close();
    expect(got.map((m) => m.index)).toEqual(Array.from({ length: 35 }, (_, i) => i + 10));
    const bad = got.find((m) => m.index === 41);
    expect(bad && 'outcome' in bad && 'error' in bad.outcome ? bad.outcome.error : '').toContain(
      "field 'week'",
    );
    expect(got.filter((m) => 'outcome' in m && 'line' in m.outcome).length).toBe(34);
  }, 30_000);

  it('a file taken by a worker that died is fitted by the command itself', async () => {
    const options = {
      order: { p: 1, d: 0, q: 1 },
      includeMean: undefined,
      horizon: 4,
      dateColumn: 'week',
      valueColumn: 'qty',
      search: 'stepwise' as const,
      backtest: false,
      threads: null,
    };
    const lines: string[] = [];
    const errors: string[] = [];
    // Ten rounds of the files, so that the command's thread is still busy when the workers start.
    const many = Array.from({ length: 10 }, () => files).flat();
    const note = join(dir, 'lost.txt');
    process.env.FIT_WORKER_DIES_NOTE = note;
    const failed = await fitFilesOnCores(
      many,
      options,
      { line: (t) => lines.push(t), error: (t) => errors.push(t) },
      3,
      new URL('./fixtures/fit-worker-dies.mjs', import.meta.url),
    );
    delete process.env.FIT_WORKER_DIES_NOTE;
    // Both stand-ins took a file each before dying, and the command fitted those too.
    const lost = readFileSync(note, 'utf8').trim().split('\n').map(Number);
    expect(lost.length).toBe(2);
    expect(lost.every((i) => i >= 0 && i < many.length)).toBe(true);
    expect(failed).toBe(20);
    expect(lines.map((l) => JSON.parse(l).file)).toEqual(many.filter((_, i) => !BAD.has(i % files.length)));
    expect(errors.length).toBe(20);
  }, 60_000);

  it('the bundle counts as current only while every input keeps its size and modification time', () => {
    const input = join(dir, 'input.ts');
    const bundle = join(dir, 'bundle.mjs');
    const manifest = join(dir, 'inputs.json');
    writeFileSync(input, 'export const a = 1;\n');
    writeFileSync(bundle, '');
    const st = statSync(input);
    writeFileSync(manifest, JSON.stringify({ [input]: [st.size, st.mtimeMs] }));
    expect(bundleIsCurrent(manifest, bundle)).toBe(true);
    utimesSync(input, new Date(), new Date(Date.now() + 5000));
    expect(bundleIsCurrent(manifest, bundle)).toBe(false);
    expect(bundleIsCurrent(join(dir, 'missing.json'), bundle)).toBe(false);
  });

  it('refuses a bad --threads value', () => {
    const r = runFit([files[0], '--threads', '0']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("--threads '0' must be a whole number from 1 to 64");
  });
});
