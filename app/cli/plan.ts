/**
 * `npm run -s cli -- plan --store DB --out FILE.csv [--supplier NAME]`: export the latest complete
 * run's order list, grouped by supplier, one line per active item (nothing to order: quantity 0);
 * a quantity the planner edited is the one exported. The file is written to a temporary name and
 * renamed, so it is either whole or absent. The last line of stdout is a JSON summary.
 */
import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { orderCsv } from '../run/orderCsv';
import { listSuppliers } from '../store/items';
import { getLatestRun, getOrderLinesBySupplier } from '../store/runs';
import { openStore } from '../store/store';

const USAGE = 'usage: npm run -s cli -- plan --store DB --out FILE.csv [--supplier NAME]\n';

function parse(args: string[]): { store: string; out: string; supplier?: string } | string {
  let store: string | undefined;
  let out: string | undefined;
  let supplier: string | undefined;
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--help' || a === '-h') return '';
    if (a !== '--store' && a !== '--out' && a !== '--supplier') return `unknown option '${a}'`;
    const v = args[++i];
    if (v === undefined || v.startsWith('--')) return `${a} needs a value`;
    if (a === '--store') store = v;
    else if (a === '--out') out = v;
    else supplier = v;
  }
  if (!store) return '--store DB is required';
  if (!out) return '--out FILE.csv is required';
  return { store, out, supplier };
}

export default async function plan(args: string[]): Promise<number> {
  const parsed = parse(args);
  if (typeof parsed === 'string') {
    if (parsed) process.stderr.write(`plan: ${parsed}\n`);
    process.stderr.write(USAGE);
    return parsed ? 2 : 0;
  }
  let store: ReturnType<typeof openStore>;
  try {
    store = openStore(parsed.store, { readonly: true });
  } catch (err) {
    process.stderr.write(`plan: ${err instanceof Error ? err.message : String(err)}\n`);
    return 1;
  }
  try {
    const run = getLatestRun(store);
    if (!run) {
      process.stderr.write(
        `plan: ${parsed.store} has no complete planning run yet; run \`npm run -s cli -- run --store ${parsed.store}\` first\n`,
      );
      return 1;
    }
    if (parsed.supplier !== undefined) {
      const names = listSuppliers(store).map((s) => s.name);
      if (!names.includes(parsed.supplier)) {
        process.stderr.write(
          `plan: --supplier '${parsed.supplier}' is not a supplier of this store; known: ${names.length ? names.join(', ') : '(none)'}\n`,
        );
        return 1;
      }
    }
    const { groups } = getOrderLinesBySupplier(store, { runId: run.id, supplier: parsed.supplier });
    const csv = orderCsv(groups);
    const tmp = `${parsed.out}.part-${process.pid}`;
    try {
      writeFileSync(tmp, csv);
      renameSync(tmp, parsed.out);
    } catch (err) {
      rmSync(tmp, { force: true });
      throw err;
    }
    const lines = groups.reduce((n, g) => n + g.lines.length, 0);
    const toOrder = groups.reduce((n, g) => n + g.lines.filter((l) => l.orderQty > 0).length, 0);
    process.stderr.write(
      `plan: run ${run.id}: ${lines} lines (${toOrder} to order) from ${groups.length} supplier group(s) → ${parsed.out}\n`,
    );
    process.stdout.write(
      `${JSON.stringify({ runId: run.id, lines, toOrder, suppliers: groups.map((g) => g.supplier), out: parsed.out })}\n`,
    );
    return 0;
  } finally {
    store.close();
  }
}
