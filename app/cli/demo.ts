/**
 * `npm run -s cli -- demo --store FILE [--replace] [--exports DIR]`: build the demo bakery-supply
 * store through the real import path. Prints each import's summary line and the totals (JSON last).
 */
import { existsSync } from 'node:fs';
import { buildDemoStore } from '../../demo-store/build';

export default async function demoCommand(args: string[]): Promise<number> {
  let store: string | undefined;
  let exportsDir: string | undefined;
  let replace = false;
  for (let i = 0; i < args.length; i++) {
    if (args[i] === '--store') store = args[++i];
    else if (args[i] === '--exports') exportsDir = args[++i];
    else if (args[i] === '--replace') replace = true;
    else {
      process.stderr.write(
        `unknown argument '${args[i]}'\nusage: npm run -s cli -- demo --store FILE [--replace] [--exports DIR]\n`,
      );
      return 2;
    }
  }
  if (!store) {
    process.stderr.write('usage: npm run -s cli -- demo --store FILE [--replace] [--exports DIR]\n');
    return 2;
  }
  if (!replace && existsSync(store)) {
    process.stderr.write(
      `demo: ${store} already exists; choose another file, or pass --replace to rebuild it\n`,
    );
    return 1;
  }
  try {
    const s = await buildDemoStore(store, { exportsDir, replace });
    for (const imp of s.imports) {
      process.stdout.write(
        `${imp.kind.padEnd(5)} ${imp.file}: ${imp.summary.rowsRead} rows, ${imp.summary.items} items, ${imp.summary.weeks} weeks, ${imp.summary.warnings.length} warnings\n`,
      );
      for (const w of imp.summary.warnings) process.stdout.write(`  warning: ${w}\n`);
    }
    process.stdout.write(
      `${JSON.stringify({ store: s.path, items: s.items, suppliers: s.suppliers, demandRows: s.demandRows, lastWeek: s.lastWeek })}\n`,
    );
    return 0;
  } catch (err) {
    process.stderr.write(`demo: ${err instanceof Error ? err.message : String(err)}\n`);
    return 1;
  }
}
