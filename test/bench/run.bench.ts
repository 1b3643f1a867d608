/**
 * Benchmark of the weekly planning run, end to end through the real command line:
 *   1. write a sales file alone (week,sku,qty) for N items × 156 weeks, seeded, so every item is a
 *      placeholder on the workspace defaults;
 *   2. `npm run -s cli -- import FILE --store DB --kind sales`;
 *   3. `/usr/bin/time -v npm run -s cli -- run --store DB` (automatic model choice for every item);
 *   4. `npm run -s cli -- plan --store DB --out FILE.csv`, and count its lines.
 * For N = 1,000 and N = 10,000 (BENCH_RUN_SIZES=1000,10000 to change). Prints wall time, peak RSS
 * of the largest process (GNU time's "Maximum resident set size": the largest single process of
 * the tree it waited for; worker threads are threads of the CLI's node process, so their memory is
 * inside that one figure), the per-item time, and the scaling from the smallest to the largest N.
 * Targets (issue 5): 10,000 items ≤ 60 s wall and ≤ 1 GB peak RSS on this 2-core machine.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { listRuns } from '../../app/store/runs';
import { openStore } from '../../app/store/store';
import { writeBenchSales } from './benchSales';

const WEEKS = 156;
const sizes = (process.env.BENCH_RUN_SIZES ?? '1000,10000').split(',').map(Number);
const root = join(import.meta.dirname, '..', '..');
const dir = mkdtempSync(join(tmpdir(), 'provision-run-bench-'));

interface Timed {
  wallSeconds: number;
  maxRssKb: number;
  cpuSeconds: number;
  status: number | null;
  stdout: string;
  stderr: string;
}

function timed(args: string[]): Timed {
  const r = spawnSync('/usr/bin/time', ['-v', 'npm', 'run', '-s', 'cli', '--', ...args], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  const wall = /Elapsed \(wall clock\) time \(h:mm:ss or m:ss\): (?:(\d+):)?(\d+):([\d.]+)/.exec(r.stderr);
  const rss = /Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr);
  const user = /User time \(seconds\): ([\d.]+)/.exec(r.stderr);
  const sys = /System time \(seconds\): ([\d.]+)/.exec(r.stderr);
  const wallSeconds = wall
    ? Number(wall[1] ?? 0) * 3600 + Number(wall[2]) * 60 + Number(wall[3])
    : Number.NaN;
  return {
    wallSeconds,
    maxRssKb: rss ? Number(rss[1]) : Number.NaN,
    cpuSeconds: Number(user?.[1] ?? Number.NaN) + Number(sys?.[1] ?? Number.NaN),
    status: r.status,
    stdout: r.stdout,
    stderr: r.stderr,
  };
}

/** Why a rerun planned again: the planning code's version is part of every item's fingerprint. */
function codeVersionNote(db: string): string {
  const store = openStore(db, { readonly: true });
  try {
    const [b, a] = listRuns(store, 2).map((r) => (r.settings as { codeVersion?: string }).codeVersion);
    return a !== b ? `the planning code changed between the runs: ${a} → ${b}` : 'same code version';
  } finally {
    store.close();
  }
}

function lastJson(text: string): Record<string, unknown> {
  const lines = text.trim().split('\n');
  return JSON.parse(lines[lines.length - 1]);
}

const MAX_PROJECTED = Number(process.env.BENCH_RUN_MAX_SECONDS ?? 1200);
const load = () =>
  loadavg()
    .map((x) => x.toFixed(1))
    .join(' ');
process.stdout.write(`machine: ${availableParallelism()} cores, load average ${load()} at start\n`);

const results: { n: number; wall: number; rssMb: number; msPerItemWall: number; msPerItemWorker: number }[] =
  [];
try {
  for (const n of sizes) {
    const prior = results[results.length - 1];
    if (prior && (prior.wall * n) / prior.n > MAX_PROJECTED) {
      process.stdout.write(
        `N=${n}: SKIPPED: projected ${((prior.wall * n) / prior.n).toFixed(0)} s from N=${prior.n} exceeds ` +
          `BENCH_RUN_MAX_SECONDS=${MAX_PROJECTED} (set it higher to measure anyway)\n`,
      );
      continue;
    }
    const sales = join(dir, `sales-${n}.csv`);
    const db = join(dir, `store-${n}.sqlite`);
    const csv = join(dir, `orders-${n}.csv`);
    await writeBenchSales(sales, n, WEEKS);
    const imp = timed(['import', sales, '--store', db, '--kind', 'sales']);
    if (imp.status !== 0) throw new Error(`import failed:\n${imp.stderr.slice(-2000)}`);
    const impSummary = lastJson(imp.stdout);
    process.stdout.write(
      `N=${n}: import ${impSummary.rowsRead} rows, ${impSummary.items} items: ${imp.wallSeconds.toFixed(1)} s, ${(imp.maxRssKb / 1024).toFixed(0)} MB\n`,
    );
    rmSync(sales, { force: true });
    const run = timed(['run', '--store', db]);
    if (run.status !== 0) throw new Error(`run failed:\n${run.stderr.slice(-2000)}`);
    const s = lastJson(run.stdout) as {
      planned: number;
      failed: number;
      flagged: number;
      seconds: number;
      msPerItem: number;
      itemsPerSecond: number;
    };
    const planning = s.itemsPerSecond > 0 ? s.planned / s.itemsPerSecond : 0;
    const rssMb = run.maxRssKb / 1024;
    process.stdout.write(
      `N=${n}: run ${run.wallSeconds.toFixed(1)} s wall, ${run.cpuSeconds.toFixed(1)} s CPU, peak RSS ${rssMb.toFixed(0)} MB; ` +
        `${s.planned} planned, ${s.failed} failed, ${s.flagged} flagged\n` +
        `        planning ${planning.toFixed(1)} s (${s.itemsPerSecond.toFixed(0)} items/s), everything else ` +
        `${(run.wallSeconds - planning).toFixed(1)} s (start-up, reading, fingerprints, writing); ` +
        `${((1000 * run.wallSeconds) / n).toFixed(2)} ms/item wall, ${s.msPerItem.toFixed(1)} ms/item inside a worker, ` +
        `${((1000 * run.cpuSeconds) / n).toFixed(1)} ms CPU/item\n`,
    );
    const again = timed(['run', '--store', db]);
    const sa = lastJson(again.stdout) as { reused: number; planned: number };
    process.stdout.write(
      `N=${n}: second run, inputs unchanged: ${again.wallSeconds.toFixed(1)} s wall, ${(again.maxRssKb / 1024).toFixed(0)} MB, ` +
        `${sa.reused} reused, ${sa.planned} planned${sa.planned > 0 ? ` (${codeVersionNote(db)})` : ''}\n`,
    );
    const plan = timed(['plan', '--store', db, '--out', csv]);
    if (plan.status !== 0) throw new Error(`plan failed:\n${plan.stderr.slice(-2000)}`);
    const rows = readFileSync(csv, 'utf8').trim().split('\r\n').length - 1;
    process.stdout.write(
      `N=${n}: plan ${plan.wallSeconds.toFixed(1)} s, ${(plan.maxRssKb / 1024).toFixed(0)} MB, ${rows} lines exported` +
        `${rows === n ? '' : ` (EXPECTED ${n})`}\n`,
    );
    results.push({
      n,
      wall: run.wallSeconds,
      rssMb,
      msPerItemWall: (1000 * run.wallSeconds) / n,
      msPerItemWorker: s.msPerItem,
    });
    rmSync(db, { force: true });
  }
  if (results.length >= 2) {
    const a = results[0];
    const b = results[results.length - 1];
    process.stdout.write(
      `scaling ${a.n} → ${b.n} items (×${(b.n / a.n).toFixed(0)}): wall ×${(b.wall / a.wall).toFixed(2)}, ` +
        `ms/item wall ${a.msPerItemWall.toFixed(2)} → ${b.msPerItemWall.toFixed(2)}, peak RSS ${a.rssMb.toFixed(0)} → ${b.rssMb.toFixed(0)} MB\n`,
    );
  }
  const big = results.find((r) => r.n === 10000);
  if (big) {
    process.stdout.write(
      `target 10,000 items: ${big.wall.toFixed(1)} s ≤ 60 s: ${big.wall <= 60 ? 'yes' : 'NO'}; ` +
        `${big.rssMb.toFixed(0)} MB ≤ 1024 MB: ${big.rssMb <= 1024 ? 'yes' : 'NO'}\n`,
    );
  }
  process.stdout.write(`load average ${load()} at the end (other work on the machine slows every figure)\n`);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
