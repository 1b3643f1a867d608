/**
 * `npm run -s cli -- run --store DB [--items SKU,…] [--force] [--workers N]`: plan every active
 * item of a store on a worker-thread pool (see app/run/startRun). Progress goes to stderr (a bar on
 * a terminal, plain lines otherwise); the last line of stdout is a JSON summary. Ctrl-C cancels
 * cleanly: nothing of the unfinished run is written and the previous run stays the latest.
 * Exit codes: 0 complete, 1 failed, 2 bad arguments, 130 cancelled.
 */

import { progressView } from '../run/progressView';
import { startRun } from '../run/startRun';

const USAGE = 'usage: npm run -s cli -- run --store DB [--items SKU,…] [--force] [--workers N]\n';

interface RunArgs {
  store: string;
  items?: string[];
  force: boolean;
  workers?: number;
}

function parse(args: string[]): RunArgs | string {
  let store: string | undefined;
  let items: string[] | undefined;
  let force = false;
  let workers: number | undefined;
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    const value = () => {
      const v = args[++i];
      if (v === undefined || v.startsWith('--')) throw new Error(`${a} needs a value`);
      return v;
    };
    try {
      if (a === '--store') store = value();
      else if (a === '--items') {
        items = value()
          .split(',')
          .map((s) => s.trim())
          .filter((s) => s.length > 0);
        if (items.length === 0) return '--items needs at least one SKU';
      } else if (a === '--force') force = true;
      else if (a === '--workers') {
        const v = value();
        workers = Number(v);
        if (!Number.isInteger(workers) || workers < 1)
          return `--workers must be a whole number ≥ 1, got '${v}'`;
      } else if (a === '--help' || a === '-h') return '';
      else return `unknown option '${a}'`;
    } catch (err) {
      return (err as Error).message;
    }
  }
  if (!store) return '--store DB is required';
  return { store, items, force, workers };
}

export default async function run(args: string[]): Promise<number> {
  const parsed = parse(args);
  if (typeof parsed === 'string') {
    if (parsed) process.stderr.write(`run: ${parsed}\n`);
    process.stderr.write(USAGE);
    return parsed ? 2 : 0;
  }
  const view = progressView(process.stderr);
  // The handler goes in before the run starts: startRun does its reading synchronously, and a
  // Ctrl-C in that window must cancel too, not kill the process.
  let cancel: (() => void) | null = null;
  let interrupts = 0;
  const onSigint = () => {
    interrupts++;
    if (interrupts === 1) {
      process.stderr.write('\ncancelling the run (nothing of it will be written)…\n');
      cancel?.();
    } else process.exit(130);
  };
  process.on('SIGINT', onSigint);
  const handle = startRun(
    parsed.store,
    { items: parsed.items, force: parsed.force, workers: parsed.workers, actor: 'cli' },
    (p) => view.update(p),
  );
  cancel = handle.cancel;
  if (interrupts > 0) handle.cancel();
  const summary = await handle.done;
  process.off('SIGINT', onSigint);
  view.end();
  if (summary.status === 'failed') process.stderr.write(`run failed: ${summary.error}\n`);
  else if (summary.status === 'cancelled')
    process.stderr.write('run cancelled; the previous run is unchanged\n');
  else {
    process.stderr.write(
      `run ${summary.runId}: ${summary.planned} planned, ${summary.reused} reused, ${summary.failed} failed, ` +
        `${summary.flagged} flagged, ${summary.seconds.toFixed(1)} s\n`,
    );
  }
  process.stdout.write(`${JSON.stringify(summary)}\n`);
  return summary.status === 'complete' ? 0 : summary.status === 'cancelled' ? 130 : 1;
}
