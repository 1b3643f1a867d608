/**
 * `npm run bench [-- NAME …]`: runs every `test/bench/*.bench.ts` (or the named ones) one after
 * another, each in its own process so one benchmark's JIT and heap never colour another's figures.
 * Each benchmark prints its own measured figures.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';

const dir = import.meta.dirname;
const wanted = process.argv.slice(2);
const all = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .sort();
const chosen = wanted.length ? all.filter((f) => wanted.some((w) => f.startsWith(w))) : all;
if (chosen.length === 0) {
  process.stderr.write(`no benchmark matches ${wanted.join(', ')}; have: ${all.join(', ')}\n`);
  process.exit(2);
}
let failed = 0;
for (const file of chosen) {
  process.stdout.write(`\n=== ${file} ===\n`);
  const r = spawnSync(process.execPath, ['--import', 'tsx', join(dir, file)], { stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
process.exit(failed ? 1 : 0);
