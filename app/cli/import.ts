/**
 * `npm run -s cli -- import FILE --store DB --kind sales|items|stock [--map column=field …]
 *  [--date-order dmy|mdy] [--decimal dot|comma] [--force] [--actor NAME]`
 * Creates the store when it does not exist. Echoes the column mapping and every problem on the way,
 * and prints the JSON summary as the last line of stdout. Exit 0 when imported or skipped, 1 when
 * rejected (nothing written), 2 for a usage error.
 */
import { existsSync } from 'node:fs';
import { type ImportOptions, type ImportSummary, importFile, rejectedImport } from '../import/import';
import { openStore, StoreError } from '../store/store';

const USAGE =
  'usage: npm run -s cli -- import FILE --store DB --kind sales|items|stock [--map column=field …] [--date-order dmy|mdy] [--decimal dot|comma] [--force] [--actor NAME]\n';

function finish(summary: ImportSummary): number {
  for (const [column, field] of Object.entries(summary.mapping)) {
    process.stdout.write(`mapping: ${JSON.stringify(column)} → ${field ?? '(ignored)'}\n`);
  }
  for (const w of summary.warnings) process.stdout.write(`warning: ${w}\n`);
  for (const e of summary.errors) process.stderr.write(`error: ${e.message}\n`);
  if (summary.status === 'imported') {
    process.stdout.write(
      `imported ${summary.rowsRead} rows: ${summary.items} items, ${summary.weeks} weeks\n`,
    );
  } else if (summary.status === 'rejected') process.stderr.write('rejected: nothing was written\n');
  process.stdout.write(`${JSON.stringify(summary)}\n`);
  return summary.status === 'rejected' ? 1 : 0;
}

export default async function importCommand(args: string[]): Promise<number> {
  let file: string | undefined;
  let storePath: string | undefined;
  let kind: string | undefined;
  const map: Record<string, string> = {};
  const options: Partial<ImportOptions> = {};
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    const value = (): string => {
      const v = args[++i];
      if (v === undefined) throw new UsageError(`${a} needs a value`);
      return v;
    };
    try {
      if (a === '--store') storePath = value();
      else if (a === '--kind') kind = value();
      else if (a === '--map') {
        const m = value();
        const eq = m.lastIndexOf('=');
        if (eq <= 0) throw new UsageError(`--map ${m}: write it as --map column=field`);
        map[m.slice(0, eq)] = m.slice(eq + 1);
      } else if (a === '--date-order') {
        const v = value();
        if (v !== 'dmy' && v !== 'mdy') throw new UsageError(`--date-order ${v}: use dmy or mdy`);
        options.dateOrder = v;
      } else if (a === '--decimal') {
        const v = value();
        if (v !== 'dot' && v !== 'comma') throw new UsageError(`--decimal ${v}: use dot or comma`);
        options.decimal = v;
      } else if (a === '--force') options.force = true;
      else if (a === '--actor') options.actor = value();
      else if (a === '--help' || a === '-h') {
        process.stdout.write(USAGE);
        return 0;
      } else if (a.startsWith('--')) throw new UsageError(`unknown option ${a}`);
      else if (file === undefined) file = a;
      else throw new UsageError(`one file at a time (got '${file}' and '${a}')`);
    } catch (err) {
      if (err instanceof UsageError) {
        process.stderr.write(`${err.message}\n${USAGE}`);
        return 2;
      }
      throw err;
    }
  }
  if (!file || !storePath || !kind) {
    process.stderr.write(USAGE);
    return 2;
  }
  if (kind !== 'sales' && kind !== 'items' && kind !== 'stock') {
    process.stderr.write(`--kind ${kind}: use sales, items or stock\n${USAGE}`);
    return 2;
  }
  if (!existsSync(file)) return finish(rejectedImport(`${file}: no such file`));
  let store: ReturnType<typeof openStore>;
  try {
    store = openStore(storePath, { create: true });
  } catch (err) {
    if (err instanceof StoreError) return finish(rejectedImport(err.message));
    throw err;
  }
  try {
    const onWriting = (info: { rowsRead: number; items: number }) =>
      process.stderr.write(`read ${info.rowsRead} rows of ${info.items} items; writing to the store…\n`);
    try {
      return finish(await importFile(store, file, { ...options, kind, map, onWriting }));
    } catch (err) {
      // A fault of the machine or the store (disk full, store locked, file unreadable): the
      // transaction rolled back, so say so plainly instead of printing a stack trace.
      const why = err instanceof Error ? err.message : String(err);
      return finish(
        rejectedImport(`${file}: the import failed (${why}); nothing was written to ${storePath}`),
      );
    }
  } finally {
    store.close();
  }
}

class UsageError extends Error {}
