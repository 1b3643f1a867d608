/**
 * Import speed, end to end: `npm run -s cli -- import` of a file of 1,000,000 dated sales lines
 * (5,000 SKUs × 200 weeks, one line per SKU and week, ISO dates) into an existing store, run under
 * /usr/bin/time -v. Prints wall time, CPU time (user + system, steadier than wall time on a shared
 * machine) and peak resident memory of each import process.
 * Target (issue 4): ≤ 10 s wall, ≤ 300 MB peak RSS.
 */
import { spawnSync } from 'node:child_process';
import { once } from 'node:events';
import { createWriteStream, existsSync, mkdirSync, rmSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import { cliCommand } from './cliCommand';

const SKUS = Number(process.env.BENCH_SKUS ?? 5000);
const WEEKS = Number(process.env.BENCH_WEEKS ?? 200);
const dir = join(import.meta.dirname, '..', '..', '.bench', 'import');
mkdirSync(dir, { recursive: true });
const file = join(dir, `sales-${SKUS}x${WEEKS}.csv`);
const store = join(dir, 'bench.sqlite');
const root = join(import.meta.dirname, '..', '..');

/** The file: one line per SKU and week, or `linesPerCell` lines (same week totals' cells, more lines). */
async function writeFile(path: string, linesPerCell = 1): Promise<void> {
  const out = createWriteStream(path);
  out.write('date,sku,qty,order\n');
  // Deterministic quantities (a small LCG, Numerical Recipes constants) so every run reads the same file.
  let x = 12345;
  const start = Date.UTC(2022, 0, 3) / 86400000; // a Monday
  let buf = '';
  let order = 1;
  for (let w = 0; w < WEEKS; w++) {
    const day = new Date((start + 7 * w + (w % 6)) * 86400000).toISOString().slice(0, 10);
    for (let s = 0; s < SKUS; s++) {
      x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
      for (let c = 0; c < linesPerCell; c++)
        buf += `${day},SKU-${String(s).padStart(5, '0')},${x % 97},SO-${order++}\n`;
      if (buf.length > 1 << 16) {
        if (!out.write(buf)) await once(out, 'drain');
        buf = '';
      }
    }
  }
  out.write(buf);
  out.end();
  await once(out, 'finish');
}

function run(args: string[]): {
  wall: number;
  cpu: number;
  rssMb: number;
  status: number | null;
  last: string;
} {
  const r = spawnSync('/usr/bin/time', ['-v', ...cliCommand(), ...args], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 1 << 26,
  });
  const wallText = /Elapsed \(wall clock\) time.*: (.*)/.exec(r.stderr)?.[1] ?? '0:0';
  const parts = wallText.split(':').map(Number);
  const wall = parts.reduce((a, b) => a * 60 + b, 0);
  const cpu =
    Number(/User time \(seconds\): ([\d.]+)/.exec(r.stderr)?.[1] ?? 0) +
    Number(/System time \(seconds\): ([\d.]+)/.exec(r.stderr)?.[1] ?? 0);
  const rss = Number(/Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr)?.[1] ?? 0) / 1024;
  const lines = r.stdout.trim().split('\n');
  return { wall, cpu, rssMb: rss, status: r.status, last: lines[lines.length - 1] ?? '' };
}

if (!existsSync('/usr/bin/time')) {
  process.stdout.write('import bench: /usr/bin/time is not installed; skipped\n');
  process.exit(0);
}
if (!existsSync(file)) await writeFile(file);
for (const f of [store, `${store}-wal`, `${store}-shm`]) rmSync(f, { force: true });
// The "existing store": the demo templates' item master, so the store exists and holds items.
const prep = run([
  'import',
  join(root, 'demo-store/templates/items.csv'),
  '--store',
  store,
  '--kind',
  'items',
]);
if (prep.status !== 0) throw new Error(`bench: preparing the store failed: ${prep.last}`);
const r = run(['import', file, '--store', store, '--kind', 'sales']);
const summary = JSON.parse(r.last) as { status: string; rowsRead: number; items: number; weeks: number };
process.stdout.write(
  `import ${summary.rowsRead} dated lines (${SKUS} SKUs × ${WEEKS} weeks) → ${summary.status}, ${summary.items} items, ${summary.weeks} weeks\n` +
    `  wall ${r.wall.toFixed(2)} s (target ≤ 10 s), CPU user+sys ${r.cpu.toFixed(2)} s, peak RSS ${r.rssMb.toFixed(0)} MB (target ≤ 300 MB), per /usr/bin/time -v\n` +
    `  (machine load average at the end: ${loadavg()[0].toFixed(1)} on ${availableParallelism()} cores; wall time grows with the load)\n`,
);
const again = run(['import', file, '--store', store, '--kind', 'sales']);
process.stdout.write(
  `  same file again → ${JSON.parse(again.last).status} in ${again.wall.toFixed(2)} s, CPU ${again.cpu.toFixed(2)} s (SHA-256 check)\n`,
);
const forced = run(['import', file, '--store', store, '--kind', 'sales', '--force']);
process.stdout.write(
  `  forced re-import (every week replaced) → ${JSON.parse(forced.last).status} in ${forced.wall.toFixed(2)} s, CPU ${forced.cpu.toFixed(2)} s, peak RSS ${forced.rssMb.toFixed(0)} MB\n`,
);

// Memory must not grow with file size: the same item-weeks written as three lines each (3 M lines).
const triple = join(dir, `sales-${SKUS}x${WEEKS}-x3.csv`);
if (!existsSync(triple)) await writeFile(triple, 3);
for (const f of [store, `${store}-wal`, `${store}-shm`]) rmSync(f, { force: true });
const big = run(['import', triple, '--store', store, '--kind', 'sales']);
process.stdout.write(
  `  ${JSON.parse(big.last).rowsRead} lines over the same item-weeks → wall ${big.wall.toFixed(2)} s, CPU ${big.cpu.toFixed(2)} s, peak RSS ${big.rssMb.toFixed(0)} MB (vs ${r.rssMb.toFixed(0)} MB for 1 M lines)\n`,
);
