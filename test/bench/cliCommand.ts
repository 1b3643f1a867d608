/**
 * The command line `npm run -s cli` runs (package.json's scripts.cli), with node as this process's
 * executable and the entry as an absolute path, so the benches time the CLI with exactly the node
 * options a planner's call gets, without npm's own start-up in every measurement.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

const root = join(import.meta.dirname, '..', '..');

export function cliCommand(): string[] {
  const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
    scripts: Record<string, string>;
  };
  const words = pkg.scripts.cli.trim().split(/\s+/);
  if (words[0] !== 'node' || !words[words.length - 1].endsWith('.ts')) {
    throw new Error(`scripts.cli is not 'node [options] ENTRY.ts': ${pkg.scripts.cli}`);
  }
  return [process.execPath, ...words.slice(1, -1), join(root, words[words.length - 1])];
}
