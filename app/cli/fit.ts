/**
 * `fit FILE.csv [FILE.csv …] [--order p,d,q] [--no-mean] [--horizon H]
 *      [--date-column NAME] [--value-column NAME] [--search stepwise|grid] [--backtest]`
 * Fits an ARIMA model to each weekly series and prints one JSON object per file per line (JSON
 * Lines). Without --order the model is chosen automatically (core/select: order, differencing,
 * annual terms, sparse-demand method), with diagnostics, flags and, on request, a backtest.
 * All files are fitted in this one process, one after another (the JIT warms up once). A file
 * that cannot be read is reported on stderr with its line and field; the other files are still
 * fitted, and the exit code is 1.
 */
import { choiceRecord } from '../../core/select/choiceRecord';
import { CsvInputError, readWeeklyCsv } from './fit-csv';

export interface FitCommandOptions {
  order: { p: number; d: number; q: number } | null;
  includeMean: boolean | undefined;
  horizon: number;
  dateColumn: string;
  valueColumn: string;
  /** Automatic choice (no --order): 'stepwise' (default) or 'grid' (--search grid). */
  search: 'stepwise' | 'grid';
  /** --backtest: add a rolling-origin backtest over the last 26 weeks to each line. */
  backtest: boolean;
}

const USAGE =
  'usage: npm run -s cli -- fit FILE.csv [FILE.csv …] [--order p,d,q] [--no-mean] [--horizon H] ' +
  '[--date-column NAME] [--value-column NAME] [--search stepwise|grid] [--backtest]\n';

class UsageError extends Error {}

export function parseFitArgs(args: string[]): { files: string[]; options: FitCommandOptions } {
  const files: string[] = [];
  const options: FitCommandOptions = {
    order: null,
    includeMean: undefined,
    horizon: 12,
    dateColumn: 'week',
    valueColumn: 'qty',
    search: 'stepwise',
    backtest: false,
  };
  const value = (i: number, name: string): string => {
    const v = args[i + 1];
    if (v === undefined) throw new UsageError(`${name} needs a value`);
    return v;
  };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--order') {
      const text = value(i++, a);
      const parts = text.split(',').map((s) => Number(s.trim()));
      const ok =
        parts.length === 3 &&
        parts.every((v) => Number.isInteger(v) && v >= 0) &&
        parts[0] <= 5 &&
        parts[1] <= 2 &&
        parts[2] <= 5;
      if (!ok) throw new UsageError(`--order '${text}' must be p,d,q with p, q in 0…5 and d in 0…2`);
      options.order = { p: parts[0], d: parts[1], q: parts[2] };
    } else if (a === '--no-mean') options.includeMean = false;
    else if (a === '--horizon') {
      const text = value(i++, a);
      const h = Number(text);
      if (!Number.isInteger(h) || h < 1 || h > 520) {
        throw new UsageError(`--horizon '${text}' must be a whole number of weeks from 1 to 520`);
      }
      options.horizon = h;
    } else if (a === '--date-column') options.dateColumn = value(i++, a);
    else if (a === '--value-column') options.valueColumn = value(i++, a);
    else if (a === '--search') {
      const text = value(i++, a);
      if (text !== 'stepwise' && text !== 'grid')
        throw new UsageError(`--search '${text}' must be stepwise or grid`);
      options.search = text;
    } else if (a === '--backtest') options.backtest = true;
    else if (a.startsWith('--')) throw new UsageError(`unknown option '${a}'`);
    else files.push(a);
  }
  if (files.length === 0) throw new UsageError('no CSV file given');
  return { files, options };
}

export default async function fit(args: string[]): Promise<number> {
  let parsed: ReturnType<typeof parseFitArgs>;
  try {
    parsed = parseFitArgs(args);
  } catch (err) {
    if (err instanceof UsageError) {
      process.stderr.write(`fit: ${err.message}\n${USAGE}`);
      return 2;
    }
    throw err;
  }
  const { files, options } = parsed;
  let failed = 0;
  let out: string[] = [];
  const flush = (): void => {
    if (out.length) process.stdout.write(`${out.join('\n')}\n`);
    out = [];
  };
  for (const file of files) {
    try {
      const series = readWeeklyCsv(file, options);
      // Model choice (automatic without --order), forecast, diagnosis and flags: core/select.
      out.push(JSON.stringify(choiceRecord(file, series.values, series.firstWeek, options)));
    } catch (err) {
      if (!(err instanceof CsvInputError)) throw err;
      flush();
      process.stderr.write(`fit: ${err.message}\n`);
      failed++;
    }
    if (out.length >= 256) flush();
  }
  flush();
  return failed > 0 ? 1 : 0;
}
